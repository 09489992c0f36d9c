// `reflap demo` from a folder outside the project: it finds the bundled car and circuit, writes the invented
// driver's 20 Hz log into ./out/ there, and the comparison recovers the faults the driver model was given.

import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cli.js';

describe('reflap demo', () => {
  const folder = mkdtempSync(path.join(tmpdir(), 'reflap-demo-'));
  const run = runCli(['demo'], { cwd: folder });

  it('runs from any folder and writes a 20 Hz log with GPS positions', () => {
    expect(run.code).toBe(0);
    const lines = readFileSync(path.join(folder, 'out', 'demo-lap.csv'), 'utf8')
      .trim()
      .split('\n');
    expect(lines[0]).toMatch(/time_s,lat_deg,lon_deg,speed_kph/);
    const t1 = Number(lines[1]!.split(',')[0]);
    const t2 = Number(lines[2]!.split(',')[0]);
    expect(t2 - t1).toBeCloseTo(0.05, 6);
    expect(run.stdout).toMatch(/Caution/);
  });

  it('prints no negative zero in its tables (issue 16: a zero reads as 0, not -0)', () => {
    expect(run.stdout).not.toMatch(/(^|[\s/(])-0(\.0+)?(?=[\s/)]|$)/m);
  });

  it('says in one line that the partial laps of its invented session are the out and in laps', () => {
    expect(run.stdout).not.toMatch(/lap \d+ left out/);
    expect(run.stdout).toMatch(/Note: the invented session has an out lap and an in lap around the timed lap/);
  });

  it("finds the driver model's faults: 45 m early braking, 12 m late braking, coasting", () => {
    // The expected figures are the ones the driver model was built with (src/demo/demo-driver.ts).
    const corners = readFileSync(path.join(folder, 'out', 'corners.csv'), 'utf8')
      .trim()
      .split('\n');
    const header = corners[0]!.split(',');
    const rows = corners
      .slice(1)
      .map((line) => Object.fromEntries(line.split(',').map((cell, i) => [header[i], cell])));
    const faultLine = /faults: (.*)\./.exec(run.stdout)![1]!;
    const cornerOf = (kind: string) => Number(new RegExp(`${kind} at corner (\\d+)`).exec(faultLine)![1]);
    const row = (id: number) => rows.find((r) => Number(r.id) === id)!;
    expect(Number(row(cornerOf('early braking')).brakingPointDeltaM)).toBeGreaterThan(-50);
    expect(Number(row(cornerOf('early braking')).brakingPointDeltaM)).toBeLessThan(-40);
    expect(Number(row(cornerOf('late hard braking')).brakingPointDeltaM)).toBeGreaterThan(7);
    expect(Number(row(cornerOf('coasting')).coastingS)).toBeGreaterThan(1);
    expect(run.stdout).toMatch(/Where the time is/);
  });

  it('compares a racing-line reference with a driver who drives a line of their own', () => {
    expect(run.stdout).toMatch(/Reference path: the minimum-time racing line/);
    // Findings of every kind the driver model's faults give (src/demo/demo-driver.ts): the wording is the
    // findings' own (src/compare/findings.ts), the kinds are the four faults and what they do to the corner.
    const findings = run.stdout.slice(run.stdout.indexOf('Where the time is'));
    for (const kind of [
      /braking begins \d+ m before the reference/,
      /braking begins \d+ m after the reference at \d+ km\/h and too hard/,
      /the lift comes \d+ m before the reference's braking point/,
      /s spent coasting with neither pedal pressed/,
      /the slowest point is \d+ km\/h under the reference's/,
      /the slowest point falls \d+ m (before|after) the apex/,
      /grip is left unused over \d+ m/,
    ])
      expect(findings).toMatch(kind);
  });
});
