import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';
import LongFilesFirstSequencer from './test/long-files-first.js';

/** Test files that keep a module graph of their own: the browser checks (one file, one Chromium) and a file that
 * mocks a library module (vi.mock would reach every file sharing its graph). Every other file shares one graph per
 * worker, the CLI tests and the docs' examples too: runCli restores the working folder after each run, hands the run
 * its environment in the CLI's worker thread (test/helpers/cli.ts), and that thread, with the built CLI loaded, then
 * serves every file of the worker instead of loading it once per file (about 1 s of CPU per file, measured on 20
 * CLI, fuzz and robustness files: 45 s with a graph each, 25 s shared). */
const isolatedFiles = ['test/browser/**', 'test/robustness/internal-error.test.ts'];

export default defineConfig({
  test: {
    globalSetup: ['test/global-setup.ts'],
    setupFiles: ['test/setup-cpu-log.ts'],
    reporters: ['default', './test/plain-summary-reporter.ts'],
    // Without the times of a previous run (a clean clone), the longest files start first (test/long-files-first.ts).
    sequence: { sequencer: LongFilesFirstSequencer },
    // The test files and sources as transformed for the runner, kept on disk between runs (keyed by each file's
    // content and the transform's settings; under node_modules, so a clean install transforms everything again):
    // about 4 s less CPU in vitest's own process on a run after the first.
    experimental: { fsModuleCache: true },
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
        // Library checks and CLI runs: one module graph per worker, so the library and the built CLI load once per
        // core instead of once per file.
        test: { name: 'shared', include: ['test/**/*.test.ts'], exclude: isolatedFiles, isolate: false },
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
