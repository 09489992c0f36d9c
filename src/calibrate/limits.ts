// What a fitted value may be before it is refused as unphysical, and how loosely a log may fix a value before the
// base car's value is kept instead. Bounds are generous on purpose: they catch a fit that has gone wrong (negative
// drag, a grip no tyre gives), not a car that is merely unusual.

/** Lowest and highest value a fit may return, with the unit for messages (from memory: road tyres reach about
 * mu 1, racing slicks about 1.8, aerodynamic load can add the rest; drag areas of cars run 0.3 to 1.5 m^2). */
export const PHYSICAL_BOUNDS: Readonly<Record<string, { min: number; max: number; unit: string }>> = {
  'tyre.muLat': { min: 0.3, max: 3, unit: '' },
  'tyre.muLong': { min: 0.3, max: 3, unit: '' },
  'aero.liftAreaM2': { min: -3, max: 8, unit: ' m²' },
  'tyre.loadSensitivity': { min: 0, max: 1, unit: '' },
  'aero.dragAreaM2': { min: 0.05, max: 3, unit: ' m²' },
  'powertrain.maxPowerW': { min: 1000, max: 1.5e6, unit: ' W' },
};

/** A standard error above this leaves the field as the base car gives it: the log hardly constrains it (common
 * practice, no source: about a tenth of a plausible range of the field; power as a share of its value). */
export const USEFUL_SD: Readonly<Record<string, number>> = {
  'tyre.muLat': 0.15,
  'tyre.muLong': 0.15,
  'aero.liftAreaM2': 1,
  'tyre.loadSensitivity': 0.1,
  'aero.dragAreaM2': 0.3,
};

/** Power is judged by its relative standard error. */
export const USEFUL_RELATIVE_POWER_SD = 0.25;

/** The message for a value outside its bounds, or null. */
export function outOfBounds(field: string, value: number): string | null {
  const bounds = PHYSICAL_BOUNDS[field];
  if (!bounds) return null;
  if (Number.isFinite(value) && value >= bounds.min && value <= bounds.max) return null;
  const shown = Number.isFinite(value) ? Number(value.toPrecision(4)) : value;
  return `${field} = ${shown}${bounds.unit} is outside physical bounds (${bounds.min} to ${bounds.max}${bounds.unit})`;
}
