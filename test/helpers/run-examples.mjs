// Runs a list of reflap command lines in one Node process, in order, from the folder it is started in, and prints
// one JSON line per command (its exit code and the ends of its output); used by test/docs/examples.test.ts.
// Usage: node run-examples.mjs DIST_MAIN_JS < commands.json  (a JSON array of argument arrays)

import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

const { main } = await import(pathToFileURL(process.argv[2]).href);
const commands = JSON.parse(readFileSync(0, 'utf8'));
const realWrite = {
  out: process.stdout.write.bind(process.stdout),
  err: process.stderr.write.bind(process.stderr),
};
for (const args of commands) {
  let stdout = '';
  let stderr = '';
  process.stdout.write = (chunk) => ((stdout += String(chunk)), true);
  process.stderr.write = (chunk) => ((stderr += String(chunk)), true);
  let code;
  try {
    code = await main(['node', 'reflap', ...args]);
  } catch (error) {
    code = -1;
    stderr += String(error?.stack ?? error);
  }
  process.stdout.write = realWrite.out;
  process.stderr.write = realWrite.err;
  realWrite.out(JSON.stringify({ args, code, stdout: stdout.slice(0, 4000), stderr: stderr.slice(0, 4000) }) + '\n');
}
