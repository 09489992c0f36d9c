// The transient check's summary merges the axle-saturation stretches for reading; the expected stretches are
// worked by hand from the inputs below.

import { describe, expect, it } from 'vitest';
import { mergedSaturation } from '../../src/report/transient-summary.js';
import type { SaturationZone } from '../../src/solve/transient.js';

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
