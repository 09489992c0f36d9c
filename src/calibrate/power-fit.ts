// Power (a scale on the car's whole drive force, so a torque curve and its gears keep their shape) and drag area
// from the full-throttle stretches of a log, by least squares on the longitudinal equation of motion
//   m a = k F(v) - 1/2 rho CdA v^2 - Crr N(v),
// where F is the base car's drive force at that speed (P / v, or the best gear's torque force capped by P / v) and
// N the normal load with downforce. It is linear in k and CdA, so ordinary least squares solves it in one pass.
// Only samples where the drive force, not the tyres, sets the acceleration enter, and none just after a gear change.

import type { Ambient, Car } from '../car/types.js';
import { InputError } from '../errors.js';
import { buildEnvelope } from '../car/build-envelope.js';
import { driveForceTable } from '../car/drive-force.js';
import { totalMassKg } from '../car/point-mass.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';
import { note, speedsOf, type Note } from '../note.js';
import type { CalibrationSamples } from './samples.js';
import { ordinaryLeastSquares } from './linear-fit.js';
import { crossProduct, formatIndex, identifiability } from './identify.js';
import { withDriveScaled, withUnlimitedDrive } from './drive-scale.js';
import { USEFUL_SD } from './limits.js';

export interface DriveFitOptions {
  /** Throttle share from which a sample counts as full throttle, 0-1. */
  fullThrottle: number;
  /** Shortest stretch of full throttle that counts, s. */
  minStretchS: number;
  /** Samples slower than this are left out, m/s. */
  minSpeedMps: number;
  /** Samples turning harder than this are left out, m/s^2. */
  maxLateralMps2: number;
  /** Time left out after each gear change, s (on top of the car's shift time). */
  afterShiftS: number;
  /** Without a throttle channel, accelerating at least this much counts as full throttle, m/s^2. */
  minAccelWithoutThrottleMps2: number;
}

export const DEFAULT_DRIVE_FIT: DriveFitOptions = {
  fullThrottle: 0.95,
  minStretchS: 2,
  minSpeedMps: 5,
  maxLateralMps2: 4,
  afterShiftS: 0.2,
  minAccelWithoutThrottleMps2: 0.1,
};

export interface DriveFit {
  /** Multiplier on the base car's drive force. */
  driveScale: number;
  driveScaleSd: number;
  dragAreaM2: number;
  /** Null when drag was kept from the base car (not separable from power in this log). */
  dragAreaSd: number | null;
  /** Correlation of the two estimates (0 when drag was kept). */
  correlation: number;
  stretches: number;
  samples: number;
  durationS: number;
  speedRangeMps: [number, number];
  residualSdMps2: number;
  conditionIndex: number;
  notes: Note[];
}

/** How much more the tyres must be able to give than the engine for a sample to count as drive-limited. */
const DRIVE_MARGIN = 1.1;

interface Stretch {
  first: number;
  last: number;
}

/** Marks the samples where the drive force sets the acceleration, for the car as it stands. */
function fullThrottleMask(
  car: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  options: DriveFitOptions,
): Uint8Array {
  const { count, speedMps, axMps2, ayMps2, throttle, gear, timeS } = samples;
  const unlimited = buildEnvelope(withUnlimitedDrive(car), ambient);
  const drive = driveForceTable(car, ambient.powerFactor);
  const massKg = totalMassKg(car);
  const mask = new Uint8Array(count);
  const settleS = (car.powertrain.gearing?.shiftTimeS ?? 0) + options.afterShiftS;
  let lastShiftS = -Infinity;
  for (let i = 0; i < count; i++) {
    if (gear && i > 0 && gear[i] !== gear[i - 1]) lastShiftS = timeS[i]!;
    const v = speedMps[i]!;
    const ay = ayMps2[i]!;
    if (!(v >= options.minSpeedMps) || !(Math.abs(ay) <= options.maxLateralMps2) || !Number.isFinite(axMps2[i]!))
      continue;
    if (throttle ? !(throttle[i]! >= options.fullThrottle) : !(axMps2[i]! >= options.minAccelWithoutThrottleMps2))
      continue;
    if (timeS[i]! - lastShiftS < settleS) continue;
    // Drive-limited with a margin: the tyres could give a tenth more than the engine here, so that noise in the
    // lateral acceleration does not let in samples the tyres limit (they would pull the power down).
    const engineMps2 = drive.forceN(v) / massKg;
    if (unlimited.accelLimitMps2(v, ay) + unlimited.coastDecelMps2(v) < DRIVE_MARGIN * engineMps2) continue;
    mask[i] = 1;
  }
  return mask;
}

function stretchesOf(mask: Uint8Array, samples: CalibrationSamples): Stretch[] {
  const stretches: Stretch[] = [];
  const runs = samples.runStarts;
  for (let r = 0; r + 1 < runs.length; r++) {
    let first = -1;
    for (let i = runs[r]!; i <= runs[r + 1]!; i++) {
      const on = i < runs[r + 1]! && mask[i] === 1;
      if (on && first < 0) first = i;
      if (!on && first >= 0) {
        stretches.push({ first, last: i - 1 });
        first = -1;
      }
    }
  }
  return stretches;
}

const durationOf = (stretch: Stretch, timeS: Float64Array) => timeS[stretch.last]! - timeS[stretch.first]!;

/** The fit for a car whose drive force is already scaled by `scale` (the iteration's current estimate). */
function fitOnce(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  scale: number,
  options: DriveFitOptions,
): DriveFit {
  const car = withDriveScaled(base, scale);
  const mask = fullThrottleMask(car, ambient, samples, options);
  const all = stretchesOf(mask, samples);
  const stretches = all.filter((stretch) => durationOf(stretch, samples.timeS) >= options.minStretchS);
  if (stretches.length === 0) {
    const longest = all.reduce((best, stretch) => Math.max(best, durationOf(stretch, samples.timeS)), 0);
    throw new InputError(
      `${samples.source}: no full-throttle stretch long enough to fit power and drag: at least one of ${options.minStretchS} s in a straight line is needed (the longest found is ${longest.toFixed(1)} s)`,
    );
  }
  const massKg = totalMassKg(base);
  const weightN = massKg * STANDARD_GRAVITY_MPS2;
  const halfRho = 0.5 * ambient.airDensityKgPerM3;
  const drive = driveForceTable(base, ambient.powerFactor);
  // Only the stretches' samples, packed; each stretch is one cluster of the sandwich (./covariance.ts): along a
  // straight the errors share a wind, a slope, a sensor's drift.
  let n = 0;
  for (const stretch of stretches) n += stretch.last - stretch.first + 1;
  const cluster = new Int32Array(n);
  const design = new Float64Array(2 * n);
  const y = new Float64Array(n);
  let lo = Infinity;
  let hi = -Infinity;
  let k = 0;
  stretches.forEach((stretch, g) => {
    for (let i = stretch.first; i <= stretch.last; i++, k++) {
      const v = samples.speedMps[i]!;
      const loadN = Math.max(0.1 * weightN, weightN + halfRho * base.aero.liftAreaM2 * v * v);
      cluster[k] = g;
      design[2 * k] = drive.forceN(v);
      design[2 * k + 1] = -halfRho * v * v;
      y[k] = massKg * samples.axMps2[i]! + base.rollingResistanceCoeff * loadN;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  });
  const notes: Note[] = [];
  // Power and drag are told apart by how the force falls with speed: over a narrow speed range they are not.
  const diagnosis = identifiability(crossProduct(design, 2, n));
  const dragSeparable = diagnosis.entanglements.length === 0 && diagnosis.uninformed.length === 0;
  let fit = dragSeparable ? trimmedFit(design, y, 2, cluster, stretches.length) : null;
  const dragSd = fit ? Math.sqrt(fit.covariance.get(1, 1)) : Infinity;
  let dragAreaM2: number;
  if (fit && dragSd <= USEFUL_SD['aero.dragAreaM2']!) {
    dragAreaM2 = fit.coefficients[1]!;
  } else {
    dragAreaM2 = base.aero.dragAreaM2;
    const single = new Float64Array(n);
    const adjusted = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      single[i] = design[2 * i]!;
      adjusted[i] = y[i]! - dragAreaM2 * design[2 * i + 1]!;
    }
    notes.push(
      fit
        ? `drag is too loosely determined by this log (standard error ${dragSd.toPrecision(2)} m²): kept from the base car, power fitted given it`
        : note`power and drag cannot be separated from this log (full throttle only between ${speedsOf([lo, hi], ' and ')}, condition index ${formatIndex(diagnosis.conditionNumber)}): drag kept from the base car, power fitted given it`,
    );
    fit = trimmedFit(single, adjusted, 1, cluster, stretches.length);
  }
  const cov = fit.covariance;
  const dragFitted = cov.rows === 2;
  const dragAreaSd = dragFitted ? Math.sqrt(cov.get(1, 1)) : null;
  let durationS = 0;
  for (const stretch of stretches) durationS += durationOf(stretch, samples.timeS);
  return {
    driveScale: fit.coefficients[0]!,
    driveScaleSd: Math.sqrt(cov.get(0, 0)),
    dragAreaM2,
    dragAreaSd,
    correlation: dragFitted ? cov.get(0, 1) / Math.sqrt(cov.get(0, 0) * cov.get(1, 1)) : 0,
    stretches: stretches.length,
    samples: fit.count,
    durationS,
    speedRangeMps: [lo, hi],
    residualSdMps2: fit.residualSd / massKg,
    conditionIndex: diagnosis.conditionNumber,
    notes,
  };
}

/** Least squares, then once more without the samples beyond 3.5 robust standard deviations (a missed shift, a lift). */
function trimmedFit(design: Float64Array, y: Float64Array, p: number, cluster: Int32Array, clusters: number) {
  const first = ordinaryLeastSquares(design, y, p, cluster, clusters);
  const absolute = new Float64Array(y.length);
  let count = 0;
  for (let i = 0; i < y.length; i++) if (cluster[i]! >= 0) absolute[count++] = Math.abs(first.residuals[i]!);
  const sorted = absolute.subarray(0, count).sort();
  // 1.4826 times the median absolute residual estimates the standard deviation of normal residuals (Hampel 1974).
  const robustSd = 1.4826 * sorted[count >> 1]!;
  const kept = Int32Array.from(cluster);
  let dropped = 0;
  for (let i = 0; i < y.length; i++) {
    if (kept[i]! >= 0 && Math.abs(first.residuals[i]!) > 3.5 * robustSd) {
      kept[i] = -1;
      dropped++;
    }
  }
  return dropped > 0 ? ordinaryLeastSquares(design, y, p, kept, clusters) : first;
}

/** The fit, repeated once with the drive force it found, so the drive-limited samples are chosen for the car as fitted. */
export function fitDrive(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  options: DriveFitOptions = DEFAULT_DRIVE_FIT,
): DriveFit {
  const first = fitOnce(base, ambient, samples, 1, options);
  return fitOnce(base, ambient, samples, first.driveScale, options);
}
