// Engine power corrected for the air it breathes, after SAE J1349 (spark-ignition engines): the rated
// power holds at the standard's reference air (25 °C, 99 kPa dry-air pressure); other air gives rated / CF.

import { InputError } from '../errors.js';

/**
 * Constants of the correction CF = a * (99 / Pd) * sqrt((T + 273) / 298) - b, Pd the dry-air pressure
 * in kPa and T the air temperature in °C. Both editions keep the reference air at 25 °C and 99 kPa dry;
 * the constants are from memory (no page citation): a and b subtract an assumed mechanical friction
 * share so that only the indicated power scales with the air.
 */
export const SAE_J1349_EDITIONS = {
  /** SAE J1349 (June 1990): 1.18 / 0.18. */
  '1990': { a: 1.18, b: 0.18 },
  /** SAE J1349 (August 2004): 1.176 / 0.176. */
  '2004': { a: 1.176, b: 0.176 },
} as const;

export type J1349Edition = keyof typeof SAE_J1349_EDITIONS;

/** The edition reflap uses unless told otherwise. */
export const DEFAULT_J1349_EDITION: J1349Edition = '2004';

export const J1349_REFERENCE_TEMP_C = 25;
/** The standard's °C-to-kelvin offset: 273, not 273.15, so the 25 °C reference is 298 K exactly and CF = 1 there. */
const J1349_KELVIN_OFFSET = 273;
export const J1349_REFERENCE_DRY_PRESSURE_KPA = 99;

export interface PowerCorrectionInput {
  airTempC: number;
  /** Total (barometric) pressure, hPa. */
  pressureHpa: number;
  /** Relative humidity, 0-100 %; the water vapour's share of the pressure does not feed combustion. Default 0. */
  relativeHumidityPct?: number;
  edition?: J1349Edition;
}

/**
 * Saturation vapour pressure of water over a flat water surface, hPa, by the Magnus form with the
 * coefficients of Alduchov and Eskridge (1996), J. Appl. Meteor. 35, 601-609: 6.1094 exp(17.625 T / (T + 243.04)).
 */
export function saturationVapourPressureHpa(airTempC: number): number {
  return 6.1094 * Math.exp((17.625 * airTempC) / (airTempC + 243.04));
}

/** Dry-air partial pressure, kPa: the total pressure less the water vapour's partial pressure. */
export function dryAirPressureKpa(pressureHpa: number, airTempC: number, relativeHumidityPct = 0): number {
  if (!(relativeHumidityPct >= 0 && relativeHumidityPct <= 100)) {
    throw new InputError(`relative humidity ${relativeHumidityPct} % is outside 0 to 100 %`);
  }
  const vapourHpa = (relativeHumidityPct / 100) * saturationVapourPressureHpa(airTempC);
  return (pressureHpa - vapourHpa) / 10;
}

/** The SAE J1349 correction factor CF: rated power = observed power * CF, so CF > 1 on a hot or thin-air day. */
export function j1349CorrectionFactor(input: PowerCorrectionInput): number {
  const { a, b } = SAE_J1349_EDITIONS[input.edition ?? DEFAULT_J1349_EDITION];
  const dryKpa = dryAirPressureKpa(input.pressureHpa, input.airTempC, input.relativeHumidityPct ?? 0);
  return (
    a *
      (J1349_REFERENCE_DRY_PRESSURE_KPA / dryKpa) *
      Math.sqrt((input.airTempC + J1349_KELVIN_OFFSET) / (J1349_REFERENCE_TEMP_C + J1349_KELVIN_OFFSET)) -
    b
  );
}

/** Multiplier on the rated power for these air conditions: 1 / CF (1 at 25 °C, 99 kPa dry air). */
export function j1349PowerFactor(input: PowerCorrectionInput): number {
  return 1 / j1349CorrectionFactor(input);
}
