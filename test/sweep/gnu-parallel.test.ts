// Sweep shards run as separate processes under GNU parallel (Debian's `parallel`), the recipe of
// docs/setup-sweeps.md with local jobs: `reflap sweep --merge` of the parts equals one unsharded run byte for
// byte. Without /usr/bin/parallel the test skips with a message; in CI it fails (npm test installs it through
// scripts/ensure-parallel.sh).

import { beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { projectRoot, runCli } from '../helpers/cli.js';
import { writeTestLoop } from '../report/sweep-fixtures.js';

const PARALLEL = '/usr/bin/parallel';
const haveParallel = existsSync(PARALLEL);
if (!haveParallel && process.env.CI)
  throw new Error(`${PARALLEL} is missing; npm test installs Debian's parallel package (scripts/ensure-parallel.sh)`);
if (!haveParallel)
  console.warn(`skipping the GNU parallel shard test: ${PARALLEL} is absent (apt-get install parallel)`);

describe.skipIf(!haveParallel)('sweep shards under GNU parallel', () => {
  let folder: string;
  let loop: string;
  const car = 'cars/brackle-club.json';
  const vary = ['--vary', 'massKg=600:660:20', 'tyre.muLat=-5%:+5%:5%'];

  beforeAll(() => {
    folder = mkdtempSync(join(tmpdir(), 'reflap-parallel-'));
    loop = writeTestLoop(folder);
  });

  it('merges the shards of local jobs into the unsharded CSV, byte for byte', () => {
    const shards = 3;
    // One job per shard, two at a time; {} is the shard number. --halt now,fail=1 stops at the first failure.
    const jobs = spawnSync(
      PARALLEL,
      [
        '--will-cite',
        '--jobs',
        '2',
        '--halt',
        'now,fail=1',
        process.execPath,
        join(projectRoot, 'bin', 'reflap.js'),
        'sweep',
        '--track',
        loop,
        '--car',
        car,
        ...vary,
        '--workers',
        '0',
        '--shard',
        `{}/${shards}`,
        '--out',
        join(folder, 'part-{}.csv'),
        ':::',
        ...Array.from({ length: shards }, (_, k) => String(k + 1)),
      ],
      { cwd: projectRoot, encoding: 'utf8' },
    );
    expect(jobs.stderr).toBe('');
    expect(jobs.status).toBe(0);
    const parts = Array.from({ length: shards }, (_, k) => join(folder, `part-${k + 1}.csv`));
    const merged = join(folder, 'merged.csv');
    expect(runCli(['sweep', '--merge', ...parts, '--out', merged]).code).toBe(0);
    const whole = join(folder, 'whole.csv');
    expect(runCli(['sweep', '--track', loop, '--car', car, ...vary, '--workers', '0', '--out', whole]).code).toBe(0);
    expect(readFileSync(merged)).toEqual(readFileSync(whole));
    // 1 baseline, 2 x 2 difference runs, 4 x 3 grid setups, split across the three parts.
    const rows = (file: string) =>
      readFileSync(file, 'utf8')
        .split('\n')
        .filter((line) => /^\d/.test(line)).length;
    expect(rows(whole)).toBe(1 + 4 + 12);
    expect(parts.map(rows).every((count) => count > 0 && count < rows(whole))).toBe(true);
  });
});
