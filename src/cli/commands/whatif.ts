// `reflap whatif`: one setup change against the baseline: the lap time change and, corner by corner, how
// far the braking point moves and what the entry speed, slowest speed and zone time do.

import { zoneLabel } from '../../track/corner-layout.js';
import type { Command } from 'commander';
import {
  addCarOptions,
  addTrackOptions,
  inputFilesOf,
  numberOption,
  type CarOptionValues,
  type TrackOptionValues,
} from '../options.js';
import { simulate } from '../../solve/simulate.js';
import { applySettings, baseValueOf, parseSetting, type Setting, type SetupBase } from '../../sweep/settings.js';
import { compareSetupChange, type LapComparison } from '../../sweep/compare-laps.js';
import { DEFAULT_MATCH_TOLERANCE_M } from '../../sweep/match-zones.js';
import { unitOf } from '../../sweep/fields.js';
import { formatTable } from '../../report/text-table.js';
import { SAFETY_CAUTION } from '../../report/lap-summary.js';
import { roundToDigits } from '../../numeric/round.js';
import { formatLapTime } from '../../units.js';
import { InputError } from '../../errors.js';
import { loadSetupInputs, setupReference } from '../setup-inputs.js';
import { addLineOption, referencePathJson, withReferencePath } from '../reference-path.js';
import { ambientFrom } from '../../car/ambient.js';
import { outputBatch } from '../output.js';
import { addPageOutputs, addReportOptions, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { whatifChartSvgs, whatifReportHtml } from '../../report/sweep-whatif.js';

interface WhatifValues extends TrackOptionValues, CarOptionValues, ReportOptionValues {
  set?: string[];
  matchM?: string;
  line?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('whatif')
    .description('one setup change against the baseline: lap time and braking points');
  addTrackOptions(command);
  addCarOptions(command);
  command
    .option(
      '--set <field=value...>',
      'change: massKg=1400 (absolute), massKg=+20 or -20 (difference), tyre.muLat=-5% (percent); air too: airTempC=35',
    )
    .option(
      '--match-m <m>',
      `largest distance between the slowest points of one corner in the two laps, m (default ${DEFAULT_MATCH_TOLERANCE_M})`,
    )
    .option('--json', 'print one JSON object instead of the table');
  addLineOption(command, true);
  addReportOptions(command, 'a page with the braking-point shift per corner as a bar chart').action(
    (values: WhatifValues) => runWhatif(values),
  );
}

const signed = (value: number, digits: number) => `${value >= 0 ? '+' : ''}${value.toFixed(digits)}`;

export function describeSettings(base: SetupBase, settings: readonly Setting[], values: readonly number[]): string[] {
  return settings.map((setting, k) => {
    const before = baseValueOf(base, setting.field);
    const unit = unitOf(setting.field);
    return `${setting.field} ${before === null ? '(none)' : before} -> ${values[k]}${unit && unit !== '1' ? ` ${unit}` : ''}`;
  });
}

export function whatifJson(comparison: LapComparison, changes: { field: string; from: number | null; to: number }[]) {
  const r = (v: number | null, digits: number) => (v === null ? null : roundToDigits(v, digits));
  return {
    changes,
    baselineLapTimeS: roundToDigits(comparison.baselineLapTimeS, 4),
    changedLapTimeS: roundToDigits(comparison.changedLapTimeS, 4),
    lapTimeDeltaS: roundToDigits(comparison.lapTimeDeltaS, 4),
    brakingZones: comparison.zones.map((zone) => ({
      corner: zone.corner,
      tag: zone.tag,
      cornerName: zone.cornerName,
      startM: roundToDigits(zone.startM, 2),
      minSpeedAtM: roundToDigits(zone.minSpeedAtM, 2),
      brakingPointM: roundToDigits(zone.brakingPointM, 2),
      changedBrakingPointM: r(zone.changedBrakingPointM, 2),
      brakingPointShiftM: r(zone.brakingPointShiftM, 2),
      entrySpeedDeltaKph: r(zone.entrySpeedDeltaKph, 2),
      minSpeedDeltaKph: r(zone.minSpeedDeltaKph, 2),
      zoneTimeDeltaS: r(zone.zoneTimeDeltaS, 4),
      turnInM: r(zone.turnInM, 2),
      beforeTurnInM: r(zone.beforeTurnInM, 2),
      changedBeforeTurnInM: r(zone.changedBeforeTurnInM, 2),
    })),
    newBrakingZones: comparison.newZones.map((zone) => ({
      startM: roundToDigits(zone.startM, 2),
      minSpeedAtM: roundToDigits(zone.minSpeedAtM, 2),
    })),
  };
}

export function whatifText(comparison: LapComparison, described: string[], trackName: string, carName: string): string {
  const rows = comparison.zones.map((zone) => {
    const shift = zone.brakingPointShiftM;
    const moved =
      shift === null
        ? 'no braking now'
        : Math.abs(shift) < 0.05
          ? '0.0'
          : `${signed(shift, 1)} ${shift < 0 ? 'earlier' : 'later'}`;
    return [
      zoneLabel({ tag: zone.tag, name: zone.cornerName }),
      zone.minSpeedAtM.toFixed(0),
      zone.brakingPointM.toFixed(1),
      zone.beforeTurnInM === null ? '' : zone.beforeTurnInM.toFixed(1),
      moved,
      zone.entrySpeedDeltaKph === null ? '' : signed(zone.entrySpeedDeltaKph, 1),
      zone.minSpeedDeltaKph === null ? '' : signed(zone.minSpeedDeltaKph, 1),
      zone.zoneTimeDeltaS === null ? '' : signed(zone.zoneTimeDeltaS, 3),
    ];
  });
  const lines = [
    `${trackName} · ${carName}`,
    `Change: ${described.join('; ')}`,
    `Lap time  ${formatLapTime(comparison.baselineLapTimeS)} -> ${formatLapTime(comparison.changedLapTimeS)}  (${signed(comparison.lapTimeDeltaS, 3)} s)`,
    '',
    formatTable(
      [
        'corner',
        'slowest at m',
        'brake at m',
        'before turn-in m',
        'braking point m',
        'entry km/h',
        'slowest km/h',
        'zone time s',
      ],
      rows,
    ),
  ];
  if (comparison.newZones.length > 0) {
    lines.push(
      '',
      `New braking zones: ${comparison.newZones.map((z) => `brake at ${z.startM.toFixed(0)} m for ${z.minSpeedAtM.toFixed(0)} m`).join(', ')}`,
    );
  }
  lines.push('', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}

export function runWhatif(values: WhatifValues): void {
  const texts = values.set ?? [];
  if (texts.length === 0) throw new InputError('whatif: give at least one --set FIELD=VALUE');
  const settings = texts.map((text) => parseSetting(text));
  const toleranceM = numberOption(values.matchM, '--match-m', DEFAULT_MATCH_TOLERANCE_M);
  if (!(toleranceM > 0)) throw new InputError(`option --match-m: ${toleranceM} must be positive`);
  const inputs = loadSetupInputs(values, []);
  const { track, base, start } = inputs;
  const { car } = base;
  const changed = applySettings(base, settings);
  const reference = setupReference(values, inputs);
  const path = reference.path;
  // The line search already drove the baseline car on its line.
  const baseline =
    reference.lap ??
    simulate(track, car, {
      ambient: ambientFrom(base.air),
      startSpeedMps: start,
      ...(path ? { path } : {}),
    });
  const result = simulate(track, changed.car, {
    ambient: changed.ambient,
    startSpeedMps: start,
    ...(path ? { path } : {}),
  });
  const comparison = compareSetupChange(baseline, result, toleranceM);
  const described = describeSettings(base, settings, changed.values);
  const page = { comparison, described, trackName: track.name, carName: car.name };
  const outputs = outputBatch(inputFilesOf(values));
  const reportFiles = addPageOutputs(outputs, values, {
    html: () => whatifReportHtml(page),
    charts: () => whatifChartSvgs(page),
  });
  outputs.commit();
  if (values.json) {
    const changes = settings.map((setting, k) => ({
      field: setting.field,
      from: baseValueOf(base, setting.field),
      to: changed.values[k]!,
    }));
    process.stdout.write(
      JSON.stringify({ ...whatifJson(comparison, changes), ...referencePathJson(reference, true) }, null, 2) + '\n',
    );
  } else {
    process.stdout.write(
      withReferencePath(whatifText(comparison, described, track.name, car.name), reference, true) +
        reportWrittenText(reportFiles),
    );
  }
}
