// `car --html`: the car's g-g-v envelope as a page in the lap report's frame. The boundary of the envelope at a few
// round speeds (the friction-circle view of the g-g-v envelope), each curve named by its speed on itself, the grid
// and its tick labels outside the curves, the car's figures as tiles and the envelope table below.

import type { CarDescription } from '../../car/describe.js';
import type { Envelope } from '../../car/envelope.js';
import { mps2ToG } from '../../units.js';
import { displayUnits, plainNumber, type DisplayUnits } from '../units.js';
import { escapeHtml } from './escape.js';
import { envelopeBoundaryG } from './gg-diagram.js';
import { ggGridSvg } from './gg-grid.js';
import { curveLabelsSvg } from './gg-curve-labels.js';
import { htmlPage } from './page-frame.js';
import { seriesStyle, PALETTE } from './palette.js';
import { coord, linearScale } from './scale.js';
import { svgElement, type SvgOptions } from './svg-frame.js';
import { tile } from './cells.js';

const SIZE = 560;
const PAD = 60;
const TOP = 34;

export const CAR_CAUTION =
  'Caution: these limits are what the car file implies, a model of the car and not the car on a given day (tyres, ' +
  "temperature and wear change them). Driving at the limit is dangerous; follow the circuit's rules and qualified instruction.";

/** Round speeds in the page's unit for the curves: every 40 km/h or 25 mph below the top speed, at most eight. */
export function curveSpeedsShown(topSpeedMps: number, units: DisplayUnits): number[] {
  const step = units.system === 'imperial' ? 25 : 40;
  const top = units.speed(topSpeedMps);
  const speeds: number[] = [];
  for (let v = step; v < top && speeds.length < 8; v += step) speeds.push(v);
  return speeds;
}

interface Curve {
  speedShown: number;
  pointsG: Array<[number, number]>;
}

function curvesOf(envelope: Envelope, units: DisplayUnits): Curve[] {
  const perMps = units.speed(1);
  return curveSpeedsShown(envelope.topSpeedMps, units).map((speedShown) => ({
    speedShown,
    pointsG: envelopeBoundaryG(envelope, speedShown / perMps),
  }));
}

export function carEnvelopeSvg(
  d: CarDescription,
  envelope: Envelope,
  units: DisplayUnits,
  options: SvgOptions,
): string {
  const curves = curvesOf(envelope, units);
  let maxG = 0.5;
  for (const curve of curves)
    for (const [lat, lon] of curve.pointsG) maxG = Math.max(maxG, Math.abs(lat), Math.abs(lon));
  maxG = Math.ceil(maxG * 1.08 * 4) / 4;
  const plot = SIZE - PAD - 20;
  const left = PAD;
  const right = PAD + plot;
  const top = TOP;
  const bottom = TOP + plot;
  const lateral = linearScale([-maxG, maxG], [left, right]);
  const longitudinal = linearScale([-maxG, maxG], [bottom, top]);
  let body = `<text class="chart-title" x="14" y="18" font-size="13" font-weight="600">${escapeHtml(`g-g-v envelope of the ${d.model} model`)}</text>`;
  body += ggGridSvg({ maxG, lateral, longitudinal, left, right, top, bottom });
  body += `<text x="${coord((left + right) / 2)}" y="${bottom + 32}" text-anchor="middle" fill="${PALETTE.axis}">lateral acceleration, g (left turn +)</text>`;
  body += `<text transform="translate(16 ${coord((top + bottom) / 2)}) rotate(-90)" text-anchor="middle" fill="${PALETTE.axis}">longitudinal acceleration, g (drive +, braking −)</text>`;
  const styled = curves.map((curve, k) => ({ ...curve, ...seriesStyle(k) }));
  for (const curve of styled) {
    const path =
      curve.pointsG
        .map(([lat, lon], k) => `${k ? 'L' : 'M'}${coord(lateral(lat))},${coord(longitudinal(lon))}`)
        .join('') + 'Z';
    body += `<path class="envelope" data-speed="${curve.speedShown}" d="${path}" fill="none" stroke="${curve.colour}" stroke-width="1.6"${curve.dash ? ` stroke-dasharray="${curve.dash}"` : ''}/>`;
  }
  body += `<rect x="${left}" y="${top}" width="${plot}" height="${plot}" fill="none" stroke="#bdbdbd"/>`;
  body += curveLabelsSvg(
    styled.map((curve) => ({
      text: `${curve.speedShown} ${units.speedLabel}`,
      colour: curve.colour,
      pointsG: curve.pointsG,
    })),
    ([lat, lon]) => [lateral(lat), longitudinal(lon)],
    { x: left, y: top, width: plot, height: plot },
  );
  return svgElement(
    'car-envelope',
    SIZE,
    bottom + 44,
    body,
    options,
    `g-g-v envelope of ${d.name}: longitudinal against lateral acceleration, g, at ${curves.map((c) => c.speedShown).join(', ')} ${units.speedLabel}`,
  );
}

function envelopeTableHtml(d: CarDescription, envelope: Envelope, units: DisplayUnits): string {
  const perMps = units.speed(1);
  const rows = curveSpeedsShown(envelope.topSpeedMps, units)
    .map((speedShown) => {
      const v = speedShown / perMps;
      const g = (mps2: number) => plainNumber(mps2ToG(mps2), 2);
      return `<tr><td>${speedShown}</td><td>${g(envelope.lateralLimitMps2(v, 1))}</td><td>${g(envelope.accelLimitMps2(v, 0))}</td><td>${g(envelope.brakeLimitMps2(v, 0))}</td></tr>`;
    })
    .join('');
  return (
    `<section class="corners"><h2>The envelope at each speed</h2><p class="hint">Straight-line drive and braking, and the lateral limit in a left turn, of the ${escapeHtml(d.model)} model.</p>` +
    `<div class="table-wrap"><table><thead><tr><th>speed, ${units.speedLabel}</th><th>lateral, g</th><th>drive, g</th><th>braking, g</th></tr></thead>` +
    `<tbody>${rows}</tbody></table></div></section>`
  );
}

/** The whole car page as one string; pure (no I/O). */
export function carPageHtml(
  d: CarDescription,
  envelope: Envelope,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const speed = (speedKph: number) => `${plainNumber(units.speed(speedKph / 3.6), 0)} ${units.speedLabel}`;
  const tiles = [
    tile(
      'Mass with fuel',
      `${plainNumber(d.totalMassKg, 0)} kg`,
      `${plainNumber(100 * d.frontWeightFraction, 1)} % on the front axle`,
    ),
    tile(
      'Understeer gradient',
      d.understeerGradientDegPerG === null ? 'not known' : `${plainNumber(d.understeerGradientDegPerG, 2)} deg/g`,
      d.steer ?? 'no wheelbase or cornering stiffnesses in the car file',
    ),
  ];
  if (d.characteristicSpeedKph !== null)
    tiles.push(tile('Characteristic speed', speed(d.characteristicSpeedKph), 'steer doubles its kinematic value'));
  if (d.criticalSpeedKph !== null)
    tiles.push(tile('Critical speed', speed(d.criticalSpeedKph), 'directionally unstable above it'));
  tiles.push(tile('Top speed', speed(d.topSpeedKph), 'where drive meets drag'));
  return htmlPage({
    title: `Car: ${d.name}`,
    subtitle: `The ${d.model} model's g-g-v envelope: what the tyres and the engine give at each speed`,
    header: `<section class="summary" aria-label="Car summary">${tiles.join('')}</section>`,
    main:
      `<section class="panel car-panel">${carEnvelopeSvg(d, envelope, units, { standalone: false })}</section>\n` +
      `<section class="panel">${envelopeTableHtml(d, envelope, units)}</section>`,
    caution: CAR_CAUTION,
    footerNote:
      'Made by reflap. Colours: Okabe–Ito palette, chosen to stay readable for colour-blind readers; after seven curves the lines repeat the colours dashed.',
  });
}
