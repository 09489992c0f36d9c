// Settings of the comparison of a driver's lap with the reference (the corners are the track's own, from
// track/corner-layout.ts, so every command numbers them alike): findings, pedal and
// grip-use thresholds, and the lap times behind the two gaps (driver to demonstrated envelope to car model).

import { DEFAULT_FINDING_OPTIONS, type FindingOptions } from './findings.js';

export interface CompareOptions {
  findings: FindingOptions;
  /** Pedal share above which a pedal counts as pressed (coasting = neither pressed), 0-1. */
  pedalThreshold: number;
  /** Grip use below which the driver leaves grip unused while the reference is on the limit. */
  unusedBelow: number;
  /** Grip use above which the driver exceeds the envelope. */
  exceededAbove: number;
  /** Reference grip use from which it counts as on the limit. */
  referenceOnLimit: number;
  /** Shortest stretch of unused or exceeded grip worth reporting, m. */
  minStretchM: number;
  /** Lap time on the driver's demonstrated envelope, and on the car model, when known (for the two gaps). */
  demonstratedLapTimeS: number | null;
  carModelLapTimeS: number | null;
  referenceEnvelopeKind: string;
}

export const DEFAULT_COMPARE_OPTIONS: CompareOptions = {
  findings: DEFAULT_FINDING_OPTIONS,
  pedalThreshold: 0.05,
  unusedBelow: 0.85,
  exceededAbove: 1.05,
  referenceOnLimit: 0.95,
  minStretchM: 8,
  demonstratedLapTimeS: null,
  carModelLapTimeS: null,
  referenceEnvelopeKind: 'car model',
};
