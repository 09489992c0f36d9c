import { describe, expect, it } from 'vitest';
import {
  dryAirPressureKpa,
  j1349CorrectionFactor,
  j1349PowerFactor,
  saturationVapourPressureHpa,
} from '../../src/car/power-correction.js';
import { ambientFrom } from '../../src/car/ambient.js';

describe('SAE J1349 power correction', () => {
  it('is 1 at the reference air of the standard, 25 °C and 99 kPa dry-air pressure', () => {
    // SAE J1349 (1990 and 2004 editions, from memory): reference conditions 25 °C, 99 kPa dry air, CF = 1 there.
    for (const edition of ['1990', '2004'] as const) {
      expect(j1349CorrectionFactor({ airTempC: 25, pressureHpa: 990, edition })).toBeCloseTo(1, 12);
      expect(j1349PowerFactor({ airTempC: 25, pressureHpa: 990, edition })).toBeCloseTo(1, 12);
    }
    expect(ambientFrom({ airTempC: 25, pressureHpa: 990 }).powerFactor).toBeCloseTo(1, 12);
  });

  it('matches a hand calculation of the 2004 form at ISA sea level', () => {
    // SAE J1349 (August 2004), from memory: CF = 1.176 (99 / Pd) sqrt((T + 273) / 298) - 0.176.
    // Hand calculation at 15 °C, 101.325 kPa: 99 / 101.325 = 0.977054, sqrt(288 / 298) = 0.983079,
    // 1.176 * 0.977054 * 0.983079 - 0.176 = 0.953573.
    expect(j1349CorrectionFactor({ airTempC: 15, pressureHpa: 1013.25, edition: '2004' })).toBeCloseTo(0.953573, 5);
    // The 1990 form, from memory: 1.18 * 0.977054 * 0.983079 - 0.18 = 0.953415.
    expect(j1349CorrectionFactor({ airTempC: 15, pressureHpa: 1013.25, edition: '1990' })).toBeCloseTo(0.953415, 5);
  });

  it('takes power away on a hot day and on thin air', () => {
    const reference = j1349PowerFactor({ airTempC: 25, pressureHpa: 990 });
    expect(j1349PowerFactor({ airTempC: 40, pressureHpa: 990 })).toBeLessThan(reference);
    expect(j1349PowerFactor({ airTempC: 25, pressureHpa: 850 })).toBeLessThan(reference);
    expect(j1349PowerFactor({ airTempC: 25, pressureHpa: 990, relativeHumidityPct: 80 })).toBeLessThan(reference);
  });

  it('takes the water vapour out of the pressure', () => {
    // Saturation vapour pressure of water at 20 °C: 2.339 kPa (CRC Handbook of Chemistry and Physics, vapour pressure of water table).
    expect(saturationVapourPressureHpa(20)).toBeCloseTo(23.39, 0);
    // At 30 °C: 4.247 kPa (same table).
    expect(saturationVapourPressureHpa(30)).toBeCloseTo(42.47, 0);
    expect(dryAirPressureKpa(1000, 20, 50)).toBeCloseTo(100 - 0.5 * 2.339, 1);
    expect(() => dryAirPressureKpa(1000, 20, 120)).toThrow(/humidity/);
  });
});
