// Output sets are all-or-nothing: a rename that fails in the middle of a batch puts back what was replaced,
// an interrupt leaves no temporary file, a stale temporary file of a killed run is cleaned, and the
// environment's refusals to write are one line (exit 2) naming the path.

import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import * as fs from 'node:fs';
import { outputBatch, writeFileAtomic, type OutputFileSystem } from '../../src/cli/output.js';
import { InputError } from '../../src/errors.js';
import { projectRoot, runCli } from '../helpers/cli.js';
import { writeTestOval } from '../helpers/tracks.js';

let folder: string;
let count = 0;
const freshFolder = () => {
  const made = join(folder, `case-${++count}`);
  mkdirSync(made);
  return made;
};

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-output-set-'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

function errnoError(code: string): NodeJS.ErrnoException {
  return Object.assign(new Error(`${code}: injected`), { code });
}

/** Node's own calls, with the `failOn`-th call of `which` throwing `code` instead. */
function failingFileSystem(which: keyof OutputFileSystem, failOn: number, code: string): OutputFileSystem {
  let calls = 0;
  const real: OutputFileSystem = {
    writeFileSync: (file, content, options) => fs.writeFileSync(file, content, options),
    renameSync: (from, to) => fs.renameSync(from, to),
    linkSync: (existing, link) => fs.linkSync(existing, link),
  };
  return {
    ...real,
    [which]: (...args: [string, never, never]) => {
      if (++calls === failOn) throw errnoError(code);
      return (real[which] as (...a: unknown[]) => void)(...args);
    },
  };
}

describe('a failed rename in the middle of a batch', () => {
  it('puts back every file the batch had already replaced and leaves no temporary or backup file', () => {
    const out = freshFolder();
    const names = ['trace.csv', 'report.html', 'summary.json'];
    for (const name of names) writeFileSync(join(out, name), `old ${name}\n`);
    const batch = outputBatch([], failingFileSystem('renameSync', 2, 'EIO'));
    for (const name of names) batch.add(join(out, name), `new ${name}\n`);
    expect(() => batch.commit()).toThrow(InputError);
    for (const name of names) expect(readFileSync(join(out, name), 'utf8')).toBe(`old ${name}\n`);
    expect(readdirSync(out).sort()).toEqual([...names].sort());
  });

  it('removes the new files it had placed where there was none before', () => {
    const out = freshFolder();
    writeFileSync(join(out, 'b.csv'), 'old b\n');
    const batch = outputBatch([], failingFileSystem('renameSync', 3, 'EXDEV'));
    for (const name of ['a.csv', 'b.csv', 'c.csv']) batch.add(join(out, name), `new ${name}\n`);
    let message = '';
    try {
      batch.commit();
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toBe(`${join(out, 'c.csv')}: cannot write the output (crosses file systems)`);
    expect(readdirSync(out)).toEqual(['b.csv']);
    expect(readFileSync(join(out, 'b.csv'), 'utf8')).toBe('old b\n');
  });

  it('a full disk while writing the temporary files: one line naming the file, nothing left', () => {
    const out = freshFolder();
    const batch = outputBatch([], failingFileSystem('writeFileSync', 2, 'ENOSPC'));
    batch.add(join(out, 'a.csv'), 'a');
    batch.add(join(out, 'b.csv'), 'b');
    expect(() => batch.commit()).toThrow(
      `${join(out, 'b.csv')}: cannot write the output (no space left on the device)`,
    );
    expect(readdirSync(out)).toEqual([]);
  });

  it('a read-only file system and a permission refusal are input errors naming the path', () => {
    for (const [code, reason] of [
      ['EROFS', 'read-only file system'],
      ['EACCES', 'permission denied'],
    ]) {
      const out = freshFolder();
      const batch = outputBatch([], failingFileSystem('writeFileSync', 1, code!));
      batch.add(join(out, 'a.csv'), 'a');
      expect(() => batch.commit()).toThrow(`${join(out, 'a.csv')}: cannot write the output (${reason})`);
      expect(readdirSync(out)).toEqual([]);
    }
  });
});

describe('targets that cannot be an output file are refused before anything is written', () => {
  it('a folder, a path through a file, and paths under /proc, /sys and /dev', () => {
    const out = freshFolder();
    const aFile = join(out, 'plain.txt');
    writeFileSync(aFile, 'x');
    expect(() => writeFileAtomic(out, 'x')).toThrow(`${out}: cannot write the output (is a folder)`);
    expect(() => writeFileAtomic(join(aFile, 'trace.csv'), 'x')).toThrow(
      `${join(aFile, 'trace.csv')}: cannot write the output (a part of the path is not a folder)`,
    );
    expect(() => writeFileAtomic('/proc/reflap-trace.csv', 'x')).toThrow('proc is a system folder');
    expect(() => writeFileAtomic('/sys/kernel/reflap.csv', 'x')).toThrow('sys is a system folder');
    expect(() => writeFileAtomic('/dev/null', 'x')).toThrow('dev is a system folder');
    expect(readdirSync(out)).toEqual(['plain.txt']);
  });
});

describe('stale temporary files of a killed run', () => {
  it('are removed when their process is gone, and kept while it runs', () => {
    const out = freshFolder();
    const finished = spawnSync(process.execPath, ['-e', '0']);
    const deadPid = finished.pid!;
    const stale = `.trace.csv.tmp-${deadPid}-1`;
    const staleBackup = `.trace.csv.bak-${deadPid}-4`;
    // The parent of this test process is alive: its temporary file belongs to a run still in progress.
    const live = `.trace.csv.tmp-${process.ppid}-1`;
    const otherTarget = `.other.csv.tmp-${deadPid}-1`;
    for (const name of [stale, staleBackup, live, otherTarget]) writeFileSync(join(out, name), 'partial');
    writeFileAtomic(join(out, 'trace.csv'), 'whole\n');
    expect(readdirSync(out).sort()).toEqual([live, otherTarget, 'trace.csv'].sort());
  });
});

describe('SIGINT while an output set is being written', () => {
  it('ends by the signal with no temporary file, every target old or whole', () => {
    const out = freshFolder();
    writeFileSync(join(out, 'first.csv'), 'old first\n');
    const moduleUrl = new URL('dist/src/cli/output.js', `file://${projectRoot}`).href;
    // A 40 MB set; the signal is raised from inside the write of the first file, so it lands mid-commit.
    const script = `
      import * as fs from 'node:fs';
      import { outputBatch } from ${JSON.stringify(moduleUrl)};
      let signalled = false;
      const batch = outputBatch([], {
        writeFileSync(file, content, options) {
          fs.writeFileSync(file, content, options);
          if (!signalled) { signalled = true; process.kill(process.pid, 'SIGINT'); }
        },
        renameSync: fs.renameSync,
        linkSync: fs.linkSync,
      });
      batch.add(${JSON.stringify(join(out, 'first.csv'))}, 'a'.repeat(20e6) + '\\n');
      batch.add(${JSON.stringify(join(out, 'second.csv'))}, 'b'.repeat(20e6) + '\\n');
      batch.commit();
      setTimeout(() => process.stdout.write('still running'), 2000);
    `;
    const run = spawnSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8' });
    expect(run.signal).toBe('SIGINT');
    expect(run.stdout).toBe('');
    const names = readdirSync(out).sort();
    expect(names.filter((name) => name.startsWith('.'))).toEqual([]);
    const first = readFileSync(join(out, 'first.csv'), 'utf8');
    expect(first === 'old first\n' || first === 'a'.repeat(20e6) + '\n').toBe(true);
  });
});

describe('through the CLI', () => {
  it('simulate --out FILE --html FOLDER: exit 2, one line naming the folder, no trace file and no temporary file', () => {
    const out = freshFolder();
    const track = writeTestOval(out);
    const htmlFolder = join(out, 'pages');
    mkdirSync(htmlFolder);
    const car = join(projectRoot, 'cars', 'brackle-club.json');
    const run = runCli([
      'simulate',
      '--track',
      track,
      '--car',
      car,
      '--out',
      join(out, 'ok.csv'),
      '--html',
      htmlFolder,
    ]);
    expect(run.code).toBe(2);
    expect(run.stderr).toBe(`reflap: ${htmlFolder}: cannot write the output (is a folder)\n`);
    expect(readdirSync(out).sort()).toEqual(['oval.json', 'pages']);
    expect(readdirSync(htmlFolder)).toEqual([]);
  });
});
