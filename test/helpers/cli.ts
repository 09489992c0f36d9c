// Runs the built command-line tool (dist/, built by `npm test` before vitest) as a user would. runCli calls the
// CLI's `main` in a worker thread that lives as long as the vitest worker (test/helpers/cli-worker.mjs): the same
// arguments, environment, working folder, output and exit code as a process of its own, without paying Node's
// start and the module loading on every run. runCliProcess starts the real bin in a child process: it is kept for
// what only a process shows (the bin script, standard input, signals, the exit status) and used by
// test/cli/process.test.ts once per command.

import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { MessageChannel, receiveMessageOnPort, Worker } from 'node:worker_threads';

export const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export interface CliOptions {
  cwd?: string;
  input?: string;
  env?: Record<string, string>;
}

/** A run may take this long before the test fails instead of waiting for ever (the suite's own test timeout). */
const RUN_LIMIT_MS = 120_000;

let worker: Worker | null = null;

function cliWorker(): Worker {
  if (worker === null) {
    worker = new Worker(new URL('./cli-worker.mjs', import.meta.url), {
      workerData: { mainFile: `${projectRoot}dist/src/cli/main.js` },
      stdout: false,
      stderr: false,
    });
    // The test file ends when its tests do; the worker holds nothing that must finish.
    worker.unref();
  }
  return worker;
}

/** Runs `reflap ARGS` and returns its exit code and output; standard input goes to a process of its own. */
export function runCli(args: string[], options: CliOptions = {}): CliRun {
  if (options.input !== undefined) return runCliProcess(args, options);
  const { port1, port2 } = new MessageChannel();
  const flag = new Int32Array(new SharedArrayBuffer(4));
  const env = { NO_COLOR: '1', ...options.env };
  const previousFolder = process.cwd();
  const folder = path.resolve(options.cwd ?? projectRoot);
  // The worker sees the test thread's working folder; the thread waits below, so nothing else sees the change.
  if (folder !== previousFolder) process.chdir(folder);
  try {
    cliWorker().postMessage({ args, env, port: port2, flag }, [port2]);
    if (Atomics.wait(flag, 0, 0, RUN_LIMIT_MS) === 'timed-out') {
      // The next run starts a fresh worker rather than queueing behind the one that hangs.
      void worker?.terminate();
      worker = null;
      throw new Error(`reflap ${args.join(' ')} did not end within ${RUN_LIMIT_MS / 1000} s`);
    }
    const reply = receiveMessageOnPort(port1);
    if (reply === undefined) throw new Error(`reflap ${args.join(' ')} ended without an answer`);
    return reply.message as CliRun;
  } finally {
    port1.close();
    if (folder !== previousFolder) process.chdir(previousFolder);
  }
}

/** Runs `node bin/reflap.js ARGS` in a child process, as a user's shell would. */
export function runCliProcess(args: string[], options: CliOptions = {}): CliRun {
  const result = spawnSync(process.execPath, [`${projectRoot}bin/reflap.js`, ...args], {
    cwd: options.cwd ?? projectRoot,
    input: options.input,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', ...options.env },
    maxBuffer: 64 * 1024 * 1024,
  });
  return { code: result.status ?? -1, stdout: result.stdout, stderr: result.stderr };
}
