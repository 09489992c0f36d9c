// `reflap whatif`: one setup change against the baseline: the lap time change and, corner by corner, how
// far the braking point moves and what the entry speed, slowest speed and zone time do.

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
import { applySettings, baseValueOf, parseSetting } from '../../sweep/settings.js';
import { compareSetupChange } from '../../sweep/setup-change.js';
import { DEFAULT_MATCH_TOLERANCE_M } from '../../sweep/match-zones.js';
import { InputError } from '../../errors.js';
import { loadSetupInputs, setupReference } from '../setup-inputs.js';
import { addLineOption, referencePathJson, withReferencePath } from '../reference-path.js';
import { ambientFrom } from '../../car/ambient.js';
import { outputBatch } from '../output.js';
import { addPageOutputs, addReportOptions, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { whatifChartSvgs, whatifReportHtml } from '../../report/sweep-whatif.js';
import { describeSettings, whatifJson, whatifText } from '../../report/whatif-summary.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface WhatifValues extends TrackOptionValues, CarOptionValues, ReportOptionValues, UnitsOptionValues {
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
  addUnitsOption(command);
  addReportOptions(command, 'a page with the braking-point shift and the speed changes per corner').action(
    (values: WhatifValues) => runWhatif(values),
  );
}

export function runWhatif(values: WhatifValues): void {
  const texts = values.set ?? [];
  if (texts.length === 0) throw new InputError('whatif: give at least one --set FIELD=VALUE');
  const units = unitsOf(values);
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
  const page = { comparison, described, trackName: track.name, carName: car.name, units };
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
      withReferencePath(whatifText(comparison, described, track.name, car.name, units), reference, true) +
        reportWrittenText(reportFiles),
    );
  }
}
