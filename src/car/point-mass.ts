// Point-mass g-g-v envelope (Brayshaw and Harrison, Proc. IMechE Part D 219 (2005)): normal load m g plus
// downforce 1/2 rho ClA v^2, lateral capacity muLat N, longitudinal capacity muLong on the driven axle's load when
// accelerating and on all wheels when braking, the power limit, drag and rolling resistance, and the two combined
// by the friction ellipse |ax/axMax|^n + |ay/ayMax|^n = 1 with n = tyre.ggExponent.

import { largestHolding } from '../numeric/bisect.js';
import type { Ambient, Car } from './types.js';
import type { Envelope } from './envelope.js';
import { driveForceTable, type DriveForceTable } from './drive-force.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';

/** Mass the physics uses: the car with driver plus its fuel. */
export const totalMassKg = (car: Car): number => car.massKg + car.fuel.massKg;

// Powers x^p (x >= 0, 0 and Infinity included) are taken as exp(p ln x), written out: the same to a few units in the
// last place as Math.pow at about half its cost in the solver's hot loops, where the exponent is rarely 2. Exponent 2
// takes the exact square root instead.

/** Share of the tyre budget left for the other direction when `used` of it (0-1) is taken, on the super-ellipse;
 * `inverse` is 1 / exponent, which a caller in a hot loop computes once. */
export function remainingShare(used: number, exponent: number, inverse = 1 / exponent): number {
  if (used >= 1) return 0;
  if (used <= 0) return 1;
  if (exponent === 2) return Math.sqrt(1 - used * used);
  return Math.exp(inverse * Math.log(1 - Math.exp(exponent * Math.log(used))));
}

/** A bound on the share left, lowered by this factor, is safely below the share as computed (surelyWithinShare). */
const SHARE_MARGIN = 1 - 1e-12;

/**
 * Whether `amount` <= `capacity` x remainingShare(used, exponent) is sure without computing the share's powers: with
 * exponent n >= 1 and u <= 1/2 the share left (1 - u^n)^(1/n) is at least 1 - u^n, so at least 1 - u, and it is
 * computed to a few units in the last place there (no cancellation: 1 - u^n >= 1/2), which SHARE_MARGIN covers many
 * times over. False where the bound does not settle it (the share must then be computed).
 */
export function surelyWithinShare(amount: number, capacity: number, used: number, exponent: number): boolean {
  return capacity >= 0 && exponent >= 1 && used <= 0.5 && amount <= capacity * (1 - used) * SHARE_MARGIN;
}

/** Combined use of a super-ellipse budget by two shares. */
export function combinedShare(longShare: number, latShare: number, exponent: number, inverse = 1 / exponent): number {
  const a = Math.abs(longShare);
  const b = Math.abs(latShare);
  if (exponent === 2) return Math.sqrt(a * a + b * b);
  // One share alone is its own combination (a straight, or a steady corner at constant speed).
  if (b === 0) return a;
  if (a === 0) return b;
  // (a^n + b^n)^(1/n) = big (1 + (small/big)^n)^(1/n): two powers instead of three, and no overflow.
  const big = a > b ? a : b;
  const small = a > b ? b : a;
  if (big === Infinity) return Infinity;
  return big * Math.exp(inverse * Math.log(1 + Math.exp(exponent * Math.log(small / big))));
}

/** Friction coefficient under load: falls linearly with the load above the static load (tyre load sensitivity). */
export function loadSensitiveMu(mu: number, loadN: number, staticLoadN: number, sensitivity: number): number {
  if (sensitivity === 0) return mu;
  return mu * Math.max(0.2, 1 - (sensitivity * (loadN - staticLoadN)) / staticLoadN);
}

/** Which wheels drive, as a number the limits branch on: all four, the front axle or the rear axle. */
const DRIVEN = { all: 0, front: 1, rear: 2 } as const;
const ALL_DRIVEN = DRIVEN.all;
const FRONT_DRIVEN = DRIVEN.front;

/** Top speed where the net forward acceleration at zero lateral demand reaches zero, by bisection. */
export function topSpeedOf(
  accelLimitMps2: (speedMps: number, lateralMps2: number) => number,
  ceilingMps = 250,
): number {
  if (accelLimitMps2(ceilingMps, 0) > 0) return ceilingMps;
  return largestHolding((speedMps) => accelLimitMps2(speedMps, 0) > 0, 0.5, ceilingMps, 60);
}

/**
 * The point mass's limits, computed from numbers fixed per car. One class for every car: the solver calls these
 * several times per grid point, and one layout with one set of methods keeps those calls monomorphic and inlined
 * whichever cars ran before in the process (a sweep, a library user). Each limit computes the normal load once and
 * the friction coefficients from it, in the same order of operations as the formulas in the module header. The
 * road's load (loadFactor x weight) replaces the weight in every normal force; load sensitivity is still counted
 * from the static weight, so a compression loads the tyres and lowers their mu, as on a flat road.
 */
class PointMassEnvelope implements Envelope {
  readonly kind = 'point-mass';
  readonly topSpeedMps: number;
  private readonly massKg: number;
  private readonly weightN: number;
  private readonly liftN: number;
  private readonly dragN: number;
  private readonly rolling: number;
  private readonly muLat: number;
  private readonly muLong: number;
  private readonly sensitivity: number;
  private readonly exponent: number;
  private readonly inverseExponent: number;
  private readonly brakeCapMps2: number;
  private readonly driven: number;
  private readonly frontWeightFraction: number;
  private readonly frontAeroFraction: number;
  private readonly drive: DriveForceTable;

  constructor(car: Car, ambient: Ambient) {
    this.massKg = totalMassKg(car);
    this.weightN = this.massKg * STANDARD_GRAVITY_MPS2;
    const halfRho = 0.5 * ambient.airDensityKgPerM3;
    this.liftN = halfRho * car.aero.liftAreaM2;
    this.dragN = halfRho * car.aero.dragAreaM2;
    this.rolling = car.rollingResistanceCoeff;
    this.muLat = car.tyre.muLat;
    this.muLong = car.tyre.muLong;
    this.sensitivity = car.tyre.loadSensitivity;
    this.exponent = car.tyre.ggExponent;
    this.inverseExponent = 1 / this.exponent;
    this.brakeCapMps2 = car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2;
    this.driven = DRIVEN[car.powertrain.drive];
    this.frontWeightFraction = car.frontWeightFraction;
    this.frontAeroFraction = car.aero.frontDownforceFraction ?? car.frontWeightFraction;
    this.drive = driveForceTable(car, ambient.powerFactor);
    this.topSpeedMps = topSpeedOf((speedMps, lateralMps2) => this.accelLimitMps2(speedMps, lateralMps2));
  }

  // The limits below are written in few operations (ternaries for min and max): V8 inlines them into the solver's
  // loops only while their bytecode stays within its budget, and a call per limit per sample costs more than the
  // limit itself.

  private normalLoadN(speedMps: number, load: number): number {
    const floorN = 0.1 * this.weightN;
    const loadN = this.weightN * load + this.liftN * speedMps * speedMps;
    return loadN > floorN ? loadN : floorN;
  }

  /** mu under this load as a share of mu (loadSensitiveMu's factor), once for both directions. */
  private muShareAt(loadN: number): number {
    return loadSensitiveMu(1, loadN, this.weightN, this.sensitivity);
  }

  private lateralCapOf(loadN: number, muShare: number): number {
    return (this.muLat * muShare * loadN) / this.massKg;
  }

  private coastOf(speedMps: number, loadN: number): number {
    return (this.dragN * speedMps * speedMps + this.rolling * loadN) / this.massKg;
  }

  /** Normal load on the driven wheels, N: the static split of the weight plus the aero balance of the downforce. */
  private drivenLoadN(weightN: number, downforceN: number): number {
    if (this.driven === ALL_DRIVEN) return weightN + downforceN;
    const front = weightN * this.frontWeightFraction + downforceN * this.frontAeroFraction;
    return this.driven === FRONT_DRIVEN ? front : weightN + downforceN - front;
  }

  private tractionOf(loadN: number, load: number, muShare: number): number {
    const weightN = this.weightN * load;
    return (this.muLong * muShare * this.drivenLoadN(weightN, loadN - weightN)) / this.massKg;
  }

  private tyreBrakeOf(loadN: number, muShare: number): number {
    const tyreMps2 = (this.muLong * muShare * loadN) / this.massKg;
    return tyreMps2 < this.brakeCapMps2 ? tyreMps2 : this.brakeCapMps2;
  }

  /** Share of the lateral capacity this demand uses. */
  private lateralShareOf(lateralMps2: number, loadN: number, muShare: number): number {
    // Running straight asks nothing sideways (the lateral capacity is positive: muLat > 0 and a floored load): no
    // share, without its two divisions.
    return lateralMps2 === 0 ? 0 : Math.abs(lateralMps2) / this.lateralCapOf(loadN, muShare);
  }

  private leftFor(lateralShare: number): number {
    return remainingShare(lateralShare, this.exponent, this.inverseExponent);
  }

  lateralLimitMps2(speedMps: number, _side?: number, load = 1): number {
    const loadN = this.normalLoadN(speedMps, load);
    return this.lateralCapOf(loadN, this.muShareAt(loadN));
  }

  accelLimitMps2(speedMps: number, lateralMps2: number, load = 1): number {
    const loadN = this.normalLoadN(speedMps, load);
    const muShare = this.muShareAt(loadN);
    const traction = this.tractionOf(loadN, load, muShare);
    const engine = this.drive.forceN(speedMps) / this.massKg;
    const used = this.lateralShareOf(lateralMps2, loadN, muShare);
    // Where the engine surely gives no more than the tyres can beside the cornering, the lower of the two is the
    // engine's to the last bit without the ellipse's powers: most of a lap at speed on a real circuit, whose
    // curvature is never quite zero.
    const tyre = surelyWithinShare(engine, traction, used, this.exponent) ? engine : traction * this.leftFor(used);
    return (tyre < engine ? tyre : engine) - this.coastOf(speedMps, loadN);
  }

  brakeLimitMps2(speedMps: number, lateralMps2: number, load = 1): number {
    const loadN = this.normalLoadN(speedMps, load);
    const muShare = this.muShareAt(loadN);
    const left = this.leftFor(this.lateralShareOf(lateralMps2, loadN, muShare));
    return this.tyreBrakeOf(loadN, muShare) * left + this.coastOf(speedMps, loadN);
  }

  coastDecelMps2(speedMps: number, load = 1): number {
    return this.coastOf(speedMps, this.normalLoadN(speedMps, load));
  }

  gripUse(speedMps: number, axMps2: number, ayMps2: number): number {
    // The tyres' share of their friction ellipse only: being held back by the engine is not grip in use.
    const loadN = this.normalLoadN(speedMps, 1);
    const tyreAx = axMps2 + this.coastOf(speedMps, loadN);
    const muShare = this.muShareAt(loadN);
    const lateralShare = ayMps2 / this.lateralCapOf(loadN, muShare);
    const longShare = tyreAx / (tyreAx < 0 ? this.tyreBrakeOf(loadN, muShare) : this.tractionOf(loadN, 1, muShare));
    return combinedShare(longShare, lateralShare, this.exponent, this.inverseExponent);
  }

  driveLimitMps2(speedMps: number): number {
    return this.drive.forceN(speedMps) / this.massKg;
  }

  gearAt(speedMps: number): number {
    return this.drive.gearAt(speedMps);
  }

  /**
   * Corner speed in closed form. With x = v^2, a load factor l0 + l1 x and a lateral demand d0 + d1 x (both linear
   * in x on flat and three-dimensional roads alike), the normal load N = W (l0 + l1 x) + L x is linear in x and the
   * lateral limit muLat (1 - s (N - W) / W) N / m is a concave quadratic in x, so each side of |demand| <= limit is
   * a concave quadratic >= 0 and the limit is the lower of their positive roots, each taken in the form that does
   * not cancel. Outside the load and mu floors the solver searches instead.
   */
  cornerSpeedSquaredEstimate(load0: number, loadPerV2: number, demand0: number, demandPerV2: number): number | null {
    const { weightN, sensitivity } = this;
    const lateralPerN = this.muLat / this.massKg;
    const n0 = weightN * load0;
    const n1 = weightN * loadPerV2 + this.liftN;
    const shrink = sensitivity / weightN;
    const a = -lateralPerN * shrink * n1 * n1;
    const b = lateralPerN * ((1 + sensitivity) * n1 - 2 * shrink * n0 * n1);
    const c = lateralPerN * ((1 + sensitivity) * n0 - shrink * n0 * n0);
    const x = Math.min(upperRoot(a, b - demandPerV2, c - demand0), upperRoot(a, b + demandPerV2, c + demand0));
    if (!(x >= 0) || (loadPerV2 < 0 && load0 + loadPerV2 * x <= 0)) return null;
    // The load floor and the mu floor (linear in x) must hold over [0, x].
    return this.withinFloors(n0) && this.withinFloors(n0 + n1 * x) ? x : null;
  }

  private withinFloors(loadN: number): boolean {
    const { weightN, sensitivity } = this;
    return loadN >= 0.1 * weightN && (sensitivity === 0 || 1 - (sensitivity * (loadN - weightN)) / weightN >= 0.2);
  }
}

/** The larger root of a x^2 + b x + c (a <= 0, c > 0) in the form that does not cancel; NaN unless c > 0. */
function upperRoot(a: number, b: number, c: number): number {
  if (!(c > 0)) return NaN;
  const root = Math.sqrt(b * b - 4 * a * c);
  if (b < 0) return (2 * c) / (root - b);
  return a < 0 ? (b + root) / (-2 * a) : Infinity;
}

export function pointMassEnvelope(car: Car, ambient: Ambient): Envelope {
  return new PointMassEnvelope(car, ambient);
}
