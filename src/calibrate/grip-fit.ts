// Tyre grip (muLat, muLong), downforce (liftAreaM2) and tyre load sensitivity from the g-g-v boundary a log
// demonstrates. Each sample where the tyres, not the engine, set the limit is a point (v, ax, ay); the car's
// envelope gives the boundary's radius in that point's direction at that speed (the sample's tyre acceleration
// over its grip use), and the parameters are those of the stochastic frontier through the cloud (./frontier.ts).
// The envelope is the point-mass one (Brayshaw and Harrison 2005) whatever model the car file names: it is smooth in
// its parameters and quick to build, where the bicycle model's axle limits switch between axles and are tabulated.
// Parameters the log says nothing about, or cannot tell apart (./identify.ts), keep the base car's values.

import type { Ambient, Car } from '../car/types.js';
import { pointMassEnvelope } from '../car/point-mass.js';
import { driveForceTable } from '../car/drive-force.js';
import { totalMassKg } from '../car/point-mass.js';
import { readCarField, writeCarField } from '../sweep/fields.js';
import { quantileSorted } from '../numeric/quantile.js';
import { timeBlocks, type CalibrationSamples } from './samples.js';
import { fitFrontier, residualJacobian, type FrontierProblem } from './frontier.js';
import { crossProduct, formatIndex, identifiability, type Identifiability } from './identify.js';
import { withUnlimitedDrive } from './drive-scale.js';
import { USEFUL_SD } from './limits.js';

/** The fields the grip fit may estimate, in the order they are kept when two cannot be told apart. */
export const GRIP_FIELDS = ['tyre.muLat', 'tyre.muLong', 'aero.liftAreaM2', 'tyre.loadSensitivity'] as const;
/** No fitted grip below this: a smaller one is no tyre. */
const MIN_GRIP = 0.05;
export type GripField = (typeof GRIP_FIELDS)[number];

/** Typical sizes, for the finite differences and the conditioning. */
const SCALES: Record<GripField, number> = {
  'tyre.muLat': 1,
  'tyre.muLong': 1,
  'aero.liftAreaM2': 1,
  'tyre.loadSensitivity': 0.1,
};

export interface GripFitOptions {
  minSpeedMps: number;
  /** Samples below this share of the session's near-highest grip use (its 99th percentile) are left out. */
  minShare: number;
  /** Samples whose tyre acceleration is below this are left out, m/s^2. */
  minAccelMps2: number;
  /** At most this many samples enter the fit (an even thinning of longer logs). */
  maxSamples: number;
  /** Samples further apart than this in time belong to different clusters, s. */
  clusterGapS: number;
  /** A cluster spans at most this long: about the time over which a log's errors stay correlated (./covariance.ts), s. */
  clusterSpanS: number;
}

export const DEFAULT_GRIP_FIT: GripFitOptions = {
  minSpeedMps: 5,
  minShare: 0.6,
  minAccelMps2: 2,
  maxSamples: 10000,
  clusterGapS: 0.5,
  clusterSpanS: 10,
};

export interface KeptField {
  field: GripField;
  reason: string;
}

export interface GripFit {
  fields: GripField[];
  values: number[];
  /** Covariance of the fitted values, in the order of `fields`. */
  covariance: number[][];
  kept: KeptField[];
  /** Sets of fields the log could not tell apart, with the condition index that says so. */
  notSeparable: { fields: GripField[]; conditionIndex: number }[];
  samples: number;
  clusters: number;
  noiseSdMps2: number;
  insideSdMps2: number;
  speedRangeMps: [number, number];
  notes: string[];
}

interface Selection {
  index: Int32Array;
  cluster: Int32Array;
  clusters: number;
  /** Blocks of about the noise's correlation time (2 s): the independent samples of the skewness pre-test. */
  independent: number;
}

/** Grip use of each sample on the car's tyres alone. */
function tyreShares(car: Car, ambient: Ambient, samples: CalibrationSamples, indices: ArrayLike<number>): Float64Array {
  const envelope = pointMassEnvelope(withUnlimitedDrive(car), ambient);
  const out = new Float64Array(indices.length);
  for (let k = 0; k < indices.length; k++) {
    const i = indices[k]!;
    out[k] = envelope.gripUse(samples.speedMps[i]!, samples.axMps2[i]!, samples.ayMps2[i]!);
  }
  return out;
}

function selectSamples(car: Car, ambient: Ambient, samples: CalibrationSamples, options: GripFitOptions): Selection {
  const { speedMps, axMps2, ayMps2, count } = samples;
  const envelope = pointMassEnvelope(car, ambient);
  const drive = driveForceTable(car, ambient.powerFactor);
  const massKg = totalMassKg(car);
  const candidates: number[] = [];
  for (let i = 0; i < count; i++) {
    const v = speedMps[i]!;
    const ax = axMps2[i]!;
    const ay = ayMps2[i]!;
    if (!(v >= options.minSpeedMps) || !Number.isFinite(ax) || !Number.isFinite(ay)) continue;
    const tyreAx = ax + envelope.coastDecelMps2(v);
    if (Math.hypot(tyreAx, ay) < options.minAccelMps2) continue;
    candidates.push(i);
  }
  const shares = tyreShares(car, ambient, samples, candidates);
  // A sample pushing forward may be limited by the engine, not the tyres, where the engine cannot out-pull the tyres
  // at its speed and it asks for a good share of the engine's force; such samples say nothing about the tyres. Both
  // tests stand well clear of the engine-limited samples themselves (which ask for all of it), so the noise in a
  // sample's acceleration hardly decides whether it enters.
  const unlimited = pointMassEnvelope(withUnlimitedDrive(car), ambient);
  const kept: number[] = [];
  const keptShares: number[] = [];
  candidates.forEach((i, k) => {
    const v = speedMps[i]!;
    const coast = envelope.coastDecelMps2(v);
    const tyreAx = axMps2[i]! + coast;
    const engineMps2 = drive.forceN(v) / massKg;
    if (tyreAx > 0.5 * engineMps2 && engineMps2 < 1.05 * (unlimited.accelLimitMps2(v, 0) + coast)) return;
    kept.push(i);
    keptShares.push(shares[k]!);
  });
  const sorted = Float64Array.from(keptShares).sort();
  const high = quantileSorted(sorted, 0.99);
  const chosen = kept.filter((_, k) => keptShares[k]! >= options.minShare * high);
  const stride = Math.max(1, Math.ceil(chosen.length / options.maxSamples));
  const index = Int32Array.from(chosen.filter((_, k) => k % stride === 0));
  const { cluster, clusters } = timeBlocks(samples, index, options.clusterGapS, options.clusterSpanS);
  const independent = timeBlocks(samples, index, options.clusterGapS, 2).clusters;
  return { index, cluster, clusters, independent };
}

function carWith(base: Car, fields: readonly GripField[], values: ArrayLike<number>): Car {
  let car = base;
  fields.forEach((field, k) => (car = writeCarField(car, field, values[k]!, 'calibration')));
  return car;
}

function problemFor(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  selection: Selection,
  fields: readonly GripField[],
): FrontierProblem {
  const unlimited = withUnlimitedDrive(base);
  const { index } = selection;
  const derived = samples.derivedChannels.includes('ayMps2') || samples.derivedChannels.includes('axMps2');
  return {
    count: index.length,
    cluster: selection.cluster,
    clusters: selection.clusters,
    independent: selection.independent,
    serialCorrelation: derived,
    // Smoothing a derived channel blurs every corner's entry and exit: the samples there fall inside the boundary
    // although the car was on it, which the skewness pre-test cannot tell from a driver below the limit. On 16
    // synthetic GPS-only logs of a car driven on its limit the one-sided term entered in half of them and put the grip
    // 5-7 % high (docs/calibrate.md); held out, the grip came out within 1 %.
    insideTerm: !derived,
    scales: Float64Array.from(fields, (field) => SCALES[field]),
    residuals(theta, out) {
      // A grip at or below nothing is no tyre (and the friction ellipse, squared, cannot tell its sign): such a step
      // is made to look infinitely bad, so the line search steps back from it.
      if (fields.some((field, k) => (field === 'tyre.muLat' || field === 'tyre.muLong') && !(theta[k]! > MIN_GRIP))) {
        out.fill(1e6);
        return;
      }
      const envelope = pointMassEnvelope(carWith(unlimited, fields, theta), ambient);
      for (let k = 0; k < index.length; k++) {
        const i = index[k]!;
        const v = samples.speedMps[i]!;
        const ax = samples.axMps2[i]!;
        const ay = samples.ayMps2[i]!;
        const radius = Math.hypot(ax + envelope.coastDecelMps2(v), ay);
        const share = envelope.gripUse(v, ax, ay);
        // Distance of the sample from the boundary along its own direction: radius - radius / share.
        out[k] = share > 0 ? radius - radius / share : 0;
      }
    },
  };
}

/** The fields left after dropping, for one diagnosis, those without information or the last of the worst entangled
 * set (kept as given); null when the diagnosis is clean. */
function dropFor(
  diagnosis: Identifiability,
  active: readonly GripField[],
  kept: KeptField[],
  notSeparable: GripFit['notSeparable'],
): GripField[] | null {
  if (diagnosis.uninformed.length > 0) {
    for (const k of diagnosis.uninformed)
      kept.push({ field: active[k]!, reason: 'the log holds no information on it' });
    return active.filter((_, k) => !diagnosis.uninformed.includes(k));
  }
  const worst = diagnosis.entanglements[0];
  if (!worst) return null;
  const involved = worst.parameters.map((k) => active[k]!);
  notSeparable.push({ fields: involved, conditionIndex: worst.conditionIndex });
  // Keep the field that matters most to a lap (the order of GRIP_FIELDS); the last one involved stays as given.
  const drop = involved[involved.length - 1]!;
  kept.push({
    field: drop,
    reason: `cannot be separated from ${involved.filter((f) => f !== drop).join(' and ')} in this log (condition index ${formatIndex(worst.conditionIndex)})`,
  });
  return active.filter((field) => field !== drop);
}

function diagnose(jacobian: Float64Array, p: number, rows: number): Identifiability {
  return identifiability(crossProduct(jacobian, p, rows));
}

/** Drops, one at a time, the fields the log has no information on or cannot separate, judged at `at`. */
function separableFields(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  selection: Selection,
  fields: GripField[],
  kept: KeptField[],
  notSeparable: GripFit['notSeparable'],
  at: (fields: readonly GripField[]) => Float64Array,
): GripField[] {
  let active = [...fields];
  while (active.length > 0) {
    const problem = problemFor(base, ambient, samples, selection, active);
    const jacobian = new Float64Array(problem.count * active.length);
    residualJacobian(problem, at(active), jacobian);
    const next = dropFor(diagnose(jacobian, active.length, problem.count), active, kept, notSeparable);
    if (!next) break;
    active = next;
  }
  return active;
}

/** The fit, repeated once with the samples chosen for the car as first fitted (which samples the tyres limit depends
 * on the grip being fitted); given `chooser`, one fit with the samples chosen for that car. */
export function fitGrip(
  base: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  options: GripFitOptions = DEFAULT_GRIP_FIT,
  chooser?: Car,
): GripFit {
  if (chooser) return fitGripOnce(base, chooser, ambient, samples, options);
  const first = fitGripOnce(base, base, ambient, samples, options);
  if (first.fields.length === 0) return first;
  let refined = base;
  first.fields.forEach((field, k) => (refined = writeCarField(refined, field, first.values[k]!, 'calibration')));
  return fitGripOnce(base, refined, ambient, samples, options);
}

function fitGripOnce(
  base: Car,
  chooser: Car,
  ambient: Ambient,
  samples: CalibrationSamples,
  options: GripFitOptions,
): GripFit {
  const notes: string[] = [];
  const selection = selectSamples(chooser, ambient, samples, options);
  const kept: KeptField[] = [];
  const notSeparable: GripFit['notSeparable'] = [];
  if (selection.index.length < 50) {
    for (const field of GRIP_FIELDS)
      kept.push({
        field,
        reason: `too few samples near the limit (${selection.index.length}; at least 50 are needed)`,
      });
    return emptyFit(kept, notSeparable, selection, notes);
  }
  // Start: the base car with its grip scaled so that the session's near-highest grip use sits on the boundary.
  const shares = tyreShares(base, ambient, samples, selection.index);
  const high = quantileSorted(Float64Array.from(shares).sort(), 0.95);
  const start = new Map<GripField, number>(GRIP_FIELDS.map((field) => [field, readCarField(base, field) ?? 0]));
  start.set('tyre.muLat', start.get('tyre.muLat')! * high);
  start.set('tyre.muLong', start.get('tyre.muLong')! * high);
  const at = (fields: readonly GripField[]) => Float64Array.from(fields, (field) => start.get(field)!);

  let active = separableFields(base, ambient, samples, selection, [...GRIP_FIELDS], kept, notSeparable, at);
  while (active.length > 0) {
    const fit = fitFrontier(problemFor(base, ambient, samples, selection, active), at(active));
    if (!fit.converged) notes.push(`the grip fit stopped after ${fit.iterations} steps without converging`);
    // A field the log hardly constrains is left as given, and the rest fitted again without it.
    const vague = active.filter((field, k) => !(Math.sqrt(fit.covariance.get(k, k)) <= (USEFUL_SD[field] ?? Infinity)));
    active.forEach((field, k) => start.set(field, fit.theta[k]!));
    // The diagnosis again at the answer: the sensitivities of a nonlinear model change with the parameters.
    const narrowed = dropFor(diagnose(fit.jacobian, active.length, selection.index.length), active, kept, notSeparable);
    if (narrowed) {
      active = narrowed;
      continue;
    }
    if (vague.length === 0) {
      const values = Array.from(fit.theta);
      let lo = Infinity;
      let hi = -Infinity;
      for (const i of selection.index) {
        lo = Math.min(lo, samples.speedMps[i]!);
        hi = Math.max(hi, samples.speedMps[i]!);
      }
      return {
        fields: active,
        values,
        covariance: fit.covariance.to2DArray(),
        kept,
        notSeparable,
        samples: selection.index.length,
        clusters: selection.clusters,
        noiseSdMps2: fit.sigmaV,
        insideSdMps2: fit.sigmaU,
        speedRangeMps: [lo, hi],
        notes,
      };
    }
    // Drop the vaguest one (relative to its useful precision) and fit the rest again.
    const ratio = (field: GripField) =>
      Math.sqrt(fit.covariance.get(active.indexOf(field), active.indexOf(field))) / USEFUL_SD[field]!;
    const drop = vague.reduce((a, b) => (ratio(b) > ratio(a) ? b : a));
    kept.push({
      field: drop,
      reason: `too loosely determined by this log (standard error ${formatSd(Math.sqrt(fit.covariance.get(active.indexOf(drop), active.indexOf(drop))))})`,
    });
    active = active.filter((field) => field !== drop);
  }
  return emptyFit(kept, notSeparable, selection, notes);
}

const formatSd = (value: number) => (Number.isFinite(value) ? value.toPrecision(2) : 'unbounded');

function emptyFit(
  kept: KeptField[],
  notSeparable: GripFit['notSeparable'],
  selection: Selection,
  notes: string[],
): GripFit {
  return {
    fields: [],
    values: [],
    covariance: [],
    kept,
    notSeparable,
    samples: selection.index.length,
    clusters: selection.clusters,
    noiseSdMps2: NaN,
    insideSdMps2: NaN,
    speedRangeMps: [NaN, NaN],
    notes,
  };
}
