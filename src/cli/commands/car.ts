// `reflap car`: describes a car file (axle loads, understeer gradient, characteristic or critical speed, the
// envelope at a few speeds), as text, JSON, or a g-g-v picture; and the bicycle-model extras of `reflap simulate`.

import type { Command } from 'commander';
import { line as d3Line } from 'd3-shape';
import { addCarOptions, inputFilesOf, loadCar, type CarOptionValues } from '../options.js';
import { outputBatch } from '../output.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { describeCar, type CarDescription } from '../../car/describe.js';
import type { Envelope } from '../../car/envelope.js';
import type { Ambient, Car } from '../../car/types.js';
import type { LapResult } from '../../solve/types.js';
import type { ExtraColumn } from '../../report/trace-csv.js';
import { formatTable } from '../../report/text-table.js';
import { escapeHtml } from '../../report/html/escape.js';
import { envelopeBoundaryG } from '../../report/html/gg-diagram.js';
import { canTraceSteering, criticalSpeedWarning, steeringTraceDeg } from '../../solve/steering.js';
import { checkTransient } from '../../solve/transient.js';
import { transientJson, transientSummaryText } from '../../solve/transient-report.js';
import { kphToMps } from '../../units.js';

interface CarValues extends CarOptionValues {
  json?: boolean;
  html?: string;
}

export function register(program: Command): void {
  const command = program.command('car').description('describe a car: axle loads, understeer gradient, envelope at a few speeds');
  addCarOptions(command);
  command
    .option('--json', 'print one JSON object instead of the text')
    .option('--html <file>', 'also write a g-g-v picture of the envelope (one self-contained HTML page)')
    .action((values: CarValues) => runCar(values));
}

const fixed = (value: number | null, digits: number, unit = '') => (value === null ? 'none' : `${value.toFixed(digits)}${unit}`);

export function carDescriptionText(d: CarDescription): string {
  const lines = [
    `Car: ${d.name} (${d.model} model)`,
    `Mass with fuel ${d.totalMassKg.toFixed(0)} kg: front axle ${d.staticFrontAxleKg.toFixed(0)} kg, rear axle ${d.staticRearAxleKg.toFixed(0)} kg (${(100 * d.frontWeightFraction).toFixed(1)} % front)`,
  ];
  if (d.understeerGradientDegPerG === null) {
    lines.push('Understeer gradient: not known (the car file gives no wheelbase or cornering stiffnesses)');
  } else {
    lines.push(`Understeer gradient ${d.understeerGradientDegPerG.toFixed(2)} deg/g (${d.steer})`);
    if (d.characteristicSpeedKph !== null) lines.push(`Characteristic speed ${d.characteristicSpeedKph.toFixed(0)} km/h (steer doubles its kinematic value)`);
    if (d.criticalSpeedKph !== null) lines.push(`Critical speed ${d.criticalSpeedKph.toFixed(0)} km/h: directionally unstable above it`);
  }
  lines.push(`Top speed ${d.topSpeedKph.toFixed(0)} km/h`, '');
  const header = ['speed km/h', 'lateral g', 'accel g', 'brake g'];
  const bicycle = d.envelope.some((row) => row.lateralLimitingAxle !== null);
  if (bicycle) header.push('limiting axle');
  const rows = d.envelope.map((row) => {
    const cells = [row.speedKph.toFixed(0), row.lateralG.toFixed(2), row.accelG.toFixed(2), row.brakeG.toFixed(2)];
    if (bicycle) cells.push(row.lateralLimitingAxle ?? '');
    return cells;
  });
  lines.push(formatTable(header, rows));
  return lines.join('\n') + '\n';
}

const GG_PAGE_SIZE = 520;
const CURVE_COLOURS = ['#1b6f8a', '#c2571a', '#5b8a1b', '#8a1b6f', '#6f6f6f', '#1b3f8a', '#8a6f1b', '#3f8a6f'];

/** One self-contained page: the envelope's g-g boundary at each table speed, drawn with d3-shape. */
export function carGgHtml(d: CarDescription, envelope: Envelope): string {
  const boundaries = d.envelope.map((row) => ({ speedKph: row.speedKph, points: envelopeBoundaryG(envelope, kphToMps(row.speedKph)) }));
  const maxG = Math.max(0.5, ...boundaries.flatMap((b) => b.points.map(([x, y]) => Math.max(Math.abs(x), Math.abs(y)))));
  const half = GG_PAGE_SIZE / 2;
  const scale = (half - 40) / (Math.ceil(maxG * 2) / 2);
  const path = d3Line<[number, number]>()
    .x(([ay]) => half + ay * scale)
    .y(([, ax]) => half - ax * scale);
  const gridG: number[] = [];
  for (let g = 0.5; g <= maxG + 0.25; g += 0.5) gridG.push(g);
  const grid = gridG
    .map((g) => `<circle cx="${half}" cy="${half}" r="${(g * scale).toFixed(1)}" fill="none" stroke="#ddd"/><text x="${(half + g * scale + 2).toFixed(1)}" y="${half - 3}" font-size="10" fill="#888">${g.toFixed(1)} g</text>`)
    .join('');
  const curves = boundaries
    .map((b, k) => `<path d="${path([...b.points, b.points[0]!]) ?? ''}" fill="none" stroke="${CURVE_COLOURS[k % CURVE_COLOURS.length]}" stroke-width="1.6"/>`)
    .join('');
  const legend = boundaries
    .map((b, k) => `<li><span style="color:${CURVE_COLOURS[k % CURVE_COLOURS.length]}">&#9632;</span> ${escapeHtml(`${b.speedKph} km/h`)}</li>`)
    .join('');
  const title = escapeHtml(`${d.name}: g-g-v envelope (${d.model} model)`);
  const facts = escapeHtml(
    d.understeerGradientDegPerG === null
      ? 'understeer gradient not known'
      : `understeer gradient ${d.understeerGradientDegPerG.toFixed(2)} deg/g (${d.steer})`,
  );
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>${title}</title>
<style>body{font-family:system-ui,sans-serif;margin:24px;color:#222}figure{display:flex;gap:24px;align-items:flex-start;margin:0}ul{list-style:none;padding:0;font-size:14px}small{color:#666}</style>
</head><body>
<h1>${title}</h1>
<p>${facts}. Lateral acceleration across (left turn to the right), longitudinal up (accelerating) and down (braking).</p>
<figure><svg width="${GG_PAGE_SIZE}" height="${GG_PAGE_SIZE}" viewBox="0 0 ${GG_PAGE_SIZE} ${GG_PAGE_SIZE}" role="img" aria-label="${title}">
<line x1="0" y1="${half}" x2="${GG_PAGE_SIZE}" y2="${half}" stroke="#bbb"/><line x1="${half}" y1="0" x2="${half}" y2="${GG_PAGE_SIZE}" stroke="#bbb"/>
${grid}${curves}
<text x="${GG_PAGE_SIZE - 6}" y="${half - 6}" text-anchor="end" font-size="11">ay</text><text x="${half + 6}" y="14" font-size="11">ax</text>
</svg><ul>${legend}</ul></figure>
<p><small>A model result: the limits are what the car file implies, not what a car on a given day will do. Defer to the circuit's rules and to qualified instruction.</small></p>
</body></html>
`;
}

export function runCar(values: CarValues): void {
  const { car, ambient } = loadCar(values);
  const envelope = buildEnvelope(car, ambient);
  const description = describeCar(car, ambient, envelope);
  const outputs = outputBatch(inputFilesOf(values));
  if (values.html) outputs.add(values.html, carGgHtml(description, envelope));
  outputs.commit();
  if (values.json) {
    process.stdout.write(JSON.stringify(description, null, 2) + '\n');
  } else {
    process.stdout.write(carDescriptionText(description));
    if (values.html) process.stdout.write(`g-g-v picture written to ${values.html}\n`);
  }
}

/** The bicycle-model additions to `reflap simulate`: the steering column, the transient check, the stability warning. */
export function bicycleSimulateExtras(result: LapResult, car: Car, ambient: Ambient, withTransient: boolean): { columns: ExtraColumn[]; text: string; json: Record<string, unknown> } {
  const columns: ExtraColumn[] = [];
  if (canTraceSteering(car)) columns.push({ name: 'steering_deg', values: steeringTraceDeg(result, car), digits: 3 });
  const warning = criticalSpeedWarning(result, car);
  let text = warning ? `Warning: ${warning}\n` : '';
  const json: Record<string, unknown> = { warnings: warning ? [warning] : [] };
  if (withTransient) {
    const check = checkTransient(result, car, { ambient });
    columns.push({ name: 'transient_error_m', values: check.lateralErrorM, digits: 3 }, { name: 'transient_speed_mps', values: check.followedSpeedMps, digits: 3 });
    text += transientSummaryText(check);
    json.transient = transientJson(check);
  }
  return { columns, text, json };
}
