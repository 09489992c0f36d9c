// Outputs are written whole or not at all and never over an input, across the commands that write files;
// `reflap check` exit codes and its list of every problem; a CLI-level property over garbage inputs.

import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import fc from 'fast-check';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli, projectRoot } from '../helpers/cli.js';
import { writeTestOval } from '../helpers/tracks.js';
import { writeFileAtomic, outputBatch } from '../../src/cli/output.js';
import { InputError } from '../../src/errors.js';

let folder: string;
let track: string;
let car: string;
const brokenFile = (name: string) => join(projectRoot, 'test', 'fixtures', 'broken', name);

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-robust-'));
  track = writeTestOval(folder);
  car = join(folder, 'car.json');
  writeFileSync(car, readFileSync(join(projectRoot, 'cars', 'brackle-club.json')));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** Exit 2 with exactly one line on stderr. */
function expectBadInput(run: { code: number; stderr: string }): void {
  expect(run.code).toBe(2);
  expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
}

describe('--out naming an input is refused and the input is left as it was', () => {
  const commands: [string, string[]][] = [
    ['simulate', []],
    ['line', []],
    ['stint', ['--laps', '2']],
    ['sweep', ['--vary', 'massKg=600:620:10']],
  ];
  for (const [command, extra] of commands) {
    it(`${command} --out <the car file>`, () => {
      const before = readFileSync(car, 'utf8');
      const run = runCli([command, '--track', track, '--car', car, ...extra, '--out', car]);
      expectBadInput(run);
      expect(run.stderr).toContain('refusing to write the output over an input file');
      expect(readFileSync(car, 'utf8')).toBe(before);
    });
  }

  it('simulate --out <the track file, by another path>', () => {
    const before = readFileSync(track, 'utf8');
    const run = runCli(['simulate', '--track', track, '--car', car, '--out', join(folder, '.', 'oval.json')]);
    expectBadInput(run);
    expect(run.stderr).toContain('refusing to write the output over an input file');
    expect(readFileSync(track, 'utf8')).toBe(before);
  });
});

describe('a failing command leaves no file behind', () => {
  it('simulate with a broken car: no trace file and no temporary file', () => {
    const outFolder = join(folder, 'fail-out');
    mkdirSync(outFolder);
    const run = runCli([
      'simulate',
      '--track',
      track,
      '--car',
      brokenFile('car-three-problems.json'),
      '--out',
      join(outFolder, 'trace.csv'),
    ]);
    expectBadInput(run);
    expect(readdirSync(outFolder)).toEqual([]);
  });

  it('writeFileAtomic: a write that fails keeps the old file whole and leaves no temporary file', () => {
    const outFolder = join(folder, 'atomic');
    mkdirSync(outFolder);
    const target = join(outFolder, 'result.csv');
    writeFileSync(target, 'old,content\n');
    // Renaming a file onto a non-empty folder fails after the temporary file was written.
    const blocked = join(outFolder, 'blocked');
    mkdirSync(join(blocked, 'inside'), { recursive: true });
    expect(() => writeFileAtomic(blocked, 'new')).toThrow();
    expect(readdirSync(outFolder).sort()).toEqual(['blocked', 'result.csv']);
    writeFileAtomic(target, 'new,content\n');
    expect(readFileSync(target, 'utf8')).toBe('new,content\n');
    expect(readdirSync(outFolder).sort()).toEqual(['blocked', 'result.csv']);
  });

  it('outputBatch: nothing is written until commit, and an output naming an input is refused at once', () => {
    const outFolder = join(folder, 'batch');
    mkdirSync(outFolder);
    const batch = outputBatch([car]);
    batch.add(join(outFolder, 'a.csv'), 'a');
    expect(() => batch.add(car, 'b')).toThrow(InputError);
    expect(readdirSync(outFolder)).toEqual([]);
    batch.commit();
    expect(readdirSync(outFolder)).toEqual(['a.csv']);
  });
});

describe('reflap check', () => {
  it('exit 0 and one ok line per good file', () => {
    const run = runCli(['check', car, track, brokenFile('bom.csv')]);
    expect(run.code).toBe(0);
    expect(run.stdout).toContain(`${car}: ok (car JSON)`);
    expect(run.stdout).toMatch(
      new RegExp(`oval\\.json: ok \\(segment track JSON: closed track, ${Math.round(600 + 2 * Math.PI * 50)} m\\)`),
    );
    expect(run.stdout).toContain('bom.csv: ok (telemetry CSV: 4 samples over 0.3 s)');
  });

  it('exit 2, every problem listed: three for the car, two rows for the track', () => {
    const run = runCli(['check', brokenFile('car-three-problems.json'), brokenFile('track-two-bad-cells.csv'), car]);
    expectBadInput(run);
    expect(run.stderr).toBe('reflap: check: 2 of 3 files have problems\n');
    const lines = run.stdout.split('\n');
    expect(lines.filter((line) => line.startsWith(`  ${brokenFile('car-three-problems.json')}: `))).toHaveLength(3);
    expect(run.stdout).toContain(
      `  ${brokenFile('track-two-bad-cells.csv')}: row 4, column y_m: 'abc' is not a number`,
    );
    expect(run.stdout).toContain(`  ${brokenFile('track-two-bad-cells.csv')}: row 6, column x_m: the cell is empty`);
    expect(run.stdout).toContain(`${car}: ok`);
  });

  it('lists every schema problem of a segment track, not only the first', () => {
    const file = join(folder, 'track-three-problems.json');
    // An unknown key, a negative radius and a segment kind that does not exist: three problems, one line each.
    writeFileSync(
      file,
      JSON.stringify({
        name: 'x',
        closed: true,
        widthM: 10,
        sgements: [],
        segments: [
          { kind: 'arc', radiusM: -5, angleDeg: 90 },
          { kind: 'spiral', lengthM: 10 },
        ],
      }),
    );
    const run = runCli(['check', file]);
    expectBadInput(run);
    const problems = run.stdout.split('\n').filter((line) => line.startsWith(`  ${file}: `));
    expect(problems).toHaveLength(3);
    expect(run.stdout).toMatch(/unknown key 'sgements'/);
    expect(run.stdout).toMatch(/segments\[0\]\.radiusM|segments\.0\.radiusM/);
  });

  it('a file that does not exist is a problem of that file', () => {
    const run = runCli(['check', join(folder, 'missing.csv')]);
    expectBadInput(run);
    expect(run.stdout).toContain(`${join(folder, 'missing.csv')}: cannot read the file (no such file)`);
  });

  it('--json gives the same report as one object', () => {
    const run = runCli(['check', '--json', brokenFile('duplicate-timestamps.csv')]);
    expect(run.code).toBe(0);
    const report = JSON.parse(run.stdout);
    expect(report.ok).toBe(true);
    expect(report.files[0].kind).toBe('telemetry-csv');
    expect(report.files[0].notes).toContain('1 row repeats the time stamp of the row before (first at line 4)');
  });
});

describe('CLI property: garbage in any input gives exit 0 or 2, one line on stderr when 2', () => {
  it('simulate, check and compare on fuzzed files', () => {
    const garbage = fc.oneof(
      fc.string({ maxLength: 300 }),
      fc.uint8Array({ maxLength: 300 }).map((bytes) => Buffer.from(bytes).toString('latin1')),
      fc.constantFrom('{}', '{"massKg": -1}', 'x_m,y_m\n1,2\n', 'time_s\n0\n', '$GPRMC,*00'),
    );
    let index = 0;
    fc.assert(
      fc.property(
        garbage,
        fc.constantFrom('.csv', '.json', '.gpx', '.nmea', ''),
        fc.constantFrom('simulate-track', 'simulate-car', 'check', 'compare'),
        (text, extension, how) => {
          const file = join(folder, `fuzz-${index++}${extension}`);
          writeFileSync(file, text, 'latin1');
          // On the centreline: the fuzzing is of the input files, and a line search per run would only add time.
          const centreline = ['--line', 'centreline'];
          const args =
            how === 'simulate-track'
              ? ['simulate', '--track', file, '--car', car, ...centreline]
              : how === 'simulate-car'
                ? ['simulate', '--track', track, '--car', file, ...centreline]
                : how === 'check'
                  ? ['check', file]
                  : ['compare', '--track', track, '--car', car, '--telemetry', file, ...centreline];
          const run = runCli(args);
          expect([0, 2]).toContain(run.code);
          if (run.code === 2) expectBadInput(run);
        },
      ),
      { numRuns: 12, seed: 20260623 },
    );
    // Twelve spawns of the CLI: on a shared, loaded machine each can take several seconds.
  }, 240_000);
});
