// A brake channel logged as line pressure (bar, psi, kPa) is pressure, not a pedal share: braking is detected
// from the pressure over the session's own high quantile (the 99th percentile, so that a single spike does not
// set the scale; the project's one quantile definition, numeric/quantile.ts), and the pressure itself is kept
// beside it for the aligned output.

import { quantileSorted } from '../../numeric/quantile.js';

/** The quantile of the pressure that counts as full braking. Common practice, no source: high enough to be the driver's hard stops, low enough to skip a spike. */
export const FULL_BRAKING_QUANTILE = 0.99;

/** The brake share (0-1) of each sample and the pressure taken as full braking, Pa (0 when the log never brakes). */
export function brakeShareFromPressure(pressurePa: Float64Array): { brake: Float64Array; fullPa: number } {
  const fullPa =
    pressurePa.length > 0 ? quantileSorted(Float64Array.from(pressurePa).sort(), FULL_BRAKING_QUANTILE) : 0;
  const brake = new Float64Array(pressurePa.length);
  if (fullPa > 0) for (let i = 0; i < brake.length; i++) brake[i] = Math.min(1, Math.max(0, pressurePa[i]! / fullPa));
  return { brake, fullPa };
}

/** The note that says how a pressure column was read. */
export function brakePressureNote(header: string, fullPa: number): string {
  return fullPa > 0
    ? `column ${header} is brake pressure: braking read as its share of ${(fullPa / 1e5).toFixed(1)} bar (the session's 99th percentile); the pressure is kept in the aligned traces`
    : `column ${header} is brake pressure but never rises above 0; no braking read from it`;
}
