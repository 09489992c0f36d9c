// Physical constants and unit conversions used across the project, in one place so no module writes them twice.

/** Standard gravity, m/s^2 (CGPM 1901, ISO 80000-3). */
export const STANDARD_GRAVITY_MPS2 = 9.80665;
/** Specific gas constant of dry air, J/(kg K) (ISO 2533). */
export const DRY_AIR_GAS_CONSTANT = 287.05;
export const ZERO_CELSIUS_K = 273.15;

export const kphToMps = (speedKph: number): number => speedKph / 3.6;
export const mpsToKph = (speedMps: number): number => speedMps * 3.6;
export const degToRad = (deg: number): number => (deg * Math.PI) / 180;
export const radToDeg = (rad: number): number => (rad * 180) / Math.PI;
export const gToMps2 = (g: number): number => g * STANDARD_GRAVITY_MPS2;
export const mps2ToG = (mps2: number): number => mps2 / STANDARD_GRAVITY_MPS2;

/** Lap time as m:ss.sss, the way timing screens show it. */
export function formatLapTime(timeS: number): string {
  if (!Number.isFinite(timeS)) return 'n/a';
  // The sign goes in front of the whole time: flooring a negative time would give -1:55.000 for -5 s.
  const sign = timeS < 0 ? '-' : '';
  const milliseconds = Math.round(Math.abs(timeS) * 1000);
  const minutes = Math.floor(milliseconds / 60000);
  const seconds = (milliseconds - minutes * 60000) / 1000;
  return `${sign}${minutes}:${seconds.toFixed(3).padStart(6, '0')}`;
}

/** A signed or unsigned fixed-point number for people: never "-0.0", never scientific notation. */
export function plainNumber(value: number, digits: number, signed = false): string {
  if (!Number.isFinite(value)) return 'n/a';
  const factor = 10 ** digits;
  let rounded = Math.round(Math.abs(value) * factor) / factor;
  if (rounded === 0) rounded = 0;
  const negative = value < 0 && rounded !== 0;
  const text = rounded.toFixed(digits);
  if (negative) return `-${text}`;
  return signed && rounded !== 0 ? `+${text}` : text;
}
