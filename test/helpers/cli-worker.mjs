// The built CLI held in one worker thread for a vitest worker (every test file it runs): each request runs `main`
// with its arguments and environment, captures what the command writes to stdout and stderr, and answers on the
// request's port. The test thread waits for the answer synchronously (test/helpers/cli.ts), so runCli stays a plain
// call while the modules are loaded once per vitest worker instead of once per run.

import { parentPort, workerData } from 'node:worker_threads';
import { pathToFileURL } from 'node:url';

let sink = null;
for (const [stream, key] of [
  [process.stdout, 'stdout'],
  [process.stderr, 'stderr'],
]) {
  const realWrite = stream.write.bind(stream);
  // Installed before the CLI's own wrapper (src/cli/terminal.ts), which then wraps this one, as it wraps the real
  // stream in a process of its own.
  stream.write = (chunk, encoding, callback) => {
    if (sink === null) return realWrite(chunk, encoding, callback);
    sink[key] += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8');
    const done = typeof encoding === 'function' ? encoding : callback;
    if (typeof done === 'function') queueMicrotask(done);
    return true;
  };
}

const { main } = await import(pathToFileURL(workerData.mainFile).href);

function answer(port, flag, reply) {
  port.postMessage(reply);
  port.close();
  Atomics.store(flag, 0, 1);
  Atomics.notify(flag, 0);
}

let current = null;
function failCurrent(error) {
  if (current === null) return;
  const { port, flag, captured } = current;
  current = null;
  sink = null;
  answer(port, flag, {
    code: -1,
    stdout: captured.stdout,
    stderr: captured.stderr + `uncaught in the CLI: ${error?.stack ?? error}\n`,
  });
}
process.on('uncaughtException', failCurrent);
process.on('unhandledRejection', failCurrent);

parentPort.on('message', async ({ args, env, port, flag }) => {
  const saved = {};
  for (const [name, value] of Object.entries(env)) {
    saved[name] = process.env[name];
    process.env[name] = value;
  }
  const captured = { stdout: '', stderr: '' };
  current = { port, flag, captured };
  sink = captured;
  let code;
  try {
    code = await main(['node', 'reflap', ...args]);
  } catch (error) {
    code = -1;
    captured.stderr += `main threw: ${error?.stack ?? error}\n`;
  }
  for (const [name, value] of Object.entries(saved)) {
    if (value === undefined) delete process.env[name];
    else process.env[name] = value;
  }
  if (current === null) return;
  current = null;
  sink = null;
  answer(port, flag, { code, ...captured });
});
