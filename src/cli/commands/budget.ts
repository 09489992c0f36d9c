// `reflap budget`: the friction-circle arithmetic at one speed and lateral demand, ellipse beside linear split.

import type { Command } from 'commander';
import { addCarOptions, inputFilesOf, loadCar, numberOption, type CarOptionValues } from '../options.js';
import { outputBatch } from '../output.js';
import { addPageOutputs, addReportOptions, reportWrittenText, type ReportOptionValues } from '../html-options.js';
import { budgetHtml, budgetSvg } from '../../report/html/budget-page.js';
import { envelopeBoundaryG } from '../../report/html/gg-diagram.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { gripBudget, lateralLoadTable } from '../../car/budget.js';
import { cornerLimitSpeedMps } from '../../solve/corner-limit.js';
import { budgetText } from '../../report/budget-text.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import { InputError } from '../../errors.js';
import { gToMps2, kphToMps, mps2ToG, mpsToKph } from '../../units.js';
import { MAX_ACCEL_MPS2, MAX_SPEED_MPS } from '../../car/plausible.js';
import { roundToDigits } from '../../numeric/round.js';

interface BudgetValues extends CarOptionValues, UnitsOptionValues, ReportOptionValues {
  speedKph: string;
  lateralG?: string;
  radiusM?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('budget')
    .description('friction-circle arithmetic: what is left for braking and accelerating while cornering');
  addCarOptions(command);
  command
    .requiredOption('--speed-kph <v>', 'speed, km/h')
    .option('--lateral-g <g>', 'lateral acceleration in use, g')
    .option('--radius-m <r>', 'corner radius, m (lateral demand v^2 / R)')
    .option('--json', 'print one JSON object');
  addUnitsOption(command);
  addReportOptions(
    command,
    'the friction circle with the point on it and what is left to brake and accelerate with: one page',
  ).action((values: BudgetValues) => runBudget(values));
}

export function runBudget(values: BudgetValues): void {
  const speedKph = numberOption(values.speedKph, '--speed-kph', 0);
  if (!(speedKph > 0 && speedKph <= mpsToKph(MAX_SPEED_MPS)))
    throw new InputError(`option --speed-kph: ${speedKph} must be above 0 and at most ${mpsToKph(MAX_SPEED_MPS)} km/h`);
  if ((values.lateralG === undefined) === (values.radiusM === undefined)) {
    throw new InputError('budget: give exactly one of --lateral-g and --radius-m');
  }
  const speedMps = kphToMps(speedKph);
  let lateralMps2: number;
  let radiusM: number | null = null;
  if (values.radiusM !== undefined) {
    radiusM = numberOption(values.radiusM, '--radius-m', 0);
    if (!(radiusM > 0 && Number.isFinite(radiusM)))
      throw new InputError(`option --radius-m: ${radiusM} must be positive`);
    lateralMps2 = (speedMps * speedMps) / radiusM;
  } else {
    const lateralG = numberOption(values.lateralG, '--lateral-g', 0);
    if (!(lateralG >= 0 && lateralG <= mps2ToG(MAX_ACCEL_MPS2)))
      throw new InputError(
        `option --lateral-g: ${lateralG} must be between 0 and ${mps2ToG(MAX_ACCEL_MPS2).toFixed(1)} g`,
      );
    lateralMps2 = gToMps2(lateralG);
  }
  const units = unitsOf(values);
  const { car, ambient } = loadCar(values);
  const envelope = buildEnvelope(car, ambient);
  const budget = gripBudget(envelope, speedMps, lateralMps2);
  const cornerSpeedLimitMps = radiusM !== null ? cornerLimitSpeedMps(envelope, 1 / radiusM) : null;
  const tightestRadiusM = (speedMps * speedMps) / envelope.lateralLimitMps2(speedMps, 1);
  const lateralLoads = lateralLoadTable(envelope, speedMps);
  const report = { carName: car.name, speedMps, radiusM, budget, cornerSpeedLimitMps, tightestRadiusM, lateralLoads };
  const picture = { report, boundaryG: envelopeBoundaryG(envelope, speedMps) };
  const outputs = outputBatch(inputFilesOf(values));
  const pictureFiles = addPageOutputs(outputs, values, {
    html: () => budgetHtml(picture, units),
    charts: () => [{ name: 'budget.svg', title: 'Grip budget', svg: budgetSvg(picture, units, { standalone: true }) }],
  });
  outputs.commit();
  if (values.json) {
    process.stdout.write(
      JSON.stringify(
        {
          car: car.name,
          speedKph,
          lateralDemandG: roundToDigits(mps2ToG(lateralMps2), 4),
          lateralLimitG: roundToDigits(budget.lateralLimitG, 4),
          lateralShare: roundToDigits(budget.lateralShare, 4),
          brakingAvailableG: roundToDigits(budget.brakingAvailableG, 4),
          accelAvailableG: roundToDigits(budget.accelAvailableG, 4),
          linearSplit: {
            brakingAvailableG: roundToDigits(budget.linearBrakingAvailableG, 4),
            accelAvailableG: roundToDigits(budget.linearAccelAvailableG, 4),
          },
          straightLine: {
            brakingG: roundToDigits(budget.brakingStraightG, 4),
            accelG: roundToDigits(budget.accelStraightG, 4),
          },
          radiusM,
          cornerSpeedLimitMps: cornerSpeedLimitMps === null ? null : roundToDigits(cornerSpeedLimitMps, 3),
          tightestRadiusM: roundToDigits(tightestRadiusM, 2),
          lateralLoads: lateralLoads.map((row) => ({
            lateralShare: roundToDigits(row.lateralShare, 4),
            lateralG: roundToDigits(mps2ToG(row.lateralDemandMps2), 4),
            brakingAvailableG: roundToDigits(row.brakingAvailableG, 4),
            accelAvailableG: roundToDigits(row.accelAvailableG, 4),
            linearBrakingAvailableG: roundToDigits(row.linearBrakingAvailableG, 4),
            linearAccelAvailableG: roundToDigits(row.linearAccelAvailableG, 4),
          })),
        },
        null,
        2,
      ) + '\n',
    );
    return;
  }
  process.stdout.write(budgetText(report, units) + reportWrittenText(pictureFiles));
}
