// The lap report as one self-contained HTML page: charts as inline SVG (d3-shape paths built here), one
// inline style sheet and one inline script admitted by a Content-Security-Policy hash, no network at all.

import { noteText } from '../note-text.js';
import { clientScript } from './client-script.js';
import { distanceChartSvg, DRAW_BUCKET_M } from './distance-chart.js';
import { htmlPage } from './page-frame.js';
import { distanceCharts } from './distance-charts.js';
import { ggDiagramSvg, ggFrame } from './gg-diagram.js';
import {
  cornerRangeM,
  reportModel,
  type LapChannels,
  type OtherLapChannels,
  type ReportInput,
  type ReportModel,
} from './model.js';
import { strideIndices } from './downsample.js';
import { cornerTableHtml, findingsHtml, summaryHtml } from './tables.js';
import { againstFindingsHtml, againstTableHtml } from './against-tables.js';
import { againstMultiplesHtml } from './against-multiples.js';
import { cornerMultipleCharts, sessionSectionsHtml } from './session-sections.js';
import { mapPoint, mapProjection, trackMapSvg } from './track-map.js';
import type { SvgOptions } from './svg-frame.js';
import { roundToDigits } from '../../numeric/round.js';
import { escapeHtml } from './escape.js';

/** Hover values are kept for at most this many points along the lap. */
const MAX_HOVER_POINTS = 2500;

export interface ChartSvg {
  /** File name for --svg, e.g. 'speed.svg'. */
  name: string;
  title: string;
  svg: string;
}

function allCharts(model: ReportModel, options: SvgOptions): ChartSvg[] {
  const charts: ChartSvg[] = [
    { name: 'track-map.svg', title: 'Track map', svg: trackMapSvg(model, options) },
    { name: 'g-g.svg', title: 'g-g diagram', svg: ggDiagramSvg(model, options) },
  ];
  if (model.other)
    charts.push({ name: 'gain-map.svg', title: 'Gain and loss map', svg: trackMapSvg(model, options, 'gain') });
  const session = model.input.session;
  const multiples = session ? cornerMultipleCharts(session, options, model.units) : [];
  for (const spec of distanceCharts(model))
    charts.push({ name: `${spec.name}.svg`, title: spec.title, svg: distanceChartSvg(spec, options) });
  return [...charts, ...multiples];
}

/** Each chart as a standalone SVG file (with its namespace), for slides and documents. */
export function chartSvgs(input: ReportInput): ChartSvg[] {
  return allCharts(reportModel(input), { standalone: true });
}

function rounded(values: ArrayLike<number> | null | undefined, indices: number[], digits: number): number[] | null {
  if (!values) return null;
  return indices.map((i) => {
    const v = values[i]!;
    return Number.isFinite(v) ? roundToDigits(v, digits) : 0;
  });
}

/** One lap's hover values under the page data's short names (speed, throttle, brake, grip use, accelerations). */
function lapSeries(
  who: 'R' | 'D' | 'O',
  lap: (Partial<LapChannels> & OtherLapChannels) | null,
  indices: number[],
): Record<string, number[] | null> {
  return {
    [`v${who}`]: rounded(lap?.speedShown, indices, 1),
    [`t${who}`]: rounded(lap?.throttlePct, indices, 0),
    [`b${who}`]: rounded(lap?.brakePct, indices, 0),
    ...(who === 'O' ? {} : { [`g${who}`]: rounded(lap?.gripUsePct, indices, 0) }),
    [`ax${who}`]: rounded(lap?.axG, indices, 2),
    [`ay${who}`]: rounded(lap?.ayG, indices, 2),
  };
}

function pageData(model: ReportModel): unknown {
  const count = model.stationM.length;
  const indices = strideIndices(count, Math.ceil(count / MAX_HOVER_POINTS));
  const map = mapProjection(model);
  const mapX: number[] = [];
  const mapY: number[] = [];
  for (const i of indices) {
    const [x, y] = mapPoint(model, map, i);
    mapX.push(x);
    mapY.push(y);
  }
  const { reference: r, driver: d, other: o } = model;
  const band = model.input.uncertainty?.speedMps;
  const { frame } = ggFrame(model);
  const units = model.units;
  const distance = units.distance(1);
  return {
    // Distances along the lap in the page's unit, so the axes, the zoom and the read-out share one scale.
    length: model.lengthM * distance,
    d: rounded(
      model.stationM.map((m) => m * distance),
      indices,
      1,
    ),
    labels: { distance: units.distanceLabel, speed: units.speedLabel },
    mapX,
    mapY,
    gg: {
      cx: Math.round(frame.centreX * 10) / 10,
      cy: Math.round(frame.centreY * 10) / 10,
      pxPerG: Math.round(frame.pxPerG * 1000) / 1000,
    },
    series: {
      ...lapSeries('R', r, indices),
      ...lapSeries('D', d, indices),
      dt: rounded(d?.deltaS, indices, 3),
      ...lapSeries('O', o, indices),
      dtO: rounded(o?.driverDeltaS, indices, 3),
      vLo: rounded(band ? band.low.map(units.speed) : null, indices, 1),
      vHi: rounded(band ? band.high.map(units.speed) : null, indices, 1),
    },
    corners: model.corners.map((corner) => {
      const [from, to] = cornerRangeM(corner, model.lengthM);
      return {
        id: corner.id,
        from: Math.round(from * distance),
        to: Math.round(to * distance),
        label: corner.name ? `corner ${corner.id}: ${corner.name}` : `corner ${corner.id}`,
      };
    }),
  };
}

function readoutHtml(model: ReportModel): string {
  const cell = (name: string) => `<td data-field="${name}">–</td>`;
  const row = (label: string, who: 'R' | 'D' | 'O', className: string) =>
    `<tr><th class="${className}">${escapeHtml(label)}</th>${['speed', 'throttle', 'brake', 'grip', 'accel'].map((field) => cell(field + who)).join('')}</tr>`;
  const head = '<tr><th></th><th>speed</th><th>throttle</th><th>brake</th><th>grip use</th><th>long / lat</th></tr>';
  const other = model.other;
  const deltas = model.driver
    ? `<th>delta${other ? ' to reference' : ''}</th>${cell('delta')}${other ? `<th>to ${escapeHtml(other.label)}</th>${cell('deltaO')}` : ''}`
    : '';
  const distanceRow = `<tr><th>distance</th>${cell('distance')}${deltas}</tr>`;
  return (
    `<table class="readout" id="readout" aria-live="off"><thead>${head}</thead><tbody>${row('reference', 'R', 'who-r')}` +
    `${model.driver ? row('driver', 'D', 'who-d') : ''}${other ? row(other.label, 'O', 'who-o') : ''}</tbody></table>` +
    `<table class="readout"><tbody>${distanceRow}</tbody></table>`
  );
}

/** The whole report page as one string; pure (no I/O). */
export function lapReportHtml(input: ReportInput): string {
  const model = reportModel(input);
  const options: SvgOptions = { standalone: false };
  const charts = allCharts(model, options);
  const [mapSvg, ggSvg] = charts;
  const gainSvg = charts.find((chart) => chart.name === 'gain-map.svg');
  const distanceSvgs = charts.slice(gainSvg ? 3 : 2).filter((chart) => !chart.name.startsWith('corner-'));
  const session = input.session;
  const reference = input.reference;
  const trackName = reference.track.name;
  const other = model.other;
  const title = session
    ? `Session: ${trackName} · ${input.carName}`
    : input.comparison
      ? `Lap report: ${trackName} · ${input.carName} · driver against ${other ? `${other.label} and the ` : ''}reference`
      : `Reference lap: ${trackName} · ${input.carName}`;
  const subtitle = session
    ? `${session.overview.source}: ${session.overview.laps.length} laps; the best lap against the reference lap of the ${reference.envelopeKind} model`
    : input.comparison
      ? `${input.comparison.driver.source}, lap ${input.comparison.driver.lapNumber}, against ${other ? `${other.label} and ` : ''}the reference lap of the ${reference.envelopeKind} model`
      : `Reference lap of the ${reference.envelopeKind} model, grid step ${model.units.distance(reference.track.stepM).toFixed(2)} ${model.units.distanceLabel}`;
  // A session's notes (how the laps were cut, what the fitted envelope lacks) are listed above its best lap, whose
  // comparison carries the same ones.
  const sessionNotes = new Set(session?.overview.notes.map((note) => noteText(note, model.units)));
  const main = `${session ? sessionSectionsHtml(session, model.units) + summaryHtml(model) : ''}<section class="overview">
<div class="panel">${mapSvg!.svg}</div>
${gainSvg ? `<div class="panel">${gainSvg.svg}</div>` : ''}
<div class="panel">${ggSvg!.svg}</div>
</section>
<div class="controls"><div class="controls-inner"><div class="view">View: <span id="zoom-label">whole lap</span> <button type="button" id="zoom-reset" disabled>Whole lap</button></div>${readoutHtml(model)}</div></div>
<section class="panel stack" aria-label="Channels against distance">
${distanceSvgs.map((chart) => chart.svg).join('\n')}
</section>
${model.other ? `<section class="panel">${againstTableHtml(model)}</section>\n${againstMultiplesHtml(model)}\n<section class="panel">${againstFindingsHtml(model)}</section>\n` : ''}<section class="panel">${cornerTableHtml(model)}</section>
${input.comparison ? `<section class="panel">${findingsHtml(model, sessionNotes)}</section>` : ''}`;
  const hoverStep = model.units
    .distance(Math.max(1, Math.ceil(reference.trace.count / MAX_HOVER_POINTS)) * reference.track.stepM)
    .toFixed(1);
  const drawStep = Number(model.units.distance(DRAW_BUCKET_M).toPrecision(2));
  return htmlPage({
    title,
    subtitle,
    header: session ? '' : summaryHtml(model),
    main,
    footerNote: `Made by reflap. Charts are drawn about one point per ${drawStep} ${model.units.distanceLabel}; hover values every ${hoverStep} ${model.units.distanceLabel}. Colours: Okabe–Ito palette, chosen to stay readable for colour-blind readers.`,
    data: { id: 'lap-data', value: pageData(model) },
    script: clientScript(),
  });
}
