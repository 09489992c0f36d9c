// Start-up of the command: `reflap --help` and `reflap check` of a small car JSON and a small centreline CSV,
// each against a bare `node -e 0` on the same machine, as separate processes (median wall time of 15 runs; CPU
// time of the children from the kernel's account, averaged). Target (issue 18): within 0.15 s of bare Node.

import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { childCpuS, machineLoad, median, verdict } from './stats.js';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));
const RUNS = 15;

/** A closed 40-point circle of 100 m radius: a small centreline CSV. */
function smallTrackCsv(): string {
  const rows = ['x_m,y_m'];
  for (let k = 0; k < 40; k++) {
    const angle = (2 * Math.PI * k) / 40;
    rows.push(`${(100 * Math.cos(angle)).toFixed(3)},${(100 * Math.sin(angle)).toFixed(3)}`);
  }
  return rows.join('\n') + '\n';
}

interface StartTiming {
  wallMs: number;
  /** Mean CPU time of one run (user + system), ms; null where the platform does not tell. */
  cpuMs: number | null;
}

function timeCommand(args: string[]): StartTiming {
  const walls: number[] = [];
  const cpuBefore = childCpuS();
  for (let k = 0; k < RUNS; k++) {
    const start = performance.now();
    const result = spawnSync(process.execPath, args, { cwd: projectRoot, stdio: ['ignore', 'ignore', 'pipe'] });
    walls.push(performance.now() - start);
    if (result.status !== 0) throw new Error(`${args.join(' ')} exited with ${result.status}: ${result.stderr}`);
  }
  const cpuAfter = childCpuS();
  return {
    wallMs: median(walls),
    cpuMs: cpuBefore === null || cpuAfter === null ? null : ((cpuAfter - cpuBefore) * 1000) / RUNS,
  };
}

export async function run(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'reflap-startup-bench-'));
  try {
    const track = path.join(dir, 'small-track.csv');
    writeFileSync(track, smallTrackCsv());
    const bin = path.join(projectRoot, 'bin', 'reflap.js');
    const bare = timeCommand(['-e', '0']);
    const cases: [string, string[]][] = [
      ['reflap --help', [bin, '--help']],
      ['reflap check car.json track.csv', [bin, 'check', path.join(projectRoot, 'cars', 'brackle-club.json'), track]],
    ];
    const show = (timing: StartTiming) =>
      `${timing.wallMs.toFixed(0)} ms wall, ${timing.cpuMs === null ? 'n/a' : timing.cpuMs.toFixed(0)} ms CPU`;
    process.stdout.write(`node -e 0: ${show(bare)} (median wall of ${RUNS} runs, mean CPU)\n`);
    for (const [label, args] of cases) {
      const timing = timeCommand(args);
      process.stdout.write(`${label}: ${show(timing)}\n`);
      process.stdout.write(`  ${verdict('wall over bare Node', (timing.wallMs - bare.wallMs) / 1000, 0.15, 's')}`);
      if (timing.cpuMs !== null && bare.cpuMs !== null)
        process.stdout.write(`; ${verdict('CPU over bare Node', (timing.cpuMs - bare.cpuMs) / 1000, 0.15, 's')}`);
      process.stdout.write('\n');
    }
    process.stdout.write(`  ${machineLoad()}: wall times hold only on an otherwise idle machine\n`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
