// The sweep's report page: lap time and each corner's braking-point shift against every swept field, the
// sensitivity table around the baseline and the caution, in the lap report's frame, style and palette.
// Pure: the CLI writes the strings.

import { sensitivities, type Sensitivity, type SweepTable } from '../sweep/table.js';
import { formatLapTime } from '../units.js';
import { escapeHtml } from './html/escape.js';
import { htmlPage } from './html/page-frame.js';
import type { ChartSvg } from './html/page.js';
import type { SvgOptions } from './html/svg-frame.js';
import { tile } from './html/tables.js';
import { xyChartSvg } from './html/xy-chart.js';
import { sweepChartSpecs } from './sweep-charts.js';
import { sensitivityRows } from './sweep-format.js';
import { displayUnits, type DisplayUnits } from './units.js';

function charts(table: SweepTable, options: SvgOptions, units: DisplayUnits): ChartSvg[] {
  return sweepChartSpecs(table, units).map((spec) => ({
    name: `${spec.name}.svg`,
    title: spec.title,
    svg: xyChartSvg(spec, options),
  }));
}

/** Each chart of the sweep page as a standalone SVG file. */
export function sweepChartSvgs(table: SweepTable, units: DisplayUnits = displayUnits('metric')): ChartSvg[] {
  return charts(table, { standalone: true }, units);
}

function summaryTiles(table: SweepTable): string {
  const { meta, records } = table;
  const tiles = [
    tile(
      'Runs',
      `${records.length}`,
      records.length === meta.totalRuns ? `${meta.mode} sweep` : `of ${meta.totalRuns} (one shard)`,
    ),
  ];
  const baseline = records.find((r) => r.kind === 'baseline');
  if (baseline)
    tiles.push(
      tile(
        'Baseline lap',
        formatLapTime(baseline.lapTimeS),
        meta.fields.map((f, k) => `${f} ${meta.baseValues[k]}`).join(', '),
      ),
    );
  const swept = records.filter((r) => r.kind === 'grid' || r.kind === 'oat');
  if (swept.length > 0) {
    const at = (r: (typeof swept)[number]) => meta.fields.map((f, k) => `${f} ${r.values[k]}`).join(', ');
    const best = swept.reduce((a, b) => (b.lapTimeS < a.lapTimeS ? b : a));
    const worst = swept.reduce((a, b) => (b.lapTimeS > a.lapTimeS ? b : a));
    tiles.push(
      tile('Quickest', formatLapTime(best.lapTimeS), at(best)),
      tile('Slowest', formatLapTime(worst.lapTimeS), at(worst)),
    );
  }
  tiles.push(tile('Corners', String(meta.corners.length), 'braking zones of the baseline'));
  return `<section class="summary" aria-label="Sweep summary">${tiles.join('')}</section>`;
}

export function sensitivityTableHtml(
  table: SweepTable,
  found: Sensitivity[],
  units: DisplayUnits = displayUnits('metric'),
): string {
  const heading = '<h2>Sensitivity around the baseline</h2>';
  if (found.length === 0)
    return `<section class="sensitivity">${heading}<p>No sensitivities: the runs around the baseline are not in this table.</p></section>`;
  const { header, rows: cells } = sensitivityRows(table, found, units);
  const head = `<tr>${header.map((title) => `<th>${escapeHtml(title)}</th>`).join('')}</tr>`;
  const rows = cells.map(
    ([label, ...values]) =>
      `<tr><td>${escapeHtml(label ?? '')}</td>${values.map((cell) => `<td>${escapeHtml(cell)}</td>`).join('')}</tr>`,
  );
  return (
    `<section class="sensitivity">${heading}<p class="hint">Central differences (f(x + h) − f(x − h)) / 2h around the baseline, times the step in each column's header. Braking point: negative = earlier for more of the field.</p>` +
    `<div class="table-wrap"><table><thead>${head}</thead><tbody>${rows.join('')}</tbody></table></div></section>`
  );
}

/** The whole sweep page as one string. It needs no script: each point's values show as its tooltip. */
export function sweepReportHtml(table: SweepTable, units: DisplayUnits = displayUnits('metric')): string {
  const { meta } = table;
  const svgs = charts(table, { standalone: false }, units);
  const byField = meta.fields.map(
    (field, k) =>
      `<section class="panel" aria-label="${escapeHtml(field)}"><div class="chart-pair">${svgs[2 * k]!.svg}${svgs[2 * k + 1]!.svg}</div></section>`,
  );
  const changes = [...meta.variations.map((v) => `vary ${v}`), ...meta.settings.map((s) => `set ${s}`)].join('; ');
  return htmlPage({
    title: `Setup sweep: ${meta.trackName} · ${meta.carName}`,
    subtitle: `${meta.mode} sweep of ${meta.fields.join(', ')} (${changes}), track ${units.length(meta.trackLengthM).toFixed(3)} ${units.lengthLabel} at a ${Number(units.distance(meta.stepM).toPrecision(4))} ${units.distanceLabel} step`,
    header: summaryTiles(table),
    main: `${byField.join('\n')}\n<section class="panel">${sensitivityTableHtml(table, sensitivities(table), units)}</section>`,
    footerNote:
      'Made by reflap. Each point is one run; hold the pointer on a point for its values. Braking-point shifts are from the baseline’s braking point of each corner. ' +
      'Colours: Okabe–Ito palette, chosen to stay readable for colour-blind readers; after seven corners the lines repeat the colours dashed.',
  });
}
