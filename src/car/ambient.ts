// Ambient air: density from the ideal gas law, rho = p / (R T) with R = 287.05 J/(kg K) for dry air (ISO 2533),
// and the engine-power factor for these conditions.

import type { Ambient } from './types.js';
import { DRY_AIR_GAS_CONSTANT, ZERO_CELSIUS_K } from '../units.js';
import { j1349PowerFactor } from './power-correction.js';

export const ISA_SEA_LEVEL = { airTempC: 15, pressureHpa: 1013.25 } as const;

export function airDensityKgPerM3(airTempC: number, pressureHpa: number): number {
  return (pressureHpa * 100) / (DRY_AIR_GAS_CONSTANT * (airTempC + ZERO_CELSIUS_K));
}

/** Engine power follows SAE J1349 (see power-correction.ts); humidity, when given, lowers the dry-air pressure. */
export function ambientFrom(
  conditions: { airTempC: number; pressureHpa: number; relativeHumidityPct?: number } = ISA_SEA_LEVEL,
): Ambient {
  return {
    airTempC: conditions.airTempC,
    pressureHpa: conditions.pressureHpa,
    airDensityKgPerM3: airDensityKgPerM3(conditions.airTempC, conditions.pressureHpa),
    powerFactor: j1349PowerFactor(conditions),
  };
}
