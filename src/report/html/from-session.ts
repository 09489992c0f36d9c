// The lap report's input from a whole-session comparison (compareSession): the reference it was compared
// against, the car model's envelope and, where one was fitted or given, the driver's demonstrated envelope.

import type { Ambient, Car } from '../../car/types.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { demonstratedEnvelope } from '../../car/demonstrated-envelope.js';
import type { SessionComparison } from '../../compare/compare-session.js';
import type { ReportInput } from './model.js';

/** `linePositions`: the racing line the reference drove, where it drove one (the map draws it instead of the centreline). */
export function sessionReportInput(
  comparison: SessionComparison,
  car: Car,
  ambient: Ambient,
  linePositions?: ReportInput['linePositions'],
): ReportInput {
  const demonstrated = comparison.demonstratedRecord ? demonstratedEnvelope(comparison.demonstratedRecord) : null;
  return {
    reference: comparison.reference,
    carName: car.name,
    envelope: buildEnvelope(car, ambient),
    ...(linePositions ? { linePositions } : {}),
    comparison: {
      result: comparison.result,
      driver: comparison.lap,
      ...(demonstrated ? { demonstratedEnvelope: demonstrated } : {}),
    },
  };
}
