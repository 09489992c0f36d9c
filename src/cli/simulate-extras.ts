// The bicycle-model additions to `reflap simulate`: the steering column, the transient check and the stability
// warning, gathered for the command.

import type { Ambient, Car } from '../car/types.js';
import type { LapResult } from '../solve/types.js';
import type { ExtraColumn } from '../report/trace-csv.js';
import { canTraceSteering, criticalSpeedWarning, steeringTraceDeg } from '../solve/steering.js';
import { checkTransient } from '../solve/transient.js';
import { transientJson, transientSummaryText } from '../report/transient-summary.js';
import { noteText } from '../report/note-text.js';
import type { DisplayUnits } from '../report/units.js';

/** The bicycle-model additions to `reflap simulate`: the steering column, the transient check, the stability warning. */
/** `lineOffsetM`: the racing line's offsets when the reference drove one, so the check measures the room to the edges from the line. */
export function bicycleSimulateExtras(
  result: LapResult,
  car: Car,
  ambient: Ambient,
  withTransient: boolean,
  units: DisplayUnits,
  lineOffsetM?: Float64Array,
): { columns: ExtraColumn[]; text: string; json: Record<string, unknown> } {
  const columns: ExtraColumn[] = [];
  if (canTraceSteering(car)) columns.push({ name: 'steering_deg', values: steeringTraceDeg(result, car), digits: 3 });
  const warning = criticalSpeedWarning(result, car);
  let text = warning ? `Warning: ${noteText(warning, units)}\n` : '';
  const json: Record<string, unknown> = { warnings: warning ? [noteText(warning)] : [] };
  if (withTransient) {
    const check = checkTransient(result, car, { ambient, ...(lineOffsetM ? { pathOffsetM: lineOffsetM } : {}) });
    columns.push(
      { name: 'transient_error_m', values: check.lateralErrorM, digits: 3 },
      { name: 'transient_speed_mps', values: check.followedSpeedMps, digits: 3 },
    );
    text += transientSummaryText(check, units);
    json.transient = transientJson(check);
  }
  return { columns, text, json };
}
