// The reflap library: everything a script needs to compute a reference lap and compare a driver against it.
// This file only re-exports.

export type { TrackGrid, Path, NamedCorner } from './track/types.js';
export type { Car, Ambient, DrivenAxle, CarModelKind } from './car/types.js';
export type { Envelope } from './car/envelope.js';
export type { LapResult, LapTrace, BrakingZone } from './solve/types.js';
export type { DriverLap, TelemetrySession } from './compare/types.js';
export { InputError, isInputError } from './errors.js';
export * from './units.js';

export { ambientFrom, airDensityKgPerM3, ISA_SEA_LEVEL } from './car/ambient.js';
export { readCarFile, parseCarJson, carFromJson, validateCar } from './io/read-car.js';
export { pointMassEnvelope, totalMassKg } from './car/point-mass.js';
export { buildEnvelope } from './car/build-envelope.js';
export { gripBudget, type GripBudget } from './car/budget.js';
export { simulate, type SimulateOptions } from './solve/simulate.js';
export { findBrakingZones } from './solve/braking-zones.js';
export { traceCsv } from './report/trace-csv.js';
export { lapSummaryJson, lapSummaryText, SAFETY_CAUTION } from './report/lap-summary.js';
