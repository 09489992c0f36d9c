import { describe, expect, it } from 'vitest';
import { airDensityKgPerM3, ambientFrom } from '../../src/car/ambient.js';

describe('air density', () => {
  // ISO 2533:1975 standard atmosphere: 1.225 kg/m^3 at sea level, 15 °C and 1013.25 hPa.
  it('is 1.225 kg/m^3 at ISA sea level', () => {
    expect(ambientFrom().airDensityKgPerM3).toBeCloseTo(1.225, 3);
  });

  // Ideal gas law rho = p / (R T): at fixed pressure density scales with 1 / T.
  it('falls with temperature as 1 / T', () => {
    const ratio = airDensityKgPerM3(35, 1013.25) / airDensityKgPerM3(15, 1013.25);
    expect(ratio).toBeCloseTo(288.15 / 308.15, 10);
  });
});
