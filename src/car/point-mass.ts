// Point-mass g-g-v envelope (Brayshaw and Harrison, Proc. IMechE Part D 219 (2005)): normal load m g plus
// downforce 1/2 rho ClA v^2, lateral capacity muLat N, longitudinal capacity muLong on the driven axle's load when
// accelerating and on all wheels when braking, the power limit, drag and rolling resistance, and the two combined
// by the friction ellipse |ax/axMax|^n + |ay/ayMax|^n = 1 with n = tyre.ggExponent.

import { largestHolding } from '../numeric/bisect.js';
import type { Ambient, Car } from './types.js';
import type { Envelope } from './envelope.js';
import { driveForceTable } from './drive-force.js';
import { STANDARD_GRAVITY_MPS2 } from '../units.js';

/** Mass the physics uses: the car with driver plus its fuel. */
export const totalMassKg = (car: Car): number => car.massKg + car.fuel.massKg;

/** x^p for x >= 0 (0 and Infinity included) as exp(p ln x): the same to a few units in the last place as Math.pow,
 * at about half its cost in the solver's hot loops, where the friction ellipse's exponent is rarely 2. */
const powerOf = (x: number, p: number): number => Math.exp(p * Math.log(x));

/** Share of the tyre budget left for the other direction when `used` of it (0-1) is taken, on the super-ellipse. */
export function remainingShare(used: number, exponent: number): number {
  if (used >= 1) return 0;
  if (used <= 0) return 1;
  if (exponent === 2) return Math.sqrt(1 - used * used);
  return powerOf(1 - powerOf(used, exponent), 1 / exponent);
}

/** Combined use of a super-ellipse budget by two shares. */
export function combinedShare(longShare: number, latShare: number, exponent: number): number {
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
  return big * powerOf(1 + powerOf(small / big, exponent), 1 / exponent);
}

/** Friction coefficient under load: falls linearly with the load above the static load (tyre load sensitivity). */
export function loadSensitiveMu(mu: number, loadN: number, staticLoadN: number, sensitivity: number): number {
  if (sensitivity === 0) return mu;
  return mu * Math.max(0.2, 1 - (sensitivity * (loadN - staticLoadN)) / staticLoadN);
}

/** Share of the normal load on the driven wheels at this downforce (static split plus aero balance). */
function drivenLoadN(car: Car, weightN: number, downforceN: number): number {
  if (car.powertrain.drive === 'all') return weightN + downforceN;
  const frontAero = car.aero.frontDownforceFraction ?? car.frontWeightFraction;
  const front = weightN * car.frontWeightFraction + downforceN * frontAero;
  return car.powertrain.drive === 'front' ? front : weightN + downforceN - front;
}

/** Top speed where the net forward acceleration at zero lateral demand reaches zero, by bisection. */
export function topSpeedOf(
  accelLimitMps2: (speedMps: number, lateralMps2: number) => number,
  ceilingMps = 250,
): number {
  if (accelLimitMps2(ceilingMps, 0) > 0) return ceilingMps;
  return largestHolding((speedMps) => accelLimitMps2(speedMps, 0) > 0, 0.5, ceilingMps, 60);
}

export function pointMassEnvelope(car: Car, ambient: Ambient): Envelope {
  const massKg = totalMassKg(car);
  const weightN = massKg * STANDARD_GRAVITY_MPS2;
  const halfRho = 0.5 * ambient.airDensityKgPerM3;
  const exponent = car.tyre.ggExponent;
  const sensitivity = car.tyre.loadSensitivity;
  const brakeCapMps2 = car.brakes.maxDecelG === null ? Infinity : car.brakes.maxDecelG * STANDARD_GRAVITY_MPS2;
  const drive = driveForceTable(car, ambient.powerFactor);
  const liftN = halfRho * car.aero.liftAreaM2;
  const dragN = halfRho * car.aero.dragAreaM2;
  const rolling = car.rollingResistanceCoeff;
  const muLat = car.tyre.muLat;
  const muLong = car.tyre.muLong;

  // The solver calls these several times per grid point, so each computes the normal load once and the friction
  // coefficients from it, in the same order of operations as the formulas in the module header.
  // The road's load (loadFactor x weight) replaces the weight in every normal force; load sensitivity is still
  // counted from the static weight, so a compression loads the tyres and lowers their mu, as on a flat road.
  const normalLoadN = (speedMps: number, load = 1) =>
    Math.max(0.1 * weightN, weightN * load + liftN * speedMps * speedMps);
  const muAt = (mu: number, loadN: number) =>
    sensitivity === 0 ? mu : loadSensitiveMu(mu, loadN, weightN, sensitivity);
  const coastOf = (speedMps: number, loadN: number) => (dragN * speedMps * speedMps + rolling * loadN) / massKg;
  const coastDecelMps2 = (speedMps: number, load = 1) => coastOf(speedMps, normalLoadN(speedMps, load));
  const lateralLimitMps2 = (speedMps: number, _side?: number, load = 1) => {
    const loadN = normalLoadN(speedMps, load);
    return (muAt(muLat, loadN) * loadN) / massKg;
  };
  const tractionOf = (loadN: number, load: number) =>
    (muAt(muLong, loadN) * drivenLoadN(car, weightN * load, loadN - weightN * load)) / massKg;
  const tyreBrakeOf = (loadN: number) => Math.min(brakeCapMps2, (muAt(muLong, loadN) * loadN) / massKg);
  const leftFor = (lateralMps2: number, loadN: number) =>
    remainingShare(Math.abs(lateralMps2) / ((muAt(muLat, loadN) * loadN) / massKg), exponent);

  const accelLimitMps2 = (speedMps: number, lateralMps2: number, load = 1) => {
    const loadN = normalLoadN(speedMps, load);
    const tyre = tractionOf(loadN, load) * leftFor(lateralMps2, loadN);
    return Math.min(tyre, drive.forceN(speedMps) / massKg) - coastOf(speedMps, loadN);
  };

  // Corner speed in closed form. With x = v^2, a load factor l0 + l1 x and a lateral demand d0 + d1 x (both linear
  // in x on flat and three-dimensional roads alike), the normal load N = W (l0 + l1 x) + L x is linear in x and the
  // lateral limit muLat (1 - s (N - W) / W) N / m is a concave quadratic in x, so each side of |demand| <= limit is
  // a concave quadratic >= 0 and the limit is the lower of their positive roots, each taken in the form that does
  // not cancel. Outside the load and mu floors the solver searches instead.
  const lateralPerN = muLat / massKg;
  const upperRoot = (a: number, b: number, c: number): number => {
    if (!(c > 0)) return NaN;
    const root = Math.sqrt(b * b - 4 * a * c);
    if (b < 0) return (2 * c) / (root - b);
    return a < 0 ? (b + root) / (-2 * a) : Infinity;
  };
  const cornerSpeedSquaredEstimate = (load0: number, loadPerV2: number, demand0: number, demandPerV2: number) => {
    const n0 = weightN * load0;
    const n1 = weightN * loadPerV2 + liftN;
    const shrink = sensitivity / weightN;
    const a = -lateralPerN * shrink * n1 * n1;
    const b = lateralPerN * ((1 + sensitivity) * n1 - 2 * shrink * n0 * n1);
    const c = lateralPerN * ((1 + sensitivity) * n0 - shrink * n0 * n0);
    const x = Math.min(upperRoot(a, b - demandPerV2, c - demand0), upperRoot(a, b + demandPerV2, c + demand0));
    if (!(x >= 0) || (loadPerV2 < 0 && load0 + loadPerV2 * x <= 0)) return null;
    // The load floor and the mu floor (linear in x) must hold over [0, x].
    return withinFloors(n0) && withinFloors(n0 + n1 * x) ? x : null;
  };
  const withinFloors = (loadN: number) =>
    loadN >= 0.1 * weightN && (sensitivity === 0 || 1 - (sensitivity * (loadN - weightN)) / weightN >= 0.2);

  return {
    kind: 'point-mass',
    topSpeedMps: topSpeedOf(accelLimitMps2),
    lateralLimitMps2,
    cornerSpeedSquaredEstimate,
    accelLimitMps2,
    brakeLimitMps2(speedMps, lateralMps2, load = 1) {
      const loadN = normalLoadN(speedMps, load);
      return tyreBrakeOf(loadN) * leftFor(lateralMps2, loadN) + coastOf(speedMps, loadN);
    },
    coastDecelMps2,
    gripUse(speedMps, axMps2, ayMps2) {
      // The tyres' share of their friction ellipse only: being held back by the engine is not grip in use.
      const loadN = normalLoadN(speedMps);
      const tyreAx = axMps2 + coastOf(speedMps, loadN);
      const lateralShare = ayMps2 / ((muAt(muLat, loadN) * loadN) / massKg);
      if (tyreAx < 0) return combinedShare(tyreAx / tyreBrakeOf(loadN), lateralShare, exponent);
      return combinedShare(tyreAx / tractionOf(loadN, 1), lateralShare, exponent);
    },
    driveLimitMps2: (speedMps) => drive.forceN(speedMps) / massKg,
    gearAt: drive.gearAt,
  };
}
