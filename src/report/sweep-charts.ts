// The charts of a sweep's report: per swept field, lap time against the field and each corner's
// braking-point shift from the baseline against the field. The series come from sweepChartData; a grid
// also shows how the other fields move the lap-time curve.

import { zoneLabel } from '../track/corner-layout.js';
import { sweepChartData, type SweepSeries } from '../sweep/chart-data.js';
import type { SweepRecord, SweepTable } from '../sweep/table.js';
import { PALETTE, seriesStyle } from './html/palette.js';
import type { XyChartSpec, XySeries } from './html/xy-chart.js';
import { valueWithUnit } from './sweep-format.js';
import { fieldAxisTitle } from './field-steps.js';
import { formatLapTime } from '../units.js';
import { displayUnits, type DisplayUnits } from './units.js';

/** A grid draws one lap-time line per combination of the other fields up to this many; beyond, the grid's points. */
export const MAX_GRID_LINES = 7;

/** Lap times in tooltips read as in every table: m:ss.sss. */
const lapText = (lapTimeS: number) => formatLapTime(lapTimeS);

/** A name for --svg files and element ids from a field name: letters, digits, dots and dashes only. */
export function fieldSlug(field: string): string {
  return field.replace(/[^A-Za-z0-9.-]+/g, '_');
}

function baselineGuide(table: SweepTable, k: number): { x: number; label: string }[] {
  const base = table.meta.baseValues[k]!;
  return Number.isFinite(base) ? [{ x: base, label: 'baseline' }] : [];
}

function describeOthers(table: SweepTable, k: number, record: SweepRecord): string {
  const { fields, units } = table.meta;
  return fields
    .map((field, j) => (j === k ? '' : `${field} ${valueWithUnit(record.values[j]!, units[j])}`))
    .filter(Boolean)
    .join(', ');
}

function lapTimeSeries(table: SweepTable, k: number, series: SweepSeries): XySeries[] {
  const { meta, records } = table;
  const field = meta.fields[k]!;
  const unit = meta.units[k];
  const pointTitle = (record: SweepRecord) => {
    const others = describeOthers(table, k, record);
    return `run ${record.run}: ${field} ${valueWithUnit(record.values[k]!, unit)}${others ? ` (${others})` : ''}: lap ${lapText(record.lapTimeS)}`;
  };
  if (meta.mode === 'one-at-a-time' || meta.fields.length === 1) {
    const runs =
      meta.mode === 'one-at-a-time'
        ? records.filter((r) => r.kind === 'oat' && r.varies === field)
        : records.filter((r) => r.kind === 'grid');
    const sorted = [...runs].sort((a, b) => a.values[k]! - b.values[k]!);
    return [
      {
        label: `${field} alone`,
        colour: PALETTE.reference,
        points: sorted.map((r) => ({ x: r.values[k]!, y: r.lapTimeS, title: pointTitle(r) })),
      },
    ];
  }
  const groups = new Map<string, SweepRecord[]>();
  for (const record of records) {
    if (record.kind !== 'grid') continue;
    const key = describeOthers(table, k, record);
    const group = groups.get(key);
    if (group) group.push(record);
    else groups.set(key, [record]);
  }
  if (groups.size <= MAX_GRID_LINES) {
    return [...groups.entries()].map(([key, runs], index) => ({
      label: key,
      ...seriesStyle(index),
      points: [...runs]
        .sort((a, b) => a.values[k]! - b.values[k]!)
        .map((r) => ({ x: r.values[k]!, y: r.lapTimeS, title: pointTitle(r) })),
    }));
  }
  const grid = records.filter((r) => r.kind === 'grid');
  return [
    {
      label: 'every run of the grid',
      colour: PALETTE.gridPoint,
      line: false,
      markerRadius: 2.2,
      points: grid.map((r) => ({ x: r.values[k]!, y: r.lapTimeS, title: pointTitle(r) })),
    },
    {
      label: 'others nearest the baseline',
      colour: PALETTE.reference,
      points: series.values.map((value, v) => ({
        x: value,
        y: series.lapTimeS[v]!,
        title: `${field} ${valueWithUnit(value, unit)}: lap ${lapText(series.lapTimeS[v]!)}`,
      })),
    },
  ];
}

function shiftSeries(table: SweepTable, k: number, series: SweepSeries, units: DisplayUnits): XySeries[] {
  const field = table.meta.fields[k]!;
  const unit = table.meta.units[k];
  return table.meta.corners.map((corner, c) => ({
    label: corner.tag,
    ...seriesStyle(c),
    markerRadius: 2.4,
    points: series.values.map((value, v) => {
      const shift = units.distance(series.brakingPointShiftM[c]![v]!);
      const text = Number.isFinite(shift)
        ? `${shift >= 0 ? '+' : ''}${shift.toFixed(2)} ${units.distanceLabel} (${shift < 0 ? 'earlier' : shift > 0 ? 'later' : 'unchanged'})`
        : 'no braking';
      return { x: value, y: shift, title: `${zoneLabel(corner)} at ${field} ${valueWithUnit(value, unit)}: ${text}` };
    }),
  }));
}

/** Two charts per swept field, lap time first, in the order of the fields. */
export function sweepChartSpecs(table: SweepTable, units: DisplayUnits = displayUnits('metric')): XyChartSpec[] {
  const data = sweepChartData(table);
  const held = table.meta.mode !== 'one-at-a-time' && table.meta.fields.length > 1;
  const specs: XyChartSpec[] = [];
  data.forEach((series, k) => {
    const field = table.meta.fields[k]!;
    const xTitle = fieldAxisTitle(field, table.meta.units[k]);
    const xGuides = baselineGuide(table, k);
    // A percent step of a field the car gives as 0 moves nothing: say so rather than draw a dot as a chart.
    const unmoved = series.values.length > 0 && series.values.every((v) => v === series.values[0]);
    const unmovedNote = unmoved
      ? { note: `every run has ${field} = ${series.values[0]}: the variation does not move this field` }
      : {};
    specs.push({
      name: `lap-time-${fieldSlug(field)}`,
      title: `Lap time against ${fieldAxisTitle(field, undefined)}`,
      xTitle,
      yTitle: 'lap time, s',
      series: lapTimeSeries(table, k, series),
      xGuides,
      ...unmovedNote,
    });
    specs.push({
      name: `braking-shift-${fieldSlug(field)}`,
      title: `Braking-point shift per corner against ${fieldAxisTitle(field, undefined)}`,
      xTitle,
      yTitle: `shift from baseline, ${units.distanceLabel} (− = earlier)`,
      series: shiftSeries(table, k, series, units),
      yGuides: [0],
      xGuides,
      ...(held ? { note: 'other fields held at the grid value nearest their baseline' } : {}),
      ...unmovedNote,
    });
  });
  return specs;
}
