// Every ```ts block of README.md and docs/*.md is one of the scripts in docs/examples/, to the character, and every
// script there is shown in a doc: `npm test`'s `tsc -p test/tsconfig.json` type-checks those scripts against the
// library's source ('reflap' mapped to src/index.ts), so a doc that calls the library wrongly fails the build.
// Every ```ts example of docs/library.md also runs as written against the build (dist/, made before vitest runs): each is
// transpiled by the TypeScript compiler (ts.transpileModule), its `from 'reflap'` pointed at dist/src/index.js, and
// run by node from a copy of the package's cars/ and tracks/. An example checks its own result and throws when it
// is wrong, so a run that ends without an error is one whose checks held. The examples run one after another in one
// node process (RUNNER), which keeps what each writes and whether it threw: the build loads once, not once per
// example (about 0.4 s of CPU each).

import { afterAll, describe, expect, it } from 'vitest';
import ts from 'typescript';
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { projectRoot } from '../helpers/cli.js';
import { once } from '../helpers/once.js';

interface ScriptExample {
  line: number;
  code: string;
}

const LIBRARY_DOC = 'docs/library.md';

/** The ```ts and ```js blocks of a Markdown text, with the line each starts on. */
function scriptExamples(text: string, languages: readonly string[] = ['ts', 'js']): ScriptExample[] {
  const examples: ScriptExample[] = [];
  const lines = text.split('\n');
  let current: ScriptExample | null = null;
  lines.forEach((line, index) => {
    const fence = /^```(\S*)/.exec(line);
    if (fence && current === null && languages.includes(fence[1]!)) current = { line: index + 1, code: '' };
    else if (fence && current !== null) {
      examples.push(current);
      current = null;
    } else if (current !== null) current.code += `${line}\n`;
  });
  return examples;
}

/** The ```ts blocks of the README and of every doc, with where each was found. */
function documentedScripts(): { where: string; code: string }[] {
  const documents = ['README.md', ...readdirSync(join(projectRoot, 'docs')).map((name) => `docs/${name}`)];
  return documents
    .filter((document) => document.endsWith('.md'))
    .flatMap((document) =>
      scriptExamples(readFileSync(join(projectRoot, document), 'utf8'), ['ts']).map((example) => ({
        where: `${document}:${example.line}`,
        code: example.code,
      })),
    );
}

const indexUrl = pathToFileURL(join(projectRoot, 'dist/src/index.js')).href;

interface ExampleRun {
  stdout: string;
  stderr: string;
  error: string | null;
}

/** Imports each file of argv[2] (a JSON list) in turn, each to its end (top-level await included), and prints one JSON
 * list of what each wrote to stdout and stderr and the error it threw, if any. */
const RUNNER = `
import { pathToFileURL } from 'node:url';
const files = JSON.parse(process.argv[2]);
const runs = [];
const streams = { stdout: process.stdout, stderr: process.stderr };
const writes = { stdout: process.stdout.write, stderr: process.stderr.write };
for (const file of files) {
  const run = { stdout: '', stderr: '', error: null };
  for (const name of ['stdout', 'stderr'])
    streams[name].write = (chunk, encoding, callback) => {
      run[name] += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8');
      const done = typeof encoding === 'function' ? encoding : callback;
      if (typeof done === 'function') queueMicrotask(done);
      return true;
    };
  try {
    await import(pathToFileURL(file).href);
  } catch (error) {
    run.error = String(error?.stack ?? error);
  }
  runs.push(run);
}
for (const name of ['stdout', 'stderr']) streams[name].write = writes[name];
process.stdout.write(JSON.stringify(runs));
`;
const examples = scriptExamples(readFileSync(join(projectRoot, LIBRARY_DOC), 'utf8'));

describe('library examples', () => {
  it('finds the examples of docs/library.md, one per family', () => {
    expect(examples.length).toBeGreaterThanOrEqual(4);
    for (const name of ['simulate(', 'racingLine(', 'compareSession(', 'runSweep(']) {
      expect(examples.some((example) => example.code.includes(name))).toBe(true);
    }
  });

  it('reads the blocks of a Markdown text, ts and js only', () => {
    const text = 'intro\n```ts\nconst a = 1;\n```\n```sh\nreflap demo\n```\n```js\nconsole.log(2);\n```\n';
    expect(scriptExamples(text)).toEqual([
      { line: 2, code: 'const a = 1;\n' },
      { line: 8, code: 'console.log(2);\n' },
    ]);
  });

  it('shows in the docs exactly the scripts that tsc type-checks in docs/examples/, each once', () => {
    const folder = join(projectRoot, 'docs/examples');
    const scripts = new Map(
      readdirSync(folder)
        .filter((name) => name.endsWith('.ts'))
        .map((name) => [readFileSync(join(folder, name), 'utf8'), name] as const),
    );
    const shown = documentedScripts();
    expect(shown.length).toBeGreaterThanOrEqual(scripts.size);
    for (const { where, code } of shown)
      expect(scripts.has(code), `${where} is not a file of docs/examples/`).toBe(true);
    const unshown = [...scripts.values()].filter((name) => !shown.some(({ code }) => scripts.get(code) === name));
    expect(unshown).toEqual([]);
  });

  it('includes docs/examples/ in the type-checked test project', () => {
    const config = ts.readConfigFile(join(projectRoot, 'test/tsconfig.json'), (path) => ts.sys.readFile(path));
    expect(config.config.include).toContain('../docs/examples');
    expect(config.config.compilerOptions.paths.reflap).toEqual(['../src/index.ts']);
  });

  const root = mkdtempSync(join(tmpdir(), 'reflap-library-'));
  for (const folder of ['cars', 'tracks']) cpSync(join(projectRoot, folder), join(root, folder), { recursive: true });
  afterAll(() => rmSync(root, { recursive: true, force: true }));

  /** Every example run once, at the first test that asks; the runner itself must end cleanly. */
  const runs = once((): ExampleRun[] => {
    const files = examples.map((example) => {
      const js = ts.transpileModule(example.code, {
        compilerOptions: { module: ts.ModuleKind.ESNext, target: ts.ScriptTarget.ES2022 },
      }).outputText;
      const file = join(root, `example-${example.line}.mjs`);
      writeFileSync(file, js.replace(/from 'reflap'/g, `from '${indexUrl}'`));
      return file;
    });
    const runner = join(root, 'run-examples.mjs');
    writeFileSync(runner, RUNNER);
    const run = spawnSync(process.execPath, [runner, JSON.stringify(files)], { cwd: root, encoding: 'utf8' });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    return JSON.parse(run.stdout) as ExampleRun[];
  });

  examples.forEach((example, k) => {
    it(`runs ${LIBRARY_DOC}:${example.line} against the build`, { timeout: 120_000 }, () => {
      const run = runs()[k]!;
      expect(run.error).toBeNull();
      expect(run.stderr).toBe('');
      expect(run.stdout.trim().length).toBeGreaterThan(0);
    });
  });
});
