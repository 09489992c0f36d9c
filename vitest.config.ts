import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    globalSetup: ['test/global-setup.ts'],
    reporters: ['default', './test/plain-summary-reporter.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    // Processes, not threads: tests change the working folder (test/helpers/cli.ts) and start worker threads.
    pool: 'forks',
    // One test file per core. vitest's own default leaves a core free (one file at a time on two cores), which
    // suits a machine that also serves an editor, not a test run.
    maxWorkers: availableParallelism(),
  },
});
