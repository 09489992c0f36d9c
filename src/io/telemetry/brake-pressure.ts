// A brake channel logged as line pressure (bar, psi, kPa) is pressure, not a pedal share: braking is detected
// from the pressure over the session's own high quantile (the 99th percentile, so that a single spike does not
// set the scale), and the pressure itself is kept beside it for the aligned output.

/** The quantile of the pressure that counts as full braking. Common practice, no source: high enough to be the driver's hard stops, low enough to skip a spike. */
export const FULL_BRAKING_QUANTILE = 0.99;

/** The brake share (0-1) of each sample and the pressure taken as full braking, Pa (0 when the log never brakes). */
export function brakeShareFromPressure(pressurePa: Float64Array): { brake: Float64Array; fullPa: number } {
  const sorted = Float64Array.from(pressurePa).sort();
  const fullPa = sorted.length > 0 ? sorted[Math.floor(FULL_BRAKING_QUANTILE * (sorted.length - 1))]! : 0;
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
