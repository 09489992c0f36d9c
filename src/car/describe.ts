// What a car file amounts to, for `reflap car`: static axle loads, the understeer gradient with its
// characteristic or critical speed (Gillespie, Fundamentals of Vehicle Dynamics, SAE 1992, ch. 6), and the
// envelope's limits at a few speeds.

import type { Ambient, Car } from './types.js';
import type { Envelope } from './envelope.js';
import { buildEnvelope } from './build-envelope.js';
import { totalMassKg } from './point-mass.js';
import {
  characteristicSpeedMps,
  criticalSpeedMps,
  linearAxlesOf,
  understeerGradientDegPerG,
  understeerGradientRadPerMps2,
} from './understeer.js';
import { bicycleEnvelope, type BicycleEnvelope } from './bicycle-envelope.js';
import { kphToMps, mps2ToG, mpsToKph } from '../units.js';

export type SteerCharacter = 'understeer' | 'neutral' | 'oversteer';

export interface EnvelopeRow {
  speedKph: number;
  lateralG: number;
  accelG: number;
  brakeG: number;
  /** The axle that saturates first in steady cornering (bicycle model only). */
  lateralLimitingAxle: 'front' | 'rear' | null;
}

export interface CarDescription {
  name: string;
  model: string;
  totalMassKg: number;
  staticFrontAxleKg: number;
  staticRearAxleKg: number;
  frontWeightFraction: number;
  /** Null where the car file gives no wheelbase or cornering stiffnesses. */
  understeerGradientDegPerG: number | null;
  steer: SteerCharacter | null;
  characteristicSpeedKph: number | null;
  criticalSpeedKph: number | null;
  topSpeedKph: number;
  envelope: EnvelopeRow[];
}

function isBicycleEnvelope(envelope: Envelope): envelope is BicycleEnvelope {
  return typeof (envelope as Partial<BicycleEnvelope>).lateralLimitingAxle === 'function';
}

const TABLE_SPEEDS_KPH = [40, 80, 120, 160, 200, 240, 280, 320];

export function describeCar(
  car: Car,
  ambient: Ambient,
  envelope: Envelope = buildEnvelope(car, ambient),
): CarDescription {
  const massKg = totalMassKg(car);
  const axles = linearAxlesOf(car);
  const gradient = axles ? understeerGradientRadPerMps2(axles) : null;
  const bicycle =
    car.model === 'bicycle' ? (isBicycleEnvelope(envelope) ? envelope : bicycleEnvelope(car, ambient)) : null;
  const topSpeedKph = mpsToKph(envelope.topSpeedMps);
  const speeds = TABLE_SPEEDS_KPH.filter((kph) => kph < topSpeedKph);
  const rows = speeds.map((speedKph): EnvelopeRow => {
    const v = kphToMps(speedKph);
    return {
      speedKph,
      lateralG: mps2ToG(envelope.lateralLimitMps2(v, 1)),
      accelG: mps2ToG(envelope.accelLimitMps2(v, 0)),
      brakeG: mps2ToG(envelope.brakeLimitMps2(v, 0)),
      lateralLimitingAxle: bicycle ? bicycle.lateralLimitingAxle(v) : null,
    };
  });
  const characteristic = axles && gradient !== null ? characteristicSpeedMps(axles.wheelbaseM, gradient) : null;
  const critical = axles && gradient !== null ? criticalSpeedMps(axles.wheelbaseM, gradient) : null;
  return {
    name: car.name,
    model: car.model,
    totalMassKg: massKg,
    staticFrontAxleKg: massKg * car.frontWeightFraction,
    staticRearAxleKg: massKg * (1 - car.frontWeightFraction),
    frontWeightFraction: car.frontWeightFraction,
    understeerGradientDegPerG: axles ? understeerGradientDegPerG(axles) : null,
    steer: gradient === null ? null : gradient > 0 ? 'understeer' : gradient < 0 ? 'oversteer' : 'neutral',
    characteristicSpeedKph: characteristic === null ? null : mpsToKph(characteristic),
    criticalSpeedKph: critical === null ? null : mpsToKph(critical),
    topSpeedKph,
    envelope: rows,
  };
}
