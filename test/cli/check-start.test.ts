// What `reflap check` loads before it answers (issue 18's start-up target): a car file is validated without zod
// and without the track and log readers (no CSV parser); a segment track, which only zod validates, still loads
// it, which shows that the probe sees a library when it is there. Each run is a fresh process
// on the built CLI (dist/), since a module loaded once stays loaded. Common practice: guard the start path by
// what it loads, not by a timing on a shared machine (the timings are in bench/startup.bench.ts).

import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectRoot } from '../helpers/cli.js';

const PROBE = `
import { createRequire } from 'node:module';
import { main } from './dist/src/cli/main.js';
const code = await main(['node', 'reflap', 'check', ...JSON.parse(process.env.CHECK_FILES)]);
const loaded = Object.keys(createRequire(import.meta.url).cache);
const packages = ['zod', 'csv-parse', 'ml-matrix', 'fast-xml-parser'].filter((name) =>
  loaded.some((file) => file.includes('/node_modules/' + name + '/')),
);
process.stderr.write(JSON.stringify({ code, packages }) + '\\n');
`;

function librariesLoadedChecking(files: string[]): { code: number; packages: string[] } {
  const run = spawnSync(process.execPath, ['--input-type=module', '-e', PROBE], {
    cwd: projectRoot,
    env: { ...process.env, CHECK_FILES: JSON.stringify(files.map((file) => path.join(projectRoot, file))) },
    encoding: 'utf8',
  });
  const last = run.stderr.trim().split('\n').pop() ?? '';
  return JSON.parse(last) as { code: number; packages: string[] };
}

describe('check start path', () => {
  it('validates a car file without zod and without the CSV parser', () => {
    expect(librariesLoadedChecking(['cars/brackle-club.json'])).toEqual({ code: 0, packages: [] });
  });

  it('finds the problems of a broken car file without zod', () => {
    const result = librariesLoadedChecking(['test/fixtures/broken/car-three-problems.json']);
    expect(result.code).toBe(2);
    expect(result.packages).not.toContain('zod');
  });

  it('loads zod for a segment track, which only zod validates', () => {
    const result = librariesLoadedChecking(['tracks/tarnwick-club.json']);
    expect(result.packages).toContain('zod');
  });
});
