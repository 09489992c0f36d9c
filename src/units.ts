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
  const minutes = Math.floor(timeS / 60);
  const seconds = timeS - minutes * 60;
  return `${minutes}:${seconds.toFixed(3).padStart(6, '0')}`;
}
