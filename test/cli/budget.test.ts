// `reflap budget` as a coach reads it: the sentence and the table give the same figures, the speed that fits the
// radius, the table across lateral loads, and the units flag.

import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cli.js';
import { STANDARD_GRAVITY_MPS2 as g } from '../../src/units.js';

// The club car: muLat 1.3 and no downforce, so its lateral limit is 1.3 g at every speed on the point-mass model.
const car = 'cars/brackle-club.json';

describe('reflap budget', () => {
  it('says in its sentence the same braking figures and shares as its table', () => {
    const run = runCli(['budget', '--car', car, '--speed-kph', '120', '--radius-m', '90']);
    expect(run.code).toBe(0);
    const row = /^braking\s+([\d.]+) g\s+(\d+) %\s+([\d.]+) g\s+(\d+) %\s+([\d.]+) g$/m.exec(run.stdout);
    expect(row).not.toBeNull();
    const [, ellipseG, ellipseShare, linearG, linearShare, straightG] = row!;
    expect(run.stdout).toContain(
      `still leaves ${ellipseG} g of braking, ${ellipseShare} % of the straight line's ${straightG} g; the linear split would leave ${linearG} g, ${linearShare} %.`,
    );
    // The share in the table is the g figure over the straight-line figure (rounding of the printed values aside).
    expect(Number(linearShare)).toBeCloseTo((100 * Number(linearG)) / Number(straightG), -0.5);
    // Nothing negative is shown as "still available".
    expect(run.stdout).not.toMatch(/-\d/);
  });

  it('gives the speed that fits the radius, v = sqrt(mu g R), and the tightest radius, R = v^2 / (mu g)', () => {
    // Steady cornering on a flat road (Milliken and Milliken, Race Car Vehicle Dynamics, 1995): a = v^2 / R <= mu g.
    const run = runCli(['budget', '--car', car, '--speed-kph', '100', '--radius-m', '40', '--json']);
    expect(run.code).toBe(0);
    const budget = JSON.parse(run.stdout);
    expect(budget.lateralShare).toBeGreaterThan(1);
    expect(budget.cornerSpeedLimitMps).toBeCloseTo(Math.sqrt(1.3 * g * 40), 2);
    const speedMps = 100 / 3.6;
    expect(budget.tightestRadiusM).toBeCloseTo((speedMps * speedMps) / (1.3 * g), 1);
    const text = runCli(['budget', '--car', car, '--speed-kph', '100', '--radius-m', '40']).stdout;
    expect(text).toMatch(
      new RegExp(`cannot hold this radius at 100 km/h; it fits at ${(Math.sqrt(1.3 * g * 40) * 3.6).toFixed(0)} km/h`),
    );
  });

  it('tabulates lateral loads from 0 to 100 % of the limit, braking on the ellipse falling as sqrt(1 - s^2)', () => {
    const run = runCli(['budget', '--car', car, '--speed-kph', '60', '--lateral-g', '0.5', '--json']);
    const rows = JSON.parse(run.stdout).lateralLoads as {
      lateralShare: number;
      lateralG: number;
      brakingAvailableG: number;
    }[];
    expect(rows.map((r) => r.lateralShare)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    for (const r of rows) expect(r.lateralG).toBeCloseTo(1.3 * r.lateralShare, 3);
    // Friction circle (Milliken and Milliken 1995): the tyre's braking left is b0 sqrt(1 - s^2) when the car's
    // g-g exponent is 2; drag at 60 km/h adds a little on top, so the ratio sits just above the circle's.
    const b0 = rows[0]!.brakingAvailableG;
    for (const r of rows.slice(1, -1)) {
      const ratio = r.brakingAvailableG / b0;
      expect(ratio).toBeGreaterThanOrEqual(Math.sqrt(1 - r.lateralShare ** 2) - 0.02);
      expect(ratio).toBeLessThan(Math.sqrt(1 - r.lateralShare ** 2) + 0.05);
    }
  });

  it('prints mph and feet with --units imperial and with REFLAP_UNITS=imperial, JSON staying SI', () => {
    // 1 mph = 0.44704 m/s and 1 ft = 0.3048 m exactly (NIST SP 811, appendix B).
    const expectedMph = (100 / 3.6 / 0.44704).toFixed(0);
    const expectedFt = (40 / 0.3048).toFixed(0);
    const flag = runCli(['budget', '--car', car, '--speed-kph', '100', '--radius-m', '40', '--units', 'imperial']);
    expect(flag.stdout).toContain(`at ${expectedMph} mph on a ${expectedFt} ft radius`);
    expect(flag.stdout).not.toMatch(/km\/h/);
    const environment = runCli(['budget', '--car', car, '--speed-kph', '100', '--radius-m', '40'], {
      env: { REFLAP_UNITS: 'imperial' },
    });
    expect(environment.stdout).toContain(`at ${expectedMph} mph`);
    const json = runCli([
      'budget',
      '--car',
      car,
      '--speed-kph',
      '100',
      '--radius-m',
      '40',
      '--units',
      'imperial',
      '--json',
    ]);
    expect(JSON.parse(json.stdout).radiusM).toBe(40);
    const wrong = runCli(['budget', '--car', car, '--speed-kph', '100', '--radius-m', '40'], {
      env: { REFLAP_UNITS: 'furlongs' },
    });
    expect(wrong.code).toBe(2);
    expect(wrong.stderr).toMatch(/REFLAP_UNITS: 'furlongs' is not one of metric, imperial/);
  });
});
