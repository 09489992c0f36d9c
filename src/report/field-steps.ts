// Setup fields as a person reads them: a name in words with its unit, and the step a driver or engineer thinks in
// (per 10 kg, per 1 % of grip, per 1 °C, per 0.1 m^2), so sensitivities are printed per that step rather than per
// raw unit. The steps are common practice in setup work, chosen here; no source.

import { plainNumber } from './units.js';

interface FieldStep {
  /** The field in words, e.g. 'mass'. */
  label: string;
  /** An absolute step in the field's unit, or a relative one in % of the baseline value. */
  step: { absolute: number } | { percentOfBaseline: number };
}

const FIELD_STEPS: Readonly<Record<string, FieldStep>> = {
  massKg: { label: 'mass', step: { absolute: 10 } },
  frontWeightFraction: { label: 'front weight share', step: { absolute: 0.01 } },
  cgHeightM: { label: 'centre of gravity height', step: { absolute: 0.01 } },
  wheelbaseM: { label: 'wheelbase', step: { absolute: 0.01 } },
  widthM: { label: 'car width', step: { absolute: 0.01 } },
  trackFrontM: { label: 'front track', step: { absolute: 0.01 } },
  trackRearM: { label: 'rear track', step: { absolute: 0.01 } },
  rollStiffnessFrontFraction: { label: 'front roll stiffness share', step: { absolute: 0.01 } },
  rollingResistanceCoeff: { label: 'rolling resistance', step: { absolute: 0.001 } },
  'tyre.muLong': { label: 'longitudinal grip', step: { percentOfBaseline: 1 } },
  'tyre.muLat': { label: 'lateral grip', step: { percentOfBaseline: 1 } },
  'tyre.ggExponent': { label: 'g-g exponent', step: { absolute: 0.1 } },
  'tyre.loadSensitivity': { label: 'tyre load sensitivity', step: { percentOfBaseline: 10 } },
  'tyre.corneringStiffnessFrontNPerRad': { label: 'front cornering stiffness', step: { percentOfBaseline: 1 } },
  'tyre.corneringStiffnessRearNPerRad': { label: 'rear cornering stiffness', step: { percentOfBaseline: 1 } },
  'aero.dragAreaM2': { label: 'drag area', step: { absolute: 0.1 } },
  'aero.liftAreaM2': { label: 'downforce area', step: { absolute: 0.1 } },
  'aero.frontDownforceFraction': { label: 'front downforce share', step: { absolute: 0.01 } },
  'powertrain.maxPowerW': { label: 'engine power', step: { absolute: 10_000 } },
  'powertrain.gearing.finalDrive': { label: 'final drive ratio', step: { absolute: 0.1 } },
  'powertrain.gearing.wheelRadiusM': { label: 'wheel radius', step: { absolute: 0.01 } },
  'powertrain.gearing.shiftTimeS': { label: 'shift time', step: { absolute: 0.01 } },
  'powertrain.gearing.drivetrainEfficiency': { label: 'drivetrain efficiency', step: { absolute: 0.01 } },
  'powertrain.gearing.maxRpm': { label: 'rev limit', step: { absolute: 100 } },
  'brakes.maxDecelG': { label: 'brake limit', step: { absolute: 0.1 } },
  'brakes.frontBias': { label: 'front brake bias', step: { absolute: 0.01 } },
  'fuel.massKg': { label: 'fuel', step: { absolute: 10 } },
  'fuel.burnKgPerLap': { label: 'fuel burn', step: { absolute: 0.1 } },
  airTempC: { label: 'air temperature', step: { absolute: 1 } },
  pressureHpa: { label: 'air pressure', step: { absolute: 10 } },
};

/** 'mass (massKg), kg': the field in words, its key, and its unit; the key alone for a field we do not know. */
export function readableField(field: string, unit: string | undefined): string {
  const label = FIELD_STEPS[field]?.label;
  const named = label ? `${label} (${field})` : field;
  return unit && unit !== '1' ? `${named}, ${unit}` : named;
}

/** Shorter form for axis titles: 'mass, kg'. */
export function fieldAxisTitle(field: string, unit: string | undefined): string {
  const label = FIELD_STEPS[field]?.label ?? field;
  return unit && unit !== '1' ? `${label}, ${unit}` : label;
}

export interface UserStep {
  /** The step in the field's unit. */
  size: number;
  /** How the step reads in a header: '10 kg', '1 % (0.013)', '0.1 m^2'. */
  text: string;
}

/** Step digits enough to show it whole (0.001 -> 3), never scientific notation. */
function stepDigits(size: number): number {
  for (let digits = 0; digits < 12; digits++)
    if (Math.abs(Math.round(size * 10 ** digits) - size * 10 ** digits) < 1e-9) return digits;
  return 12;
}

/** The step a person thinks in for this field, around its baseline value. */
export function userStep(field: string, unit: string | undefined, baselineValue: number): UserStep {
  const known = FIELD_STEPS[field]?.step ?? { absolute: 1 };
  const unitText = unit && unit !== '1' ? ` ${unit}` : '';
  if ('absolute' in known) {
    if (field === 'powertrain.maxPowerW') return { size: known.absolute, text: '10 kW' };
    return { size: known.absolute, text: `${plainNumber(known.absolute, stepDigits(known.absolute))}${unitText}` };
  }
  const size = (Math.abs(baselineValue) * known.percentOfBaseline) / 100;
  if (!(size > 0)) return { size: 1, text: `1${unitText}` };
  const shown = Number(size.toPrecision(2));
  return {
    size,
    text: `${known.percentOfBaseline} % (${plainNumber(shown, stepDigits(shown))}${unitText})`,
  };
}
