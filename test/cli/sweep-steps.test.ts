// The sweep's sensitivity table per the step a person thinks in (per 1 % of grip, per 10 kg), with the step in
// the header and plain numbers, checked against the closed form of a car on a constant-radius ring.

import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../helpers/cli.js';

let ring: string;
const car = 'cars/brackle-club.json';

beforeAll(() => {
  const folder = mkdtempSync(join(tmpdir(), 'reflap-steps-'));
  ring = join(folder, 'ring.json');
  writeFileSync(
    ring,
    JSON.stringify({ name: 'ring', closed: true, widthM: 12, segments: [{ kind: 'arc', radiusM: 80, angleDeg: 360 }] }),
  );
});

describe('sweep sensitivities per user step', () => {
  it('prints the lap time per 1 % of lateral grip as -T / 200 on a ring, the step in the header', () => {
    // On a ring of radius R the car runs at v = sqrt(mu g R) (Milliken and Milliken, Race Car Vehicle Dynamics,
    // 1995), so T = 2 pi R / v and dT/dmu = -T / (2 mu): one per cent of mu changes T by -T / 200.
    const run = runCli(['sweep', '--track', ring, '--car', car, '--vary', 'tyre.muLat=-2%:+2%:2%', '--workers', '0']);
    expect(run.code).toBe(0);
    const baseline = /Baseline lap (\d+):(\d+\.\d+)/.exec(run.stdout);
    expect(baseline).not.toBeNull();
    const lapTimeS = Number(baseline![1]) * 60 + Number(baseline![2]);
    const header = run.stdout.split('\n').find((line) => line.startsWith('change per step'));
    expect(header).toMatch(/per \+1 % \(0\.013\) of lateral grip \(tyre\.muLat\)/);
    const row = /^lap time, s\s+(\S+)/m.exec(run.stdout);
    expect(row).not.toBeNull();
    const perStep = Number(row![1]);
    // Drag takes a little of the grip on the ring, so the check allows 10 %.
    expect(perStep).toBeLessThan(0);
    expect(Math.abs(perStep / (-lapTimeS / 200) - 1)).toBeLessThan(0.1);
  });

  it('prints mass per 10 kg in plain numbers: no scientific notation and no -0.0', () => {
    const run = runCli(['sweep', '--track', ring, '--car', car, '--vary', 'massKg=600:640:20', '--workers', '0']);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/per \+10 kg of mass \(massKg\)/);
    expect(run.stdout).not.toMatch(/\d[eE][-+]?\d/);
    expect(run.stdout).not.toMatch(/-0\.0+(?!\d*[1-9])\b/);
  });
});
