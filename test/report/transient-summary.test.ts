// The transient check's summary merges the axle-saturation stretches for reading; the expected stretches are
// worked by hand from the inputs below.

import { describe, expect, it } from 'vitest';
import { mergedSaturation, transientJson, transientSummaryText } from '../../src/report/transient-summary.js';
import type { SaturationZone, TransientCheck } from '../../src/solve/transient.js';
import { transientVerdict, type DeviationFigures } from '../../src/solve/transient-verdict.js';
import { displayUnits } from '../../src/report/units.js';

const zone = (fromM: number, toM: number, axle: SaturationZone['axle'], peakUse = 1): SaturationZone => ({
  fromM,
  toM,
  axle,
  peakUse,
});

describe('mergedSaturation', () => {
  it('joins stretches a few metres apart, joins their axles and drops the zero-length ones', () => {
    const merged = mergedSaturation([
      zone(1115, 1263, 'both'),
      zone(1269, 1317, 'both'),
      zone(1319, 1328, 'rear'),
      zone(1758, 1758, 'front', 0.95),
      zone(1800, 1850, 'front', 0.97),
      zone(1855, 1860, 'rear', 0.96),
    ]);
    expect(merged).toEqual([zone(1115, 1328, 'both'), zone(1800, 1860, 'both', 0.97)]);
  });

  it('keeps stretches far apart as they are', () => {
    expect(mergedSaturation([zone(100, 150, 'front', 0.96), zone(400, 420, 'rear', 0.99)])).toEqual([
      zone(100, 150, 'front', 0.96),
      zone(400, 420, 'rear', 0.99),
    ]);
  });
});

describe("the summary in the reader's units", () => {
  // Invented figures: 2.46 m to the right at 1301 m with 0.35 m of room, 16.4 against 16.2 m/s; the largest
  // deviation 3.66 m elsewhere. Conversions: 1 ft = 0.3048 m, 1 mph = 0.44704 m/s exactly (NIST SP 811, appendix B).
  const figures: DeviationFigures = {
    maxDeviationM: 3.66,
    maxDeviationAtM: 1314,
    maxDeviationShare: 2.46 / 0.35,
    maxDeviationShareAtM: 1301,
    deviationAtShareM: -2.46,
    roomAtShareM: 0.35,
    speedAtShareMps: 16.4,
    referenceSpeedAtShareMps: 16.2,
  };
  const verdictInput = {
    completed: true,
    drivable: false,
    lost: '' as const,
    lastLapStationM: 4000,
    steps: 9000,
    limitSource: 'track width less half the car' as const,
    criticalSpeedMps: null,
    referenceMaxSpeedMps: 70,
  };
  const check = {
    ...figures,
    completed: true,
    drivable: false,
    verdict: transientVerdict(verdictInput, figures),
    referenceLapTimeS: 77.84,
    followedLapTimeS: 78.67,
    deviationLimitSource: 'track width less half the car',
    maxSteerDeg: 18.9,
    saturation: [zone(1118, 1261, 'both')],
  } as unknown as TransientCheck;

  it('words the verdict, the deviation and the stretches in metres and km/h, or in feet and mph', () => {
    const metric = transientSummaryText(check);
    expect(metric).toContain(
      "not drivable as computed: the followed car runs 2.46 m to the right at 1301 m, 703 % of the 0.35 m of room to the right edge, at 59 km/h against the reference's 58 km/h",
    );
    expect(metric).toContain('largest deviation 3.66 m at 1314 m');
    expect(metric).toContain('1118-1261 m  both axles');
    const imperial = transientSummaryText(check, displayUnits('imperial'));
    // 2.46 / 0.3048 = 8.07 ft, 1301 / 0.3048 = 4268 ft, 0.35 / 0.3048 = 1.15 ft; 16.4 / 0.44704 = 36.7 mph.
    expect(imperial).toContain(
      "runs 8.07 ft to the right at 4268 ft, 703 % of the 1.15 ft of room to the right edge, at 37 mph against the reference's 36 mph",
    );
    // 3.66 / 0.3048 = 12.01 ft at 4311 ft; 1118 and 1261 m = 3668 and 4137 ft.
    expect(imperial).toContain('largest deviation 12.01 ft at 4311 ft');
    expect(imperial).toContain('3668-4137 ft  both axles');
    expect(imperial).not.toMatch(/\d m\b|km\/h/);
    // JSON stays in SI, its verdict in metres and km/h.
    expect(transientJson(check).verdict).toContain('2.46 m to the right at 1301 m');
  });
});
