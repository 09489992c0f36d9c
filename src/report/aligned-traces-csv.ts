// The two laps of a comparison aligned on the track's grid as a CSV a person reads (aligned.csv of `compare --out`
// and the demo): one row per station, each column's unit in its name, in the chosen units.

import type { ComparisonResult, DriverLap } from '../compare/types.js';
import type { LapResult } from '../solve/types.js';
import { mpsToKph } from '../units.js';
import { columnsInUnits, csvText, type CsvColumn } from './csv-columns.js';
import { displayUnits, type DisplayUnits } from './units.js';

/** A second lap for the aligned traces (`compare --against`): its channels and the driver's delta to it. */
export interface AlignedOtherLap {
  lap: DriverLap;
  /** Driver minus other lap at each station, s. */
  driverDeltaS: Float64Array;
}

const of = (name: string, values: ArrayLike<number> | null | undefined, digits: number): CsvColumn => ({
  name,
  value: values ? (i) => values[i]! : () => NaN,
  digits,
});
const kph = (name: string, speedMps: ArrayLike<number>): CsvColumn => ({
  name,
  value: (i) => mpsToKph(speedMps[i]!),
  digits: 2,
});

/** Both laps on the track grid, one row per station, with the delta and both grip uses; the other lap of
 * `--against`, where there is one, in columns of its own after them. */
export function alignedTracesCsv(
  result: ComparisonResult,
  reference: LapResult,
  driver: DriverLap,
  other: AlignedOtherLap | null = null,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const t = reference.trace;
  const columns: CsvColumn[] = [
    of('station_m', t.stationM, 2),
    of('time_driver_s', driver.timeS, 4),
    of('time_reference_s', t.timeS, 4),
    of('delta_s', result.deltaS, 4),
    kph('speed_driver_kph', driver.speedMps),
    kph('speed_reference_kph', t.speedMps),
    of('throttle_driver', driver.throttle, 3),
    of('throttle_reference', t.throttle, 3),
    of('brake_driver', driver.brake, 3),
    of('brake_reference', t.brake, 3),
    of('ax_driver_mps2', driver.axMps2, 3),
    of('ax_reference_mps2', t.axMps2, 3),
    of('ay_driver_mps2', driver.ayMps2, 3),
    of('ay_reference_mps2', t.ayMps2, 3),
    of('grip_use_driver', result.driverGripUse, 3),
    of('grip_use_reference', t.gripUse, 3),
    of('power_limited_reference', t.powerLimited, 0),
    of('shift_reference', t.shift, 0),
  ];
  // The logged brake pressure, where the log gave pressure instead of a pedal share.
  const pressurePa = driver.brakePressurePa ?? null;
  if (pressurePa) columns.push({ name: 'brake_pressure_driver_bar', value: (i) => pressurePa[i]! / 1e5, digits: 2 });
  const o = other?.lap;
  if (o && other)
    columns.push(
      of('time_other_s', o.timeS, 4),
      of('delta_other_s', other.driverDeltaS, 4),
      kph('speed_other_kph', o.speedMps),
      of('throttle_other', o.throttle, 3),
      of('brake_other', o.brake, 3),
      of('ax_other_mps2', o.axMps2, 3),
      of('ay_other_mps2', o.ayMps2, 3),
    );
  return csvText(columnsInUnits(columns, units), t.count);
}
