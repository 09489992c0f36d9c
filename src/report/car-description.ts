// A car described for people: the text table of `reflap car` (its page is html/car-page.ts).

import type { CarDescription } from '../car/describe.js';
import { formatTable } from './text-table.js';
import { kphToMps } from '../units.js';
import { displayUnits, plainNumber, type DisplayUnits } from './units.js';

export function carDescriptionText(d: CarDescription, units: DisplayUnits = displayUnits('metric')): string {
  const speed = (speedKph: number) => `${plainNumber(units.speed(kphToMps(speedKph)), 0)} ${units.speedLabel}`;
  const lines = [
    `Car: ${d.name} (${d.model} model)`,
    `Mass with fuel ${d.totalMassKg.toFixed(0)} kg: front axle ${d.staticFrontAxleKg.toFixed(0)} kg, rear axle ${d.staticRearAxleKg.toFixed(0)} kg (${(100 * d.frontWeightFraction).toFixed(1)} % front)`,
  ];
  if (d.understeerGradientDegPerG === null) {
    lines.push('Understeer gradient: not known (the car file gives no wheelbase or cornering stiffnesses)');
  } else {
    lines.push(`Understeer gradient ${d.understeerGradientDegPerG.toFixed(2)} deg/g (${d.steer})`);
    if (d.characteristicSpeedKph !== null)
      lines.push(`Characteristic speed ${speed(d.characteristicSpeedKph)} (steer doubles its kinematic value)`);
    if (d.criticalSpeedKph !== null)
      lines.push(`Critical speed ${speed(d.criticalSpeedKph)}: directionally unstable above it`);
  }
  lines.push(`Top speed ${speed(d.topSpeedKph)}`, '');
  const header = [`speed ${units.speedLabel}`, 'lateral g', 'accel g', 'brake g'];
  const bicycle = d.envelope.some((row) => row.lateralLimitingAxle !== null);
  if (bicycle) header.push('limiting axle');
  const rows = d.envelope.map((row) => {
    const cells = [
      plainNumber(units.speed(kphToMps(row.speedKph)), 0),
      plainNumber(row.lateralG, 2),
      plainNumber(row.accelG, 2),
      plainNumber(row.brakeG, 2),
    ];
    if (bicycle) cells.push(row.lateralLimitingAxle ?? '');
    return cells;
  });
  lines.push(formatTable(header, rows));
  return lines.join('\n') + '\n';
}
