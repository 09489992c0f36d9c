// Every example in README.md and docs/*.md runs as written from the repository root and writes only under out/.
// An example is a line of a ```sh block that starts with `npx reflap`, `reflap` or `npm run demo`; a synopsis with
// placeholders belongs in a ```text block. The examples run in order in a copy of the root, through the built CLI
// kept in a worker thread (test/helpers/cli.ts) with the copy as the working folder: the same `main`, arguments,
// output and exit code as a shell's run, without loading the CLI a second time; test/cli/process.test.ts runs every
// command once as a process of its own.

import { describe, expect, it } from 'vitest';
import { cpSync, mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { projectRoot, runCli } from '../helpers/cli.js';

interface Example {
  file: string;
  line: number;
  args: string[];
}

const documents = ['README.md', ...readdirSync(join(projectRoot, 'docs')).map((name) => `docs/${name}`)].filter(
  (name) => name.endsWith('.md'),
);

/** Splits a command line into words the way a POSIX shell does for these examples (no quoting, comments dropped). */
function words(command: string): string[] {
  return command
    .replace(/\s#.*$/, '')
    .trim()
    .split(/\s+/)
    .filter(Boolean);
}

function examplesOf(file: string): { examples: Example[]; unlabelled: number[] } {
  const lines = readFileSync(join(projectRoot, file), 'utf8').split('\n');
  const examples: Example[] = [];
  const unlabelled: number[] = [];
  let fence: string | null = null;
  lines.forEach((text, index) => {
    const opening = /^```(\S*)/.exec(text);
    if (opening) {
      fence = fence === null ? opening[1]! : null;
      return;
    }
    if (fence === null) return;
    const command = text.replace(/^\$\s+/, '');
    if (!/^(npx reflap|reflap)\b/.test(command) && !command.includes('npm run demo')) return;
    if (fence === '') unlabelled.push(index + 1);
    if (fence !== 'sh') return;
    const parts = words(command);
    // `npm run demo` is the demo command once built; `npm install && npm run demo` installs first.
    if (command.includes('npm run demo')) examples.push({ file, line: index + 1, args: ['demo'] });
    else examples.push({ file, line: index + 1, args: parts[0] === 'npx' ? parts.slice(2) : parts.slice(1) });
  });
  return { examples, unlabelled };
}

const found = documents.map(examplesOf);
const examples = found.flatMap((f) => f.examples);

describe('README and docs examples', () => {
  it('labels every block of reflap commands: sh for an example, text for a synopsis', () => {
    const unlabelled = found.flatMap((f, k) => f.unlabelled.map((line) => `${documents[k]}:${line}`));
    expect(unlabelled).toEqual([]);
  });

  it('runs every example as written, in order, leaving files only under out/', { timeout: 300_000 }, () => {
    expect(examples.length).toBeGreaterThan(20);
    const root = mkdtempSync(join(tmpdir(), 'reflap-examples-'));
    for (const folder of ['cars', 'tracks']) cpSync(join(projectRoot, folder), join(root, folder), { recursive: true });
    const before = readdirSync(root).sort();
    const failures = examples
      .map((example) => ({ example, run: runCli(example.args, { cwd: root, env: { CI: '1' } }) }))
      .filter(({ run }) => run.code !== 0)
      .map(({ example, run }) => `${example.file}:${example.line} exit ${run.code}: ${run.stderr.trim()}`);
    expect(failures).toEqual([]);
    const after = readdirSync(root).sort();
    expect(after.filter((name) => !before.includes(name))).toEqual(['out']);
  });
});
