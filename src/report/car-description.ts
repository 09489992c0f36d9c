// A car described for people: the text table of `reflap car` and its g-g-v picture (one self-contained page
// whose curves are drawn with d3-shape).

import { line as d3Line } from 'd3-shape';
import type { CarDescription } from '../car/describe.js';
import type { Envelope } from '../car/envelope.js';
import { formatTable } from './text-table.js';
import { escapeHtml } from './html/escape.js';
import { contentSecurityPolicy } from './html/page-frame.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { envelopeBoundaryG } from './html/gg-diagram.js';
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

const GG_PAGE_SIZE = 520;
const CURVE_COLOURS = ['#1b6f8a', '#c2571a', '#5b8a1b', '#8a1b6f', '#6f6f6f', '#1b3f8a', '#8a6f1b', '#3f8a6f'];

/** One self-contained page: the envelope's g-g boundary at each table speed, drawn with d3-shape. */
const CAR_PAGE_STYLE =
  'body{font-family:system-ui,sans-serif;margin:24px;color:#222}figure{display:flex;gap:24px;align-items:flex-start;margin:0}ul{list-style:none;padding:0;font-size:14px}small{color:#666}';

export function carGgHtml(d: CarDescription, envelope: Envelope, units: DisplayUnits = displayUnits('metric')): string {
  const boundaries = d.envelope.map((row) => ({
    speedKph: row.speedKph,
    points: envelopeBoundaryG(envelope, kphToMps(row.speedKph)),
  }));
  const maxG = Math.max(
    0.5,
    ...boundaries.flatMap((b) => b.points.map(([x, y]) => Math.max(Math.abs(x), Math.abs(y)))),
  );
  const half = GG_PAGE_SIZE / 2;
  const scale = (half - 40) / (Math.ceil(maxG * 2) / 2);
  const path = d3Line<[number, number]>()
    .x(([ay]) => half + ay * scale)
    .y(([, ax]) => half - ax * scale);
  const gridG: number[] = [];
  for (let g = 0.5; g <= maxG + 0.25; g += 0.5) gridG.push(g);
  const grid = gridG
    .map(
      (g) =>
        `<circle cx="${half}" cy="${half}" r="${(g * scale).toFixed(1)}" fill="none" stroke="#ddd"/><text x="${(half + g * scale + 2).toFixed(1)}" y="${half - 3}" font-size="10" fill="#888">${g.toFixed(1)} g</text>`,
    )
    .join('');
  const curves = boundaries
    .map(
      (b, k) =>
        `<path d="${path([...b.points, b.points[0]!]) ?? ''}" fill="none" stroke="${CURVE_COLOURS[k % CURVE_COLOURS.length]}" stroke-width="1.6"/>`,
    )
    .join('');
  const legend = boundaries
    .map(
      (b, k) =>
        // A swatch drawn with presentation attributes: the page's Content-Security-Policy admits no style attribute.
        `<li><svg width="10" height="10" aria-hidden="true"><rect width="10" height="10" fill="${CURVE_COLOURS[k % CURVE_COLOURS.length]}"/></svg> ${escapeHtml(`${plainNumber(units.speed(kphToMps(b.speedKph)), 0)} ${units.speedLabel}`)}</li>`,
    )
    .join('');
  const title = escapeHtml(`${d.name}: g-g-v envelope (${d.model} model)`);
  const facts = escapeHtml(
    d.understeerGradientDegPerG === null
      ? 'understeer gradient not known'
      : `understeer gradient ${d.understeerGradientDegPerG.toFixed(2)} deg/g (${d.steer})`,
  );
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${contentSecurityPolicy(CAR_PAGE_STYLE, undefined)}">
<meta name="referrer" content="no-referrer"><title>${title}</title>
<style>${CAR_PAGE_STYLE}</style>
</head><body>
<h1>${title}</h1>
<p>${facts}. Lateral acceleration across (left turn to the right), longitudinal up (accelerating) and down (braking).</p>
<figure><svg width="${GG_PAGE_SIZE}" height="${GG_PAGE_SIZE}" viewBox="0 0 ${GG_PAGE_SIZE} ${GG_PAGE_SIZE}" role="img" aria-label="${title}">
<line x1="0" y1="${half}" x2="${GG_PAGE_SIZE}" y2="${half}" stroke="#bbb"/><line x1="${half}" y1="0" x2="${half}" y2="${GG_PAGE_SIZE}" stroke="#bbb"/>
${grid}${curves}
<text x="${GG_PAGE_SIZE - 6}" y="${half - 6}" text-anchor="end" font-size="11">ay</text><text x="${half + 6}" y="14" font-size="11">ax</text>
</svg><ul>${legend}</ul></figure>
<p><small>The limits are what the car file implies, not what a car on a given day will do. ${escapeHtml(SAFETY_CAUTION)}</small></p>
</body></html>
`;
}
