// `reflap budget` for people: the budget at one point, the same figures in the sentence as in the table, the
// speed that fits the corner, and the budget across lateral loads so a coach can teach the friction circle.

import type { GripBudget } from '../car/budget.js';
import { mps2ToG } from '../units.js';
import { formatTable } from './text-table.js';
import { plainNumber, type DisplayUnits } from './units.js';

export interface BudgetReport {
  carName: string;
  speedMps: number;
  /** The corner radius given, or null when the lateral demand was given in g. */
  radiusM: number | null;
  budget: GripBudget;
  /** The fastest speed at which the given radius fits the lateral limit (null without a radius). */
  cornerSpeedLimitMps: number | null;
  /** The tightest radius the lateral limit allows at this speed, m. */
  tightestRadiusM: number;
  /** The budget at this speed across lateral loads (shares of the lateral limit). */
  lateralLoads: GripBudget[];
}

const g = (value: number) => `${plainNumber(value, 2)} g`;
const percent = (share: number) => `${plainNumber(share * 100, 0)} %`;
/** Share of the straight-line figure, the same number in the table and in the sentence. */
const shareOf = (available: number, straight: number) => (straight > 0 ? available / straight : 0);

export function budgetText(report: BudgetReport, units: DisplayUnits): string {
  const { budget } = report;
  const speed = (speedMps: number) => `${plainNumber(units.speed(speedMps), 0)} ${units.speedLabel}`;
  const distance = (distanceM: number) => `${plainNumber(units.distance(distanceM), 0)} ${units.distanceLabel}`;
  const demand = `${g(mps2ToG(budget.lateralDemandMps2))} lateral`;
  const lines = [
    `${report.carName} at ${speed(report.speedMps)}${report.radiusM !== null ? ` on a ${distance(report.radiusM)} radius` : ''}: ${demand}`,
    `Lateral limit at this speed: ${g(budget.lateralLimitG)}; in use: ${percent(budget.lateralShare)}`,
  ];
  if (report.cornerSpeedLimitMps !== null) {
    lines.push(`The fastest this radius allows: ${speed(report.cornerSpeedLimitMps)} (all the lateral grip in use)`);
  }
  lines.push(`The tightest radius at ${speed(report.speedMps)}: ${distance(report.tightestRadiusM)}`);
  if (budget.lateralShare > 1) {
    lines.push(
      '',
      report.cornerSpeedLimitMps !== null
        ? `That is beyond the lateral limit: the car cannot hold this radius at ${speed(report.speedMps)}; it fits at ${speed(report.cornerSpeedLimitMps)} or less, and nothing is left to brake or accelerate with.`
        : `That is beyond the lateral limit: the car cannot corner at ${demand} at ${speed(report.speedMps)}, so nothing is left to brake or accelerate with.`,
    );
  } else {
    const brakingEllipse = shareOf(budget.brakingAvailableG, budget.brakingStraightG);
    const brakingLinear = shareOf(budget.linearBrakingAvailableG, budget.brakingStraightG);
    lines.push(
      '',
      formatTable(
        ['still available', 'friction ellipse', 'share', 'linear split', 'share', 'straight line'],
        [
          [
            'braking',
            g(budget.brakingAvailableG),
            percent(brakingEllipse),
            g(budget.linearBrakingAvailableG),
            percent(brakingLinear),
            g(budget.brakingStraightG),
          ],
          [
            'accelerating',
            g(budget.accelAvailableG),
            percent(shareOf(budget.accelAvailableG, budget.accelStraightG)),
            g(budget.linearAccelAvailableG),
            percent(shareOf(budget.linearAccelAvailableG, budget.accelStraightG)),
            g(budget.accelStraightG),
          ],
        ],
      ),
      '(share = of the straight-line figure at this speed; drag is counted in every figure)',
      '',
      `On the friction ellipse, using ${percent(budget.lateralShare)} of the lateral grip still leaves ${g(budget.brakingAvailableG)} of braking, ${percent(brakingEllipse)} of the straight line's ${g(budget.brakingStraightG)}; the linear split would leave ${g(budget.linearBrakingAvailableG)}, ${percent(brakingLinear)}.`,
    );
  }
  lines.push(
    '',
    `Across lateral loads at ${speed(report.speedMps)} (the friction circle in numbers):`,
    formatTable(
      ['lateral load', 'lateral', 'braking: ellipse', 'linear', 'accelerating: ellipse', 'linear'],
      report.lateralLoads.map((row) => [
        percent(row.lateralShare),
        g(mps2ToG(row.lateralDemandMps2)),
        g(row.brakingAvailableG),
        g(row.linearBrakingAvailableG),
        g(row.accelAvailableG),
        g(row.linearAccelAvailableG),
      ]),
    ),
  );
  return lines.join('\n') + '\n';
}
