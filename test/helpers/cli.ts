// Runs the built command-line tool (dist/, built by `npm test` before vitest) as a user would.

import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export function runCli(
  args: string[],
  options: { cwd?: string; input?: string; env?: Record<string, string> } = {},
): CliRun {
  const result = spawnSync(process.execPath, [`${projectRoot}bin/reflap.js`, ...args], {
    cwd: options.cwd ?? projectRoot,
    input: options.input,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', ...options.env },
    maxBuffer: 64 * 1024 * 1024,
  });
  return { code: result.status ?? -1, stdout: result.stdout, stderr: result.stderr };
}
