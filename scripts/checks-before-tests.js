// The steps `npm test` runs before vitest: the build, the tests' type-check, the layout check and the lint, each a
// single-threaded Node program. They run in two lanes side by side, one per core, each lane taking the next step
// that can start: on two cores about half the wall time of one after another. A step's output is held until it ends
// and then printed whole, so two steps never interleave their lines; the first failing step's exit code is the
// script's. The layout check and the lint are
// skipped where no file of the project has changed since each last passed (a fingerprint of paths, sizes and times,
// as the build and the tests' type-check keep theirs): with their own caches they still cost about 3 s of CPU, most
// of it loading Prettier, ESLint and their TypeScript parsers. The records live under node_modules/.cache, so a
// clean install runs both on every file.

import { spawn } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { recordedFingerprintIs, recordFingerprint, root, sourceFingerprint } from './source-fingerprint.js';

/** The file of an installed package's command (its package.json "bin"), run with this Node. */
function binOf(name) {
  const folder = path.join(root, 'node_modules', name);
  const { bin } = JSON.parse(readFileSync(path.join(folder, 'package.json'), 'utf8'));
  return path.join(folder, typeof bin === 'string' ? bin : bin[name]);
}

/** Every file Prettier or ESLint could read: the whole project but git's files, the installed packages and the
 * outputs .gitignore names. Taken before any step runs, so a file edited during the checks is checked next time. */
const notChecked = new Set(['.git', 'node_modules', 'dist', 'out', 'test-output']);
const entries = readdirSync(root, { withFileTypes: true }).filter((entry) => !notChecked.has(entry.name));
const projectFiles = sourceFingerprint(
  entries.filter((entry) => entry.isDirectory()).map((entry) => entry.name),
  entries.filter((entry) => !entry.isDirectory()).map((entry) => entry.name),
);
const recordOf = (name) => path.join(root, 'node_modules', '.cache', 'reflap', `${name}.fingerprint`);

// The steps in the order the lanes take them, a step only once the one it needs has passed: the tests' type-check
// reads dist/ (src through the build's declarations, and a test imports the build), so it waits for the build; the
// layout check and the lint need nothing built. In a clean clone, where `npm ci` has built dist/ already, one lane
// runs the type-check and then the lint (about 10 + 11 s of CPU) while the other runs the layout check (about 15 s);
// fixed chains of build and type-check beside layout and lint left the lint waiting behind the layout (26 s).
const steps = [
  { name: 'build', args: ['scripts/build.js', '--if-stale'] },
  {
    name: 'layout (Prettier)',
    args: [binOf('prettier'), '--check', '--cache', '--log-level', 'warn', '.'],
    record: recordOf('layout'),
  },
  { name: 'type-check of the tests', args: ['scripts/typecheck-tests.js'], after: 'build' },
  {
    name: 'lint (ESLint)',
    args: [binOf('eslint'), '--cache', '--cache-location', 'node_modules/.cache/eslint/', '.'],
    record: recordOf('lint'),
  },
];

function run(step) {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, step.args, { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    const output = [];
    child.stdout.on('data', (chunk) => output.push(chunk));
    child.stderr.on('data', (chunk) => output.push(chunk));
    child.on('error', (error) => resolve({ step, code: 1, output: String(error) }));
    child.on('close', (code, signal) =>
      resolve({ step, code: code ?? (signal ? 1 : 0), output: Buffer.concat(output).toString('utf8') }),
    );
  });
}

/** Each step's state by name: running, passed or failed. */
const states = new Map();
let failed = 0;
async function lane() {
  for (;;) {
    const step = steps.find(
      (candidate) =>
        !states.has(candidate.name) && (candidate.after === undefined || states.get(candidate.after) === 'passed'),
    );
    // What is left waits for a step another lane is running (that lane takes it on next) or for one that failed.
    if (step === undefined) return;
    states.set(step.name, 'running');
    if (step.record && recordedFingerprintIs(step.record, projectFiles)) {
      states.set(step.name, 'passed');
      continue;
    }
    const result = await run(step);
    if (result.output !== '') process.stdout.write(result.output.endsWith('\n') ? result.output : result.output + '\n');
    if (result.code === 0) {
      if (step.record) recordFingerprint(step.record, projectFiles);
      states.set(step.name, 'passed');
      continue;
    }
    states.set(step.name, 'failed');
    process.stderr.write(`${step.name} failed (exit ${result.code})\n`);
    if (failed === 0) failed = result.code;
  }
}

await Promise.all(Array.from({ length: Math.max(1, Math.min(availableParallelism(), 2)) }, lane));
process.exit(failed);
