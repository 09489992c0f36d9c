// Adds one plain closing line, "N passed, N failed, N skipped", after vitest's own summary, so any CI that reads
// a run's last line sees the counts without colour codes.

import type { Reporter, TestModule } from 'vitest/node';

export default class PlainSummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<unknown>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const module of testModules) {
      for (const test of module.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed++;
        else if (state === 'failed') failed++;
        else skipped++;
      }
      if (module.state() === 'failed' && module.children.size === 0) failed++;
    }
    if (unhandledErrors.length > 0) failed += unhandledErrors.length;
    process.stdout.write(`\ntests: ${passed} passed, ${failed} failed, ${skipped} skipped\n`);
  }
}
