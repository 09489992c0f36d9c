// The internal-error path: a fault that is not the user's input ends with exit code 1 and the hint to report
// it (src/cli/main.ts), never with exit code 2 or silence.

import { describe, expect, it, vi, afterEach } from 'vitest';
import { join } from 'node:path';
import { projectRoot } from '../helpers/cli.js';
import type * as simulateModule from '../../src/solve/simulate.js';

vi.mock('../../src/solve/simulate.js', async (original) => ({
  ...(await original<typeof simulateModule>()),
  simulate: () => {
    throw new TypeError('simulated fault inside the solver');
  },
}));

afterEach(() => vi.restoreAllMocks());

describe('internal errors', () => {
  it('exit 1 with the report hint', async () => {
    const { main } = await import('../../src/cli/main.js');
    const written: string[] = [];
    vi.spyOn(process.stderr, 'write').mockImplementation((chunk: string | Uint8Array) => {
      written.push(String(chunk));
      return true;
    });
    vi.spyOn(process.stdout, 'write').mockImplementation(() => true);
    const code = await main([
      'node',
      'reflap',
      'simulate',
      '--track',
      join(projectRoot, 'tracks', 'tarnwick-club.json'),
      '--car',
      join(projectRoot, 'cars', 'brackle-club.json'),
    ]);
    const stderr = written.join('');
    expect(code).toBe(1);
    expect(stderr).toContain('reflap: internal error: TypeError: simulated fault inside the solver');
    expect(stderr).toContain(
      'This is a fault in reflap, not in your files; please report it with the command you ran.',
    );
  });
});
