// Axle by axle, what a single-track car's tyres can carry at one instant: normal loads from weight, aero
// balance and load transfer, each tyre's load-sensitive friction, and the steady-cornering lateral demand on
// each axle from the moment balance Fyf = m ay b / L, Fyr = m ay a / L (Gillespie, SAE 1992, ch. 6).

import type { Car } from './types.js';
import type { BicycleParams } from './bicycle-params.js';
import { loadSensitiveMu } from './point-mass.js';
import { lateralLoadTransferN, longitudinalLoadTransferN } from './load-transfer.js';

export interface AxleState {
  frontLoadN: number;
  rearLoadN: number;
  /** Peak lateral and longitudinal force each axle's two tyres can give at these loads, N. */
  frontLatCapN: number;
  rearLatCapN: number;
  frontLongCapN: number;
  rearLongCapN: number;
  /** Lateral force each axle must give for steady cornering at this ay, N (magnitude). */
  frontLatDemandN: number;
  rearLatDemandN: number;
}

export const newAxleState = (): AxleState => ({
  frontLoadN: 0,
  rearLoadN: 0,
  frontLatCapN: 0,
  rearLatCapN: 0,
  frontLongCapN: 0,
  rearLongCapN: 0,
  frontLatDemandN: 0,
  rearLatDemandN: 0,
});

/**
 * Sum over the axle's two tyres of (mu(Fz) / mu0) Fz: the axle's friction capacity per unit of friction coefficient.
 * The inner tyre lifts when the transfer exceeds half the axle load; the outer then carries it all.
 */
export function frictionLoadN(
  axleLoadN: number,
  transferN: number,
  staticTyreLoadN: number,
  sensitivity: number,
): number {
  const half = 0.5 * axleLoadN;
  const moved = Math.min(Math.abs(transferN), half);
  const outer = half + moved;
  const inner = half - moved;
  if (sensitivity === 0) return axleLoadN;
  return (
    loadSensitiveMu(1, outer, staticTyreLoadN, sensitivity) * outer +
    loadSensitiveMu(1, inner, staticTyreLoadN, sensitivity) * inner
  );
}

/** Fills `out` with the axle loads, capacities and cornering demands at this downforce, ax and ay. */
export function axleState(
  p: BicycleParams,
  tyre: Car['tyre'],
  downforceN: number,
  axMps2: number,
  ayMps2: number,
  out: AxleState,
  roadLoadN = 0,
): AxleState {
  // roadLoadN: the normal force a slope, bank or crest adds to the weight (negative when it takes some away),
  // acting at the centre of gravity and so split like the weight.
  const weightN = p.weightN + roadLoadN;
  const shiftN = longitudinalLoadTransferN(p.massKg, axMps2, p.cgHeightM, p.wheelbaseM);
  const frontLoadN = Math.max(0, weightN * p.frontWeightFraction + downforceN * p.frontDownforceFraction - shiftN);
  const rearLoadN = Math.max(
    0,
    weightN * (1 - p.frontWeightFraction) + downforceN * (1 - p.frontDownforceFraction) + shiftN,
  );
  const frontTransferN = lateralLoadTransferN(
    p.massKg,
    ayMps2,
    p.cgHeightM,
    p.trackFrontM,
    p.rollStiffnessFrontFraction,
  );
  const rearTransferN = lateralLoadTransferN(
    p.massKg,
    ayMps2,
    p.cgHeightM,
    p.trackRearM,
    1 - p.rollStiffnessFrontFraction,
  );
  const frontFrictionN = frictionLoadN(frontLoadN, frontTransferN, p.staticTyreLoadFrontN, tyre.loadSensitivity);
  const rearFrictionN = frictionLoadN(rearLoadN, rearTransferN, p.staticTyreLoadRearN, tyre.loadSensitivity);
  const lateralN = p.massKg * Math.abs(ayMps2);
  out.frontLoadN = frontLoadN;
  out.rearLoadN = rearLoadN;
  out.frontLatCapN = tyre.muLat * frontFrictionN;
  out.rearLatCapN = tyre.muLat * rearFrictionN;
  out.frontLongCapN = tyre.muLong * frontFrictionN;
  out.rearLongCapN = tyre.muLong * rearFrictionN;
  out.frontLatDemandN = (lateralN * p.cgToRearAxleM) / p.wheelbaseM;
  out.rearLatDemandN = (lateralN * p.frontAxleToCgM) / p.wheelbaseM;
  return out;
}
