// `npm run bench`: runs every benchmark module in turn, each in a process of its own, and prints its figures.
// Benchmarks, not timed tests. A module run after the others inherited their heap: the large-telemetry read cost
// 604 ns a row on 64 MB after the other modules (298 MB resident) and 315 ns in a process of its own, and its
// linearity verdict failed on that alone.

import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

interface BenchModule {
  run(): Promise<void>;
}

const modules: [string, () => Promise<BenchModule>][] = [
  ['startup', () => import('./startup.bench.js')],
  ['simulate', () => import('./simulate.bench.js')],
  ['memory', () => import('./memory.bench.js')],
  ['telemetry', () => import('./telemetry.bench.js')],
  ['compare', () => import('./compare.bench.js')],
  ['track', () => import('./track.bench.js')],
  ['sweep', () => import('./sweep.bench.js')],
  ['line', () => import('./line.bench.js')],
  ['transient', () => import('./transient.bench.js')],
  ['large-telemetry', () => import('./large-telemetry.bench.js')],
  ['calibrate', () => import('./calibrate.bench.js')],
  ['session', () => import('./session.bench.js')],
];

/** `--in-process NAME`: run that module here (what each child does); otherwise the named modules, or all. */
const args = process.argv.slice(2);
const inProcess = args[0] === '--in-process' ? args[1] : undefined;
if (inProcess !== undefined) {
  const entry = modules.find(([name]) => name === inProcess);
  if (!entry) throw new Error(`no benchmark module '${inProcess}'`);
  await (await entry[1]()).run();
} else {
  let failed = false;
  for (const [name] of modules) {
    if (args.length > 0 && !args.includes(name)) continue;
    process.stdout.write(`\n== ${name} ==\n`);
    const child = spawnSync(
      process.execPath,
      [...process.execArgv, fileURLToPath(import.meta.url), '--in-process', name],
      { stdio: 'inherit' },
    );
    if (child.status !== 0) {
      process.stderr.write(`benchmark module ${name} failed (exit ${child.status ?? child.signal})\n`);
      failed = true;
    }
  }
  if (failed) process.exitCode = 1;
}
