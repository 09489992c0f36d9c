// A calibration for the terminal and as JSON: each fitted value with its standard error beside the base car's,
// what was kept and why, which fields the log could not tell apart, and the fits' own figures.

import type { Car } from '../car/types.js';
import type { CalibrationResult } from '../calibrate/calibrate-car.js';
import { formatTable } from './text-table.js';
import { roundToDigits } from '../numeric/round.js';
import { displayUnits, type DisplayUnits } from './units.js';
import { noteText } from './note-text.js';
import { formatIndex } from '../calibrate/identify.js';

/** The caution of a fitted car: it speaks of the car and its limits, as the car page's does, not of a lap. */
export const FITTED_CAR_CAUTION =
  'Caution: the fitted car is a model of what one log shows, not the car on another day (tyres, temperature and ' +
  "wear change it). Driving at the limit is dangerous; follow the circuit's rules and qualified instruction.";

/** A value in the unit a reader expects: kW for power, the field's own unit otherwise. */
function shown(field: string, value: number, digits: number): string {
  if (field === 'powertrain.maxPowerW') return `${(value / 1000).toFixed(1)} kW`;
  return value.toFixed(digits);
}

/** Digits that show a value to about a tenth of its standard error. */
function digitsFor(sd: number): number {
  return sd > 0 ? Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(sd)))) : 3;
}

export function calibrationText(
  result: CalibrationResult,
  base: Car,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const { drive, grip } = result;
  const speedRange = (rangeMps: readonly [number, number]) =>
    `${units.speed(rangeMps[0]).toFixed(0)} to ${units.speed(rangeMps[1]).toFixed(0)} ${units.speedLabel}`;
  const lines = [`Calibration of ${base.name}`, ''];
  if (result.fitted.length > 0) {
    lines.push('Fitted from the log (± one standard error):');
    lines.push(
      formatTable(
        ['field', 'fitted', '± error', 'base car'],
        result.fitted.map((f) => {
          const digits = digitsFor(f.sd);
          return [
            f.field,
            shown(f.field, f.value, digits),
            shown(f.field, f.sd, digits),
            shown(f.field, f.base, digits),
          ];
        }),
      ),
    );
  }
  if (result.kept.length > 0) {
    lines.push('', 'Kept as the base car gives them:');
    for (const k of result.kept)
      lines.push(`  ${k.field} = ${shown(k.field, k.value, 3)}: ${noteText(k.reason, units)}`);
  }
  for (const set of result.notSeparable) {
    const others = set.fields.filter((field) => field !== set.kept);
    lines.push(
      '',
      `Not separable in this log: ${set.fields.join(', ')} (condition index ${formatIndex(set.conditionIndex)}); ${set.kept} kept as given, ${others.join(', ')} fitted given it.`,
    );
  }
  lines.push(
    '',
    `Full throttle: ${drive.durationS.toFixed(1)} s in ${drive.stretches} stretch${drive.stretches === 1 ? '' : 'es'}, ${speedRange(drive.speedRangeMps)}, residual ${drive.residualSdMps2.toFixed(2)} m/s²`,
  );
  if (grip.samples > 0 && Number.isFinite(grip.noiseSdMps2)) {
    lines.push(
      `Near the limit: ${grip.samples} samples in ${grip.clusters} blocks, ${speedRange(grip.speedRangeMps)}; noise ${grip.noiseSdMps2.toFixed(2)} m/s², inside the boundary ${grip.insideSdMps2.toFixed(2)} m/s²`,
    );
  }
  if (result.notes.length > 0) lines.push('', ...result.notes.map((note) => `Note: ${noteText(note, units)}`));
  lines.push(
    '',
    'The fitted car is what this log shows: a driver who stayed inside the limit fits a car with less grip than the tyres have.',
    '',
    FITTED_CAR_CAUTION,
  );
  return lines.join('\n') + '\n';
}

export function calibrationJson(result: CalibrationResult, base: Car) {
  const { drive, grip } = result;
  return {
    car: base.name,
    fitted: result.fitted.map((f) => ({ field: f.field, value: f.value, sd: f.sd, base: f.base, unit: f.unit })),
    kept: result.kept.map((k) => ({ field: k.field, value: k.value, reason: noteText(k.reason) })),
    notSeparable: result.notSeparable.map((set) => ({
      fields: set.fields,
      kept: set.kept,
      conditionIndex: Number.isFinite(set.conditionIndex) ? roundToDigits(set.conditionIndex, 1) : null,
    })),
    correlation: result.car.uncertainty?.correlation.map(({ fields, r }) => ({ fields: [...fields], r })) ?? [],
    fullThrottle: {
      stretches: drive.stretches,
      samples: drive.samples,
      durationS: roundToDigits(drive.durationS, 2),
      speedRangeMps: drive.speedRangeMps.map((v) => roundToDigits(v, 2)),
      residualSdMps2: roundToDigits(drive.residualSdMps2, 4),
    },
    nearLimit: {
      samples: grip.samples,
      blocks: grip.clusters,
      speedRangeMps: grip.speedRangeMps.map((v) => (Number.isFinite(v) ? roundToDigits(v, 2) : null)),
      noiseSdMps2: Number.isFinite(grip.noiseSdMps2) ? roundToDigits(grip.noiseSdMps2, 4) : null,
      insideSdMps2: Number.isFinite(grip.insideSdMps2) ? roundToDigits(grip.insideSdMps2, 4) : null,
    },
    lateralAcceleration: lateralJson(result),
    notes: result.notes.map((note) => noteText(note)),
  };
}

/** Where the lateral acceleration came from: the log's channel, the driver's own path or the centreline. */
function lateralJson({ lateralPath: path }: CalibrationResult) {
  if (!path) return { from: 'log' as const };
  const rounded = (value: number | null, digits: number) => (value === null ? null : roundToDigits(value, digits));
  return {
    from: path.path === 'driver' ? ('driver path' as const) : ('centreline' as const),
    positionNoiseM: rounded(path.positionNoiseM, 3),
    cutoffM: rounded(path.cutoffM, 1),
    ayNoiseMps2: rounded(path.ayNoiseMps2, 3),
    fixes: path.fixes,
    laps: path.laps,
  };
}
