// The order the test files start in. vitest's own order runs the longest files first by the times of its last run
// (cached under node_modules/.vite), so the two workers end together; a clean clone (CI) has no such times and
// vitest then starts the largest files first, which puts the longest files, small ones that run many commands,
// near the end, where one can leave the other core idle for most of its run. Without cached times, the files
// listed in LONG_FILES start first, in that order, each within its project; with them, vitest's order stands.

import { relative } from 'node:path';
import { BaseSequencer, type TestSpecification } from 'vitest/node';

/** The longest test files, longest first: the browser checks (their own project, run first), then CPU seconds of
 * each file in one run (REFLAP_TEST_CPU_LOG, the worker's and its child processes'), about 12 to 2 s on the
 * development machine; a file missing from the run is passed over. */
export const LONG_FILES = [
  'test/browser/report-pages.test.ts',
  'test/docs/examples.test.ts',
  'test/cli/process.test.ts',
  'test/line/open-tracks.test.ts',
  'test/fuzz/special-files.test.ts',
  'test/io/telemetry-stream.test.ts',
  'test/calibrate/calibrate-car.test.ts',
  'test/sweep/gnu-parallel.test.ts',
  'test/docs/library-examples.test.ts',
  'test/cli/terminal.test.ts',
];

/** FILES (in vitest's order) with the listed ones moved to the front of their project's run, in the list's order. */
export function longFilesFirst<T>(files: T[], projectOf: (file: T) => string, pathOf: (file: T) => string): T[] {
  const rank = (file: T) => {
    const k = LONG_FILES.indexOf(pathOf(file));
    return k < 0 ? LONG_FILES.length : k;
  };
  const projects = [...new Set(files.map(projectOf))];
  // Array.prototype.sort is stable: the unlisted files keep vitest's order among themselves.
  return projects.flatMap((project) =>
    files.filter((file) => projectOf(file) === project).sort((a, b) => rank(a) - rank(b)),
  );
}

export default class LongFilesFirstSequencer extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files);
    const root = this.ctx.config.root;
    const pathOf = (file: TestSpecification) => relative(root, file.moduleId).split('\\').join('/');
    const timed = sorted.every((file) => this.ctx.cache.getFileTestResults(`${file.project.name}:${pathOf(file)}`));
    return timed ? sorted : longFilesFirst(sorted, (file) => file.project.name, pathOf);
  }
}
