// `npm run bench`: runs every benchmark module in turn and prints its figures. Benchmarks, not timed tests.

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

const only = process.argv.slice(2);
for (const [name, load] of modules) {
  if (only.length > 0 && !only.includes(name)) continue;
  process.stdout.write(`\n== ${name} ==\n`);
  const module = await load();
  await module.run();
}
