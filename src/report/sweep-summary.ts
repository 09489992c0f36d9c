// A sweep for people and programs: the terminal summary (quickest and slowest runs, the runs themselves when
// few, the sensitivity table around the baseline) and the JSON object with non-finite values as null.

import type { Sensitivity, SweepTable } from '../sweep/table.js';
import { formatTable } from './text-table.js';
import { SAFETY_CAUTION } from './lap-summary.js';
import { sensitivityRows } from './sweep-format.js';
import { formatLapTime } from '../units.js';
import { displayUnits, type DisplayUnits } from './units.js';

function sensitivityText(table: SweepTable, found: Sensitivity[], units: DisplayUnits): string {
  if (found.length === 0) return 'No sensitivities: the runs around the baseline are not in this table.\n';
  const { header, rows } = sensitivityRows(table, found, units);
  return `Sensitivity around the baseline (central differences; braking point: negative = earlier)\n${formatTable(header, rows)}\n`;
}

export function sweepSummaryText(
  table: SweepTable,
  found: Sensitivity[],
  complete: boolean,
  out: string | undefined,
  units: DisplayUnits = displayUnits('metric'),
): string {
  const { meta, records } = table;
  const sweepRuns = records.filter((r) => r.kind === 'grid' || r.kind === 'oat');
  const lines = [
    `${meta.trackName} · ${meta.carName} · ${meta.mode} sweep of ${meta.fields.join(', ')}`,
    `${records.length} of ${meta.totalRuns} runs${complete ? '' : ' (one shard)'}`,
  ];
  const baseline = records.find((r) => r.kind === 'baseline');
  if (baseline)
    lines.push(
      `Baseline lap ${formatLapTime(baseline.lapTimeS)} (${meta.fields.map((f, k) => `${f} ${meta.baseValues[k]}`).join(', ')})`,
    );
  if (sweepRuns.length > 0) {
    const best = sweepRuns.reduce((a, b) => (b.lapTimeS < a.lapTimeS ? b : a));
    const worst = sweepRuns.reduce((a, b) => (b.lapTimeS > a.lapTimeS ? b : a));
    const at = (r: typeof best) => meta.fields.map((f, k) => `${f} ${r.values[k]}`).join(', ');
    lines.push(
      `Quickest ${formatLapTime(best.lapTimeS)} at ${at(best)}`,
      `Slowest  ${formatLapTime(worst.lapTimeS)} at ${at(worst)}`,
    );
  }
  lines.push('');
  if (!out && sweepRuns.length <= 40 && sweepRuns.length > 0) {
    lines.push(
      formatTable(
        ['run', ...meta.fields, 'lap s', ...meta.corners.map((c) => `${c.tag} brake ${units.distanceLabel}`)],
        sweepRuns.map((r) => [
          String(r.run),
          ...r.values.map(String),
          r.lapTimeS.toFixed(3),
          ...r.brakingPointM.map((m) => (Number.isFinite(m) ? units.distance(m).toFixed(1) : '-')),
        ]),
      ),
      '',
    );
  } else if (!out) {
    lines.push('Use --out FILE to keep every run (lap time and braking points) as CSV.', '');
  } else {
    lines.push(`Runs written to ${out}`, '');
  }
  lines.push(sensitivityText(table, found, units).trimEnd(), '', SAFETY_CAUTION);
  return lines.join('\n') + '\n';
}

export function sweepJson(table: SweepTable, found: Sensitivity[], complete: boolean) {
  const nan = (v: number) => (Number.isFinite(v) ? v : null);
  return {
    meta: { ...table.meta, baseValues: table.meta.baseValues.map(nan) },
    complete,
    runs: table.records.map((r) => ({
      ...r,
      values: r.values.map(nan),
      brakingPointM: r.brakingPointM.map(nan),
      entrySpeedKph: r.entrySpeedKph.map(nan),
      minSpeedKph: r.minSpeedKph.map(nan),
    })),
    sensitivities: found,
  };
}
