// The plausible range of every numeric field of a car record, in one table that the car reader and the library's
// entry points both check against: wide enough for anything from a kart to a prototype, narrow enough that a
// typo of a few orders of magnitude or a value near the largest double is refused before it turns into NaN.
// Bounds are from general engineering knowledge (from memory), each with a wide margin on both sides.

export interface FieldRange {
  /** Dotted name as the car file spells it. */
  field: string;
  min: number;
  max: number;
  /** Whether the lower bound itself is allowed (false for quantities that must be strictly positive). */
  minInclusive: boolean;
  unit: string;
  /** Fields that may be null (absent from the file) are checked only when given. */
  optional: boolean;
}

const range = (field: string, min: number, max: number, unit: string, more: Partial<FieldRange> = {}): FieldRange => ({
  field,
  min,
  max,
  minInclusive: true,
  unit,
  optional: false,
  ...more,
});
const optional = { optional: true };
const aboveZero = { minInclusive: false };

/** Every numeric field of a Car, with its range. */
export const CAR_FIELD_RANGES: readonly FieldRange[] = [
  // A kart without driver is about 75 kg, a racing truck about 5,500 kg.
  range('massKg', 20, 20000, 'kg'),
  range('frontWeightFraction', 0, 1, '', aboveZero),
  range('cgHeightM', 0, 3, 'm', optional),
  range('wheelbaseM', 0.3, 10, 'm', optional),
  range('widthM', 0.3, 5, 'm', optional),
  range('trackFrontM', 0.3, 5, 'm', optional),
  range('trackRearM', 0.3, 5, 'm', optional),
  range('rollStiffnessFrontFraction', 0, 1, '', optional),
  range('rollingResistanceCoeff', 0, 0.2, ''),
  // Ice is about 0.05-0.1; racing slicks with load about 1.5-2.
  range('tyre.muLong', 0.05, 5, ''),
  range('tyre.muLat', 0.05, 5, ''),
  range('tyre.ggExponent', 1, 10, ''),
  range('tyre.loadSensitivity', 0, 1, ''),
  range('tyre.corneringStiffnessFrontNPerRad', 100, 1e7, 'N/rad', optional),
  range('tyre.corneringStiffnessRearNPerRad', 100, 1e7, 'N/rad', optional),
  range('aero.dragAreaM2', 0, 10, 'm^2'),
  range('aero.liftAreaM2', -10, 20, 'm^2'),
  range('aero.frontDownforceFraction', 0, 1, '', optional),
  // The most powerful racing cars make about 1 MW. Any positive power is allowed below (a car that only coasts
  // and brakes is a closed-form check) and far above (an engine that never limits, for grip-only checks).
  range('powertrain.maxPowerW', 0, 1e12, 'W', aboveZero),
  range('powertrain.drivetrainEfficiency', 0, 1, '', aboveZero),
  range('brakes.maxDecelG', 0.05, 10, 'g', optional),
  range('brakes.frontBias', 0, 1, '', optional),
  range('fuel.massKg', 0, 2000, 'kg'),
  range('fuel.burnKgPerLap', 0, 200, 'kg'),
];

/** Gearing, checked when the car has a gearbox model. */
export const GEARING_RANGES = {
  gearRatio: range('powertrain.gearRatios', 0.05, 50, ''),
  finalDrive: range('powertrain.finalDrive', 0.1, 50, ''),
  wheelRadiusM: range('powertrain.wheelRadiusM', 0.05, 2, 'm'),
  shiftTimeS: range('powertrain.shiftTimeS', 0, 2, 's'),
  maxRpm: range('powertrain.maxRpm', 100, 30000, 'rpm'),
  rpm: range('powertrain.torqueCurve.rpm', 1, 30000, 'rpm'),
  torqueNm: range('powertrain.torqueCurve.torqueNm', 0, 20000, 'N m'),
} as const;

/** The words a message uses for a range: "between 20 and 20000 kg", "above 0 and at most 1". */
export function rangeText(r: FieldRange): string {
  const unit = r.unit ? ` ${r.unit}` : '';
  return r.minInclusive ? `between ${r.min} and ${r.max}${unit}` : `above ${r.min} and at most ${r.max}${unit}`;
}

/** Whether a value lies in the range (a non-number never does). */
export function inRange(value: unknown, r: FieldRange): value is number {
  if (typeof value !== 'number' || !Number.isFinite(value)) return false;
  return (r.minInclusive ? value >= r.min : value > r.min) && value <= r.max;
}
