// The sweep CSV: `#` lines describing the sweep (the same in every shard), one header row, one row per run
// in run order. Numbers are written with fixed digits, so shards merged in run order equal the unsharded file byte for byte.

import { parse } from 'csv-parse/sync';
import { InputError } from '../errors.js';
import { RUN_KINDS, type RunKind } from './plan.js';
import { VALUES_PER_CORNER } from './evaluate.js';
import { DIGITS, type SweepCorner, type SweepMeta, type SweepRecord, type SweepTable } from './table.js';

const MAGIC = '# reflap sweep v1';

const number = (value: number, digits?: number): string =>
  Number.isFinite(value) ? (digits === undefined ? String(value) : value.toFixed(digits)) : '';
const list = (values: readonly (number | string)[]): string =>
  values.map((v) => (typeof v === 'number' ? (Number.isFinite(v) ? String(v) : 'none') : v)).join('; ');

/** Column names: run, kind, varies, one per field, lap_time_s, then per braking zone <tag>_brake_m, <tag>_entry_kph,
 * <tag>_min_kph, where the tag names the corner the zone serves (c3, or c3b for a second zone of corner 3). */
export function sweepColumns(meta: Pick<SweepMeta, 'fields' | 'corners'>): string[] {
  const columns = ['run', 'kind', 'varies', ...meta.fields, 'lap_time_s'];
  for (const corner of meta.corners)
    columns.push(`${corner.tag}_brake_m`, `${corner.tag}_entry_kph`, `${corner.tag}_min_kph`);
  return columns;
}

export function sweepCsvHeader(meta: SweepMeta): string {
  const lines = [
    MAGIC,
    `# track: ${meta.trackName.replace(/[\r\n]/g, ' ')}`,
    `# track-length-m: ${number(meta.trackLengthM, 3)}`,
    `# step-m: ${number(meta.stepM)}`,
    `# car: ${meta.carName.replace(/[\r\n]/g, ' ')}`,
    `# mode: ${meta.mode}`,
    `# fields: ${list(meta.fields)}`,
    `# units: ${list(meta.units)}`,
    `# baseline: ${list(meta.baseValues)}`,
    `# difference-steps: ${list(meta.differenceSteps)}`,
    `# vary: ${list(meta.variations)}`,
    `# set: ${list(meta.settings)}`,
    `# runs: ${meta.totalRuns}`,
    `# corner-tags: ${meta.corners.map((c) => c.tag).join('; ')}`,
    `# corner-names: ${meta.corners.map((c) => (c.name ?? '').replace(/[;\r\n]/g, ' ')).join('; ')}`,
    `# corner-braking-points-m: ${meta.corners.map((c) => number(c.brakingPointM, DIGITS.brakingPointM)).join('; ')}`,
    `# corner-slowest-points-m: ${meta.corners.map((c) => number(c.minSpeedAtM, DIGITS.brakingPointM)).join('; ')}`,
    sweepColumns(meta).join(','),
  ];
  return lines.join('\n') + '\n';
}

export function sweepCsvRow(record: SweepRecord): string {
  const cells = [
    String(record.run),
    record.kind,
    record.varies,
    ...record.values.map((v) => number(v)),
    number(record.lapTimeS, DIGITS.lapTimeS),
  ];
  for (let k = 0; k < record.brakingPointM.length; k++) {
    cells.push(
      number(record.brakingPointM[k]!, DIGITS.brakingPointM),
      number(record.entrySpeedKph[k]!, DIGITS.speedKph),
      number(record.minSpeedKph[k]!, DIGITS.speedKph),
    );
  }
  return cells.join(',') + '\n';
}

export function sweepCsv(table: SweepTable): string {
  return sweepCsvHeader(table.meta) + table.records.map(sweepCsvRow).join('');
}

function splitList(text: string): string[] {
  return text.trim() === '' ? [] : text.split(';').map((s) => s.trim());
}

const numberOrNaN = (text: string): number => (text === '' || text === 'none' ? Number.NaN : Number(text));

/** Reads a sweep CSV back (for --merge and for reports); errors name the file and line. */
export function parseSweepCsv(text: string, source: string): SweepTable {
  const lines = text.split('\n');
  if (lines[0] !== MAGIC) throw new InputError(`${source}: line 1: not a reflap sweep CSV (expected '${MAGIC}')`);
  const meta = new Map<string, string>();
  let row = 1;
  while (row < lines.length && lines[row]!.startsWith('#')) {
    const line = lines[row]!.slice(1).trim();
    const colon = line.indexOf(':');
    if (colon > 0) meta.set(line.slice(0, colon), line.slice(colon + 1).trim());
    row++;
  }
  const get = (key: string): string => {
    const value = meta.get(key);
    if (value === undefined) throw new InputError(`${source}: missing '# ${key}:' line`);
    return value;
  };
  const fields = splitList(get('fields'));
  const brakes = splitList(get('corner-braking-points-m')).map(Number);
  const slowest = splitList(get('corner-slowest-points-m')).map(Number);
  const tags = splitList(get('corner-tags'));
  const names = splitList(meta.get('corner-names') ?? '');
  const corners: SweepCorner[] = brakes.map((brakingPointM, k) => ({
    corner: Number(/^c(\d+)/.exec(tags[k] ?? '')?.[1] ?? k + 1),
    tag: tags[k] ?? `c${k + 1}`,
    name: names[k] ? names[k]! : null,
    brakingPointM,
    minSpeedAtM: slowest[k] ?? Number.NaN,
  }));
  const parsedMeta: SweepMeta = {
    trackName: get('track'),
    trackLengthM: Number(get('track-length-m')),
    stepM: Number(get('step-m')),
    carName: get('car'),
    mode: get('mode'),
    fields,
    units: splitList(get('units')),
    baseValues: splitList(get('baseline')).map(numberOrNaN),
    differenceSteps: splitList(get('difference-steps')).map(Number),
    variations: splitList(get('vary')),
    settings: splitList(get('set')),
    totalRuns: Number(get('runs')),
    corners,
  };
  const expectedColumns = sweepColumns(parsedMeta).join(',');
  if (lines[row] !== expectedColumns)
    throw new InputError(
      `${source}: line ${row + 1}: the column header does not match the '# fields' and corner lines`,
    );
  const body = lines.slice(row + 1).join('\n');
  const cells = parse(body, { relax_column_count: false, skip_empty_lines: true }) as string[][];
  const width = 4 + fields.length + VALUES_PER_CORNER * corners.length;
  const records: SweepRecord[] = cells.map((cell, r) => {
    const where = `${source}: line ${row + 2 + r}`;
    if (cell.length !== width) throw new InputError(`${where}: ${cell.length} cells, expected ${width}`);
    const kind = cell[1] as RunKind;
    if (!RUN_KINDS.includes(kind)) throw new InputError(`${where}: unknown run kind '${cell[1]}'`);
    const run = Number(cell[0]);
    if (!Number.isInteger(run) || run < 0 || run >= parsedMeta.totalRuns)
      throw new InputError(`${where}: run '${cell[0]}' is not between 0 and ${parsedMeta.totalRuns - 1}`);
    const after = 3 + fields.length;
    const record: SweepRecord = {
      run,
      kind,
      varies: cell[2]!,
      values: cell.slice(3, after).map(numberOrNaN),
      lapTimeS: numberOrNaN(cell[after]!),
      brakingPointM: [],
      entrySpeedKph: [],
      minSpeedKph: [],
    };
    for (let k = 0; k < corners.length; k++) {
      const c = after + 1 + VALUES_PER_CORNER * k;
      record.brakingPointM.push(numberOrNaN(cell[c]!));
      record.entrySpeedKph.push(numberOrNaN(cell[c + 1]!));
      record.minSpeedKph.push(numberOrNaN(cell[c + 2]!));
    }
    return record;
  });
  return { meta: parsedMeta, records };
}

/**
 * Joins shard CSVs of one sweep into the CSV the unsharded run writes: the `#` lines and header must agree,
 * every run must appear once (a run given twice must be identical), and rows come out in run order.
 */
export function mergeSweepCsv(files: readonly { text: string; source: string }[]): { csv: string; table: SweepTable } {
  if (files.length === 0) throw new InputError('--merge: give the shard CSV files to join');
  const first = files[0]!;
  const firstTable = parseSweepCsv(first.text, first.source);
  const header = sweepCsvHeader(firstTable.meta);
  const firstHeaderText = first.text.slice(0, first.text.indexOf(sweepColumns(firstTable.meta).join(',')));
  const rows = new Map<number, { line: string; record: SweepRecord; source: string }>();
  for (const file of files) {
    const table = file === first ? firstTable : parseSweepCsv(file.text, file.source);
    const headerText = file.text.slice(0, file.text.indexOf(sweepColumns(table.meta).join(',')));
    if (headerText !== firstHeaderText || sweepCsvHeader(table.meta) !== header) {
      const a = firstHeaderText.split('\n');
      const b = headerText.split('\n');
      const line = a.findIndex((text, k) => text !== b[k]);
      throw new InputError(
        `${file.source}: line ${line + 1}: not a shard of the same sweep as ${first.source} ('${b[line] ?? ''}' against '${a[line] ?? ''}')`,
      );
    }
    for (const record of table.records) {
      const line = sweepCsvRow(record);
      const earlier = rows.get(record.run);
      if (earlier && earlier.line !== line)
        throw new InputError(`${file.source}: run ${record.run} differs from the same run in ${earlier.source}`);
      rows.set(record.run, { line, record, source: file.source });
    }
  }
  const total = firstTable.meta.totalRuns;
  if (rows.size !== total) {
    const missing: number[] = [];
    for (let run = 0; run < total && missing.length < 5; run++) if (!rows.has(run)) missing.push(run);
    throw new InputError(
      `--merge: ${total - rows.size} of ${total} runs are missing (first: ${missing.join(', ')}); is a shard left out?`,
    );
  }
  const ordered = [...rows.values()].sort((x, y) => x.record.run - y.record.run);
  return {
    csv: header + ordered.map((r) => r.line).join(''),
    table: { meta: firstTable.meta, records: ordered.map((r) => r.record) },
  };
}
