// `reflap budget`: the friction-circle arithmetic at one speed and lateral demand, ellipse beside linear split.

import type { Command } from 'commander';
import { addCarOptions, loadCar, numberOption, type CarOptionValues } from '../options.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { gripBudget } from '../../car/budget.js';
import { InputError } from '../../errors.js';
import { gToMps2, kphToMps, mps2ToG, mpsToKph } from '../../units.js';
import { MAX_ACCEL_MPS2, MAX_SPEED_MPS } from '../../car/plausible.js';
import { formatTable } from '../../report/text-table.js';
import { round } from '../../report/lap-summary.js';

interface BudgetValues extends CarOptionValues {
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
    .option('--json', 'print one JSON object')
    .action((values: BudgetValues) => runBudget(values));
}

const percent = (share: number) => `${(share * 100).toFixed(0)} %`;

export function runBudget(values: BudgetValues): void {
  const speedKph = numberOption(values.speedKph, '--speed-kph', 0);
  if (!(speedKph > 0 && speedKph <= mpsToKph(MAX_SPEED_MPS)))
    throw new InputError(`option --speed-kph: ${speedKph} must be above 0 and at most ${mpsToKph(MAX_SPEED_MPS)} km/h`);
  if ((values.lateralG === undefined) === (values.radiusM === undefined)) {
    throw new InputError('budget: give exactly one of --lateral-g and --radius-m');
  }
  const speedMps = kphToMps(speedKph);
  let lateralMps2: number;
  if (values.radiusM !== undefined) {
    const radiusM = numberOption(values.radiusM, '--radius-m', 0);
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
  const { car, ambient } = loadCar(values);
  const budget = gripBudget(buildEnvelope(car, ambient), speedMps, lateralMps2);
  if (values.json) {
    process.stdout.write(
      JSON.stringify(
        {
          car: car.name,
          speedKph,
          lateralDemandG: round(mps2ToG(lateralMps2), 4),
          lateralLimitG: round(budget.lateralLimitG, 4),
          lateralShare: round(budget.lateralShare, 4),
          brakingAvailableG: round(budget.brakingAvailableG, 4),
          accelAvailableG: round(budget.accelAvailableG, 4),
          linearSplit: {
            brakingAvailableG: round(budget.linearBrakingAvailableG, 4),
            accelAvailableG: round(budget.linearAccelAvailableG, 4),
          },
          straightLine: { brakingG: round(budget.brakingStraightG, 4), accelG: round(budget.accelStraightG, 4) },
        },
        null,
        2,
      ) + '\n',
    );
    return;
  }
  const g = (value: number) => `${value.toFixed(2)} g`;
  const lines = [
    `${car.name} at ${speedKph.toFixed(0)} km/h, cornering at ${g(mps2ToG(lateralMps2))}`,
    `Lateral limit at this speed: ${g(budget.lateralLimitG)}; in use: ${percent(budget.lateralShare)}`,
  ];
  if (budget.lateralShare > 1) {
    lines.push(
      'That is beyond the lateral limit: the car cannot hold this corner at this speed, so nothing is left to brake or accelerate with.',
    );
  } else {
    lines.push(
      '',
      formatTable(
        ['still available', 'friction ellipse', 'linear split', 'straight line'],
        [
          ['braking', g(budget.brakingAvailableG), g(budget.linearBrakingAvailableG), g(budget.brakingStraightG)],
          ['accelerating', g(budget.accelAvailableG), g(budget.linearAccelAvailableG), g(budget.accelStraightG)],
        ],
      ),
      '',
      `On the ellipse, using ${percent(budget.lateralShare)} of the lateral grip still leaves ${percent(
        budget.brakingStraightG > 0 ? budget.brakingAvailableG / budget.brakingStraightG : 0,
      )} of the straight-line braking; the linear split would say ${percent(Math.max(0, 1 - budget.lateralShare))}.`,
    );
  }
  process.stdout.write(lines.join('\n') + '\n');
}
