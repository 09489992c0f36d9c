// How the commands behave in a terminal pipeline: a reader that closes stdout early (`| head -1`) ends the
// command quietly with exit 0, as the POSIX tools do (common practice, no source), and `--out -` puts the trace
// on stdout alone.

import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { projectRoot, runCli } from '../helpers/cli.js';

// On the centreline: these check where the trace goes, which the racing line does not change, and the line would
// cost each of the four runs about a second of CPU.
const lap = [
  'simulate',
  '--track',
  'tracks/velmora-downs.json',
  '--car',
  'cars/tarnfell-gt.json',
  '--line',
  'centreline',
];

/** Runs the CLI, reads the first chunk of stdout, closes the pipe as `head -1` does, and waits for the exit. */
function runAndCloseEarly(args: string[]): Promise<{ code: number | null; firstChunk: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [`${projectRoot}bin/reflap.js`, ...args], { cwd: projectRoot });
    let firstChunk = '';
    let stderr = '';
    child.stdout.once('data', (chunk: Buffer) => {
      firstChunk = chunk.toString('utf8');
      child.stdout.destroy();
    });
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString('utf8')));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, firstChunk, stderr }));
  });
}

describe('a closed stdout', () => {
  it('ends `simulate --out -` quietly with exit 0 when the reader stops after the first line', async () => {
    for (let attempt = 0; attempt < 3; attempt++) {
      const run = await runAndCloseEarly([...lap, '--out', '-']);
      expect(run.firstChunk.split('\n')[0]).toMatch(/^distance_m,time_s,speed_mps/);
      expect(run.stderr).toBe('');
      expect(run.code).toBe(0);
    }
  });
});

describe('simulate --out -', () => {
  it('writes the whole trace to stdout and nothing else, and no file named -', () => {
    const run = runCli([...lap, '--out', '-']);
    expect(run.code).toBe(0);
    const rows = run.stdout.trim().split('\n');
    expect(rows[0]).toMatch(/^distance_m,/);
    // Every row after the header is numbers: no summary text mixed in.
    expect(rows.slice(1).every((row) => /^[-\d.,]+$/.test(row))).toBe(true);
  });
});
