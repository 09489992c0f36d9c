import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';

/** Test files that start the CLI in a worker or a process, change the working folder or the environment, drive a
 * browser or run the documentation's examples: each keeps a module graph of its own. */
const isolatedFiles = [
  'test/browser/**',
  'test/cli/**',
  'test/demo/**',
  'test/docs/**',
  'test/fuzz/**',
  'test/robustness/**',
  'test/compare/against-cli.test.ts',
  'test/compare/compare-session-gps.test.ts',
  'test/report/against-report.test.ts',
  'test/report/budget-page.test.ts',
  'test/report/html-cli.test.ts',
  'test/report/line-map.test.ts',
  'test/report/sweep-report-html.test.ts',
  'test/sweep/gnu-parallel.test.ts',
];

export default defineConfig({
  test: {
    globalSetup: ['test/global-setup.ts'],
    setupFiles: ['test/setup-cpu-log.ts'],
    reporters: ['default', './test/plain-summary-reporter.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    // Processes, not threads: tests change the working folder (test/helpers/cli.ts) and start worker threads.
    pool: 'forks',
    // One test file per core. vitest's own default leaves a core free (one file at a time on two cores), which
    // suits a machine that also serves an editor, not a test run.
    maxWorkers: availableParallelism(),
    projects: [
      {
        extends: true,
        // Library-level checks: pure functions on records, no working folder, no environment, no CLI. They share
        // one module graph per worker, so the library loads once per core instead of once per file (most of the
        // suite's CPU time was module loading).
        test: { name: 'library', include: ['test/**/*.test.ts'], exclude: isolatedFiles, isolate: false },
      },
      {
        extends: true,
        test: {
          name: 'isolated',
          include: isolatedFiles.map((glob) => (glob.endsWith('/**') ? `${glob}/*.test.ts` : glob)),
        },
      },
    ],
  },
});
