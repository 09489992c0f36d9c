// The reflap library's face: the entry points a script needs, grouped by family, and their records (docs/library.md
// shows each family in use). Internals (solvers' building blocks, the worker pool, shard parsing) stay in their modules.
// This file only re-exports.

export type { TrackGrid, Path, NamedCorner } from './track/types.js';
export type { Car, Ambient, DrivenAxle, CarModelKind } from './car/types.js';
export type { Envelope } from './car/envelope.js';
export type { LapResult, LapTrace, BrakingZone, CornerZone } from './solve/types.js';
export type { DriverLap } from './compare/types.js';
export type { TelemetrySession } from './telemetry/types.js';
export { InputError, isInputError } from './errors.js';
export * from './units.js';

// Track input and geometry.
export { readTrackFile, parseTrackText } from './io/read-track.js';
export type { TrackReadOptions } from './io/track-read-options.js';
export { parseColumnMapping } from './io/columns.js';
export {
  trackFromSegments,
  CLOSURE_TOLERANCE_M,
  CLOSURE_TOLERANCE_DEG,
  type TrackSegment,
  type SegmentTrackSpec,
} from './track/segments.js';
export {
  trackFromCentreline,
  centrelinePath,
  uniformGrid,
  type CentrelinePoints,
  type CentrelineOptions,
} from './track/resample.js';
export { whittakerSmoother, smoothingLambda } from './track/smooth.js';

export { ambientFrom, airDensityKgPerM3, ISA_SEA_LEVEL } from './car/ambient.js';
export { readCarFile, parseCarJson, carFromJson } from './io/read-car.js';
export { validateCar } from './car/validate.js';
export { pointMassEnvelope, totalMassKg } from './car/point-mass.js';
export { buildEnvelope } from './car/build-envelope.js';
export { gripBudget, type GripBudget } from './car/budget.js';
export { simulate, simulateLapTime, type LapTimeResult, type SimulateOptions } from './solve/simulate.js';
export { findBrakingZones } from './solve/braking-zones.js';
export { traceCsv } from './report/trace-csv.js';
export { lapSummaryJson, lapSummaryText, SAFETY_CAUTION } from './report/lap-summary.js';
export { lapReportHtml, chartSvgs, type ChartSvg } from './report/html/page.js';
export type { ReportInput, ReportCorner } from './report/html/model.js';
export { sessionReportInput } from './report/html/from-session.js';
export { sweepReportHtml, sweepChartSvgs } from './report/sweep-page.js';
export { whatifReportHtml, whatifChartSvgs, type WhatifPageInput } from './report/sweep-whatif.js';

// Setup assumptions: what-ifs, sweeps, stints and the SAE J1349 power correction.
export {
  j1349CorrectionFactor,
  j1349PowerFactor,
  dryAirPressureKpa,
  saturationVapourPressureHpa,
  SAE_J1349_EDITIONS,
  type J1349Edition,
} from './car/power-correction.js';
export { ALL_FIELDS, CAR_FIELDS, AMBIENT_FIELDS, closestField, readCarField, writeCarField } from './sweep/fields.js';
export {
  parseSetting,
  parseVariation,
  applySetup,
  applySettings,
  variationValues,
  airInputsOf,
  setupBaseFrom,
  type Setting,
  type Variation,
  type SetupBase,
  type AirInputs,
} from './sweep/settings.js';
export { matchBrakingZones, signedLapShiftM } from './sweep/match-zones.js';
export { brakingPointM } from './sweep/braking-point.js';
export { compareSetupChange, type LapComparison, type ZoneChange } from './sweep/setup-change.js';
export { planSweep, type SweepPlan, type SweepMode, type Shard } from './sweep/plan.js';
export { runSweep, prepareSweep, type SweepInput, type SweepOutput } from './sweep/run-sweep.js';
export { stopWorkerThreads } from './sweep/threads.js';
export { sensitivities, type Sensitivity, type SweepTable, type SweepRecord, type SweepMeta } from './sweep/table.js';
export { sweepCsv, parseSweepCsv, mergeSweepCsv } from './sweep/csv.js';
export { sweepChartData, type SweepSeries } from './sweep/chart-data.js';
export { runStint, runStintInWorkers, stintFuelLoads, type StintResult, type StintLap } from './sweep/stint.js';

// The racing line.
export { racingLine, lineFromOffsets, type RacingLineOptions } from './line/racing-line.js';
export type { RacingLine, LineGeometry, LineObjective } from './line/types.js';
export {
  referenceLine,
  noWidthsNote,
  type ReferenceLine,
  type ReferenceLineOptions,
  type ReferencePathChoice,
  type ReferencePathKind,
} from './line/reference-line.js';
export { corridorOf, defaultMarginM, DEFAULT_MARGIN_M, type Corridor } from './line/corridor.js';
export { linePath, linePositions, lineCurvature, lineSegmentLengths, offsetCurvature } from './line/geometry.js';
export { minimumCurvatureOffsets } from './line/min-curvature.js';
export { minimumTimeOffsets, type MinimumTimeOptions, type MinimumTimeResult } from './line/min-time.js';
export { lineCsv, LINE_CSV_COLUMNS } from './line/line-csv.js';
export { readLineFile, parseLineCsv } from './io/read-line.js';

// Telemetry in: reading driver logs (CSV, NMEA 0183, GPX 1.1), cutting laps, alignment onto the track grid.
export {
  readTelemetryFile,
  parseTelemetryText,
  sniffTelemetryFormat,
  type TelemetryReadOptions,
  type TelemetryFormat,
} from './io/telemetry/read-telemetry.js';
export {
  streamTelemetryCsv,
  CHUNK_ROWS,
  type TelemetryChunk,
  type TelemetryStreamSummary,
  type TelemetryChannel,
  type TelemetryStreamOptions,
} from './io/telemetry/read-telemetry.js';
export { CANONICAL_COLUMNS } from './io/telemetry/columns.js';
export { nmeaChecksum } from './io/telemetry/nmea.js';
export { localPlane, projectLatLon, reprojectPlane, type GeoOrigin, type LocalPlane } from './track/geodesy.js';
export { cutLaps, type LapCut } from './compare/laps.js';
export { type CutOptions } from './compare/lap-crossings.js';
export { placeSession, MATCH_LIMIT_M, type PlacedSession } from './compare/place-session.js';
export { MIN_COVERAGE } from './compare/lap-coverage.js';
export { alignLap, selectLap, type SelectOptions } from './compare/align.js';
export { axFromSpeed, pathCurvature, speedFromPositions } from './compare/derive.js';
export {
  projectPath,
  projectGlobal,
  fitRigidToCentreline,
  applyRigid,
  type PathProjection,
  type PointProjection,
  type RigidTransform,
} from './track/project.js';

// The bicycle model: axle-limited envelope, understeer and steering, transient check.
export { bicycleEnvelope, type BicycleEnvelope } from './car/bicycle-envelope.js';
export { bicycleParams, bicycleMissingFields, type BicycleParams } from './car/bicycle-params.js';
export { longitudinalLoadTransferN, lateralLoadTransferN } from './car/load-transfer.js';
export {
  understeerGradientRadPerMps2,
  understeerGradientDegPerG,
  steadyStateSteerRad,
  characteristicSpeedMps,
  criticalSpeedMps,
  yawRateGainPerS,
} from './car/understeer.js';
export { describeCar, type CarDescription } from './car/describe.js';
export { steeringTraceDeg, criticalSpeedWarning } from './solve/steering.js';
export { checkTransient, type TransientCheck, type TransientOptions, type SaturationZone } from './solve/transient.js';

// The comparison of a driver's lap with the reference: corners, delta, findings, the demonstrated envelope, the demo driver.
export type { ComparisonResult, CornerComparison, Finding, GripStretch } from './compare/types.js';
export { compareLaps } from './compare/compare-laps.js';
export { DEFAULT_COMPARE_OPTIONS, type CompareOptions } from './compare/compare-options.js';
export { estimatedPedal } from './compare/estimated-pedal.js';
export {
  compareSession,
  envelopeSamplesOf,
  type CompareSessionOptions,
  type SessionComparison,
} from './compare/compare-session.js';
export {
  detectCorners,
  DEFAULT_CORNER_OPTIONS,
  type CornerSpan,
  type CornerDetectionOptions,
  type CornerMarker,
} from './track/corners.js';
// One corner identity per track: corners and sectors every command numbers alike, and corners files.
export {
  cornerLayoutOf,
  withCornerLayout,
  cornerLabel,
  zoneLabel,
  sectorAt,
  type CornerLayout,
  type TrackSector,
} from './track/corner-layout.js';
export { cornerLayoutFromSpec, CORNERS_FORMAT, type CornerSpec } from './track/corner-spec.js';
export { readCornersFile, parseCornersText } from './io/read-corners.js';
// The road in three dimensions: heights, grade, bank and vertical curvature on the grid.
export { roadProfileOf, type RoadProfile } from './track/road-profile.js';
export { cornersFileJson, cornersText } from './report/corners-file.js';
export { timeDeltaS, clockAt, distanceAsTimeS } from './compare/delta.js';
// Lap against lap: the driver's lap set against a second lap and the reference, corner by corner.
export { lapAgainstLap, lapLabel, type AgainstResult, type AgainstOptions } from './compare/against/lap-against-lap.js';
export { otherLapOf, type OtherLapOptions } from './compare/against/other-lap.js';
export { pairCorners, stretchTimesLostS, type CornerPair, type PairOptions } from './compare/against/corner-pair.js';
export { lapCornerFigures, type LapCornerFigures } from './compare/against/lap-corner.js';
export { pairLapOfDriver, pairLapOfReference, type PairLap } from './compare/against/pair-lap.js';
export {
  rankAgainstFindings,
  againstFinding,
  DEFAULT_AGAINST_FINDING_OPTIONS,
  type AgainstFinding,
  type Difference,
  type AgainstCorner,
  type AgainstFindingOptions,
} from './compare/against/against-findings.js';
export { againstSummaryText, againstJson } from './report/against-summary.js';
// The session: every lap with sector times, the corners across the laps, the session best and the four answers.
export {
  sessionOverview,
  type SessionOverview,
  type SessionLap,
  type SessionCorner,
  type SessionInputs,
} from './compare/session/session-overview.js';
export {
  cornerVerdicts,
  DEFAULT_VERDICT_OPTIONS,
  type CornerVerdict,
  type VerdictOptions,
} from './compare/session/corner-verdicts.js';
export { sectorTimesS } from './compare/session/lap-sectors.js';
export { sessionText, sessionJson } from './report/session-summary.js';
// The driver's line: lateral offset from positions, per-corner turn-in, apex and exit, with the resolution stated.
export {
  driverLine,
  type DriverLineResult,
  type DriverLineInputs,
  type CornerLineComparison,
  type LineFinding,
} from './compare/driver-line/driver-line.js';
export { cornerLine, type CornerLine } from './compare/driver-line/corner-line.js';
export { lateralOffsetM, smoothedOffset } from './compare/driver-line/lateral-offset.js';
export { driverPath, type DriverPath, type DriverPathFixes } from './compare/driver-line/driver-path.js';
export { lineSummaryText, lineJson } from './report/line-summary.js';
export {
  rankFindings,
  cornerFinding,
  cornerClaims,
  DEFAULT_FINDING_OPTIONS,
  type FindingOptions,
  type Claim,
  type ClaimKind,
} from './compare/findings.js';
export { findingText, claimText } from './report/finding-phrases.js';
export { noteText } from './report/note-text.js';
export { displayUnits, type DisplayUnits, type UnitSystem } from './report/units.js';
export { note, distanceOf, distanceRangeOf, speedsOf, densityOf, metricNoteText } from './note.js';
export type { Note, NoteQuantity, PhrasedNote } from './note.js';
export { againstFindingText, differenceText } from './report/against-phrases.js';
export { lineFindingText, lineNotes } from './report/line-phrases.js';
export {
  fitEnvelope,
  DEFAULT_ENVELOPE_FIT,
  type EnvelopeFitOptions,
  type EnvelopeSamples,
} from './compare/envelope-fit.js';
export {
  demonstratedEnvelope,
  type DemonstratedEnvelopeRecord,
  type EnvelopeBand,
} from './car/demonstrated-envelope.js';
export { readEnvelopeFile, parseEnvelopeJson } from './io/read-envelope.js';
export {
  demoDriver,
  demoDriverLap,
  demoDriverPath,
  demoDriverReference,
  demoLogCsv,
  DEFAULT_DEMO_LOG,
  type DemoDriverLap,
  type DemoFault,
} from './demo/demo-driver.js';
export { compareSummaryText, compareSummaryJson } from './report/compare-summary.js';
export { alignedTracesCsv } from './report/aligned-traces-csv.js';

// Validation that lists every problem in car, track and telemetry files (`reflap check`).
export { checkFiles, checkText, MAX_PROBLEMS_PER_FILE, type CheckReport, type FileCheck } from './check/check-files.js';
export { detectKind, type FileKind } from './check/detect-kind.js';

// The car from a driver's own log, and answers that carry the car file's uncertainty.
export type { CarUncertainty } from './car/types.js';
export { calibrationSamples, type CalibrationSamples } from './calibrate/samples.js';
export { lateralPath, MAX_PATH_AY_NOISE_MPS2, type LateralPathSummary } from './calibrate/lateral-path.js';
export {
  calibrateCar,
  CALIBRATED_FIELDS,
  type CalibrationResult,
  type FittedValue,
  type KeptValue,
} from './calibrate/calibrate-car.js';
export { fitDrive, type DriveFit } from './calibrate/power-fit.js';
export { fitGrip, type GripFit } from './calibrate/grip-fit.js';
export { identifiability, type Identifiability } from './calibrate/identify.js';
export { carFileJson, carFileObject } from './report/car-file.js';
export {
  drawParameters,
  applyDraw,
  DEFAULT_DRAWS,
  DEFAULT_DRAW_SEED,
  type ParameterDraws,
} from './uncertainty/draws.js';
export {
  uncertainReference,
  uncertainComparison,
  type UncertainReference,
  type UncertainFinding,
  type UncertainCorner,
  type Band,
} from './uncertainty/uncertain-reference.js';
export { uncertaintyJson, robustFindingsText, uncertainReferenceText } from './report/uncertainty-summary.js';
export { calibrationText, calibrationJson } from './report/calibration-summary.js';
