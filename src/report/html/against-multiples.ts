// Small multiples of a lap against another lap, one small chart per corner: the driver's and the other lap's speed
// and brake over the corner's stretch with the reference dashed, the session page's corner charts
// (corner-multiples.ts) drawn for two laps, so a coach reads each corner's braking and slowest point at a glance.

import { cornerTracesCollector } from '../../compare/session/corner-traces.js';
import type { DriverLap } from '../../compare/types.js';
import { cornerMultipleSvg, cornerMultiplesLegendSvg } from './corner-multiples.js';
import { escapeHtml } from './escape.js';
import { cornerRangeM, type ReportModel } from './model.js';
import { PALETTE } from './palette.js';
import type { LegendItem } from './svg-frame.js';

const DRIVER = 1;
const OTHER = 2;

/** A lap's brake share, or zeros where its log has none (its name says so). */
function brakeOf(lap: DriverLap): Float64Array {
  return lap.brake ?? new Float64Array(lap.speedMps.length);
}

/** The corner charts of a lap-against-lap page; empty without a second lap. */
export function againstMultiplesHtml(model: ReportModel): string {
  const driver = model.input.comparison?.driver;
  const against = model.input.against;
  if (!driver || !against || model.corners.length === 0) return '';
  const reference = model.input.reference;
  const windows = model.corners.map((corner) => {
    const [fromM, toM] = cornerRangeM(corner, model.lengthM);
    return { id: corner.id, fromM, toM };
  });
  const collector = cornerTracesCollector(reference.track, windows, reference);
  collector.add(DRIVER, { speedMps: driver.speedMps, brake: brakeOf(driver), brakeEstimated: false });
  collector.add(OTHER, { speedMps: against.other.speedMps, brake: brakeOf(against.other), brakeEstimated: false });
  const otherLabel = against.result.label;
  const picked = new Map([
    [DRIVER, { colour: PALETTE.driver, name: `driver${driver.brake ? '' : ' (no brake channel)'}` }],
    [OTHER, { colour: PALETTE.other, name: `${otherLabel}${against.other.brake ? '' : ' (no brake channel)'}` }],
  ]);
  const legend: LegendItem[] = [
    { label: 'driver', colour: PALETTE.driver },
    { label: otherLabel, colour: PALETTE.other },
    { label: 'reference', colour: PALETTE.reference, dash: '6 3' },
  ];
  const charts = collector.traces.map((traces, c) => {
    const corner = model.corners[c]!;
    const title = corner.name ? `Corner ${corner.id}: ${corner.name}` : `Corner ${corner.id}`;
    const svg = cornerMultipleSvg({ traces, title, units: model.units, picked }, { standalone: false });
    return `<div class="multiple">${svg}</div>`;
  });
  return (
    `<section class="panel multiples-panel" aria-label="Speed and brake, corner by corner"><h2>Speed and brake, corner by corner</h2>` +
    `<p class="hint">Speed (above) and brake (below) of the driver and ${escapeHtml(otherLabel)} over each corner, the reference dashed.</p>` +
    `${cornerMultiplesLegendSvg({ standalone: false }, legend)}<div class="multiples">${charts.join('')}</div></section>`
  );
}
