// Cheap fast-check generators for the fuzz tests: text that looks like the files users bring (CSV with odd
// dialects, JSON with odd values, NMEA sentences, GPX fragments), random valid cars and closed or open
// segment tracks, and the one check every reader must pass: a result or a one-line InputError.

import fc from 'fast-check';
import { expect } from 'vitest';
import { InputError } from '../../src/errors.js';
import { nmeaChecksum } from '../../src/io/telemetry/nmea.js';
import type { TrackSegment } from '../../src/track/segments.js';

/** Runs `read`; it must return or throw an InputError whose message is one non-empty line naming `source`. */
export function resultOrInputError<T>(read: () => T, source: string): T | null {
  try {
    return read();
  } catch (error) {
    if (!(error instanceof InputError)) {
      throw new Error(`not an InputError: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    }
    expect(error.message.length).toBeGreaterThan(0);
    expect(error.message).not.toMatch(/[\r\n]/);
    expect(error.message).toContain(source);
    return null;
  }
}

/** A cell: a plain number, an odd number (exponents, signs, decimal comma, huge), a missing marker or text. */
export const cell: fc.Arbitrary<string> = fc.oneof(
  {
    weight: 6,
    arbitrary: fc.double({ min: -1e4, max: 1e4, noNaN: true }).map((v) => String(Math.round(v * 1000) / 1000)),
  },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      '',
      'NaN',
      'nan',
      'inf',
      '-Infinity',
      '1e400',
      '-1e-400',
      '1,5',
      '"2,25"',
      'abc',
      '--',
      'null',
      '0x1F',
      '1.2.3',
      ' 7 ',
      '+.5',
      '1e308',
      '-0',
    ),
  },
  { weight: 1, arbitrary: fc.string({ maxLength: 6 }) },
);

export const separator = fc.constantFrom(',', ';', '\t');
export const lineEnd = fc.constantFrom('\n', '\r\n');

/** A CSV text from header names and rows of cells, with a separator, line ending and optional BOM or '#'. */
export function csvText(headers: fc.Arbitrary<string[]>): fc.Arbitrary<string> {
  return fc
    .record({
      headers,
      rows: fc.array(fc.array(cell, { minLength: 0, maxLength: 7 }), { maxLength: 25 }),
      separator,
      lineEnd,
      bom: fc.boolean(),
      hash: fc.boolean(),
      truncate: fc.nat({ max: 40 }),
    })
    .map(({ headers: names, rows, separator: sep, lineEnd: end, bom, hash, truncate }) => {
      const text =
        (bom ? '\uFEFF' : '') +
        (hash ? '# ' : '') +
        [names.join(sep), ...rows.map((row) => row.join(sep))].join(end) +
        end;
      // Sometimes cut the file mid-line, as an interrupted logger does.
      return truncate > 30 ? text.slice(0, Math.max(0, text.length - (truncate - 30))) : text;
    });
}

/** A numeric CSV on a well-formed grid: the common case, with a few columns and numbers only. */
export function numericCsv(headers: string[], rows: fc.Arbitrary<number[][]>): fc.Arbitrary<string> {
  return rows.map((values) => [headers.join(','), ...values.map((row) => row.join(','))].join('\n') + '\n');
}

/** Printable text, binary-looking text, and short strings: the "anything" input. */
export const anyText: fc.Arbitrary<string> = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.uint8Array({ maxLength: 200 }).map((bytes) => Buffer.from(bytes).toString('latin1')),
);

/** Any JSON value, and JSON with a few keys of the formats we read (so zod sees near misses). */
export const anyJson: fc.Arbitrary<unknown> = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  fc.dictionary(
    fc.constantFrom('name', 'closed', 'segments', 'massKg', 'tyre', 'aero', 'powertrain', 'widthM', 'x'),
    fc.jsonValue({ maxDepth: 2 }),
  ),
);

/** A segment of any kind with values from sensible to absurd. */
export const segment: fc.Arbitrary<TrackSegment> = fc.oneof(
  fc.record({ kind: fc.constant('straight' as const), lengthM: fc.double({ min: 1, max: 800, noNaN: true }) }),
  fc.record({
    kind: fc.constant('arc' as const),
    radiusM: fc.double({ min: 8, max: 600, noNaN: true }),
    angleDeg: fc.double({ min: -270, max: 270, noNaN: true }).filter((a) => Math.abs(a) > 1),
  }),
  fc.record({
    kind: fc.constant('transition' as const),
    lengthM: fc.double({ min: 1, max: 200, noNaN: true }),
    startCurvature: fc.double({ min: -0.1, max: 0.1, noNaN: true }),
    endCurvature: fc.double({ min: -0.1, max: 0.1, noNaN: true }),
  }),
);

/**
 * A closed circuit that closes by construction: a rectangle with straights a, b, a, b and four equal left
 * corners of 90 degrees, each a clothoid in, an arc and a clothoid out (heading gain k Lt of the two
 * clothoids plus the arc's angle = 90 degrees).
 */
export const closedCircuit: fc.Arbitrary<TrackSegment[]> = fc
  .record({
    a: fc.double({ min: 5, max: 600, noNaN: true }),
    b: fc.double({ min: 5, max: 600, noNaN: true }),
    radiusM: fc.double({ min: 10, max: 300, noNaN: true }),
    transitionShare: fc.double({ min: 0, max: 0.9, noNaN: true }),
  })
  .map(({ a, b, radiusM, transitionShare }) => {
    const k = 1 / radiusM;
    // Each clothoid turns k Lt / 2; together they take transitionShare of the 90 degrees.
    const transitionM = (transitionShare * (Math.PI / 2)) / k;
    const arcDeg = 90 * (1 - transitionShare);
    const corner: TrackSegment[] =
      transitionM > 0.5
        ? [
            { kind: 'transition', lengthM: transitionM, startCurvature: 0, endCurvature: k },
            { kind: 'arc', radiusM, angleDeg: arcDeg },
            { kind: 'transition', lengthM: transitionM, startCurvature: k, endCurvature: 0 },
          ]
        : [{ kind: 'arc', radiusM, angleDeg: 90 }];
    return [
      { kind: 'straight', lengthM: a },
      ...corner,
      { kind: 'straight', lengthM: b },
      ...corner,
      { kind: 'straight', lengthM: a },
      ...corner,
      { kind: 'straight', lengthM: b },
      ...corner,
    ];
  });

/** A car file (JSON value) within the reader's limits: point-mass, with or without gears, downforce, brake cap. */
export const carFile: fc.Arbitrary<Record<string, unknown>> = fc
  .record({
    massKg: fc.double({ min: 150, max: 3000, noNaN: true }),
    muLong: fc.double({ min: 0.3, max: 3, noNaN: true }),
    muLat: fc.double({ min: 0.3, max: 3, noNaN: true }),
    ggExponent: fc.double({ min: 1, max: 10, noNaN: true }),
    loadSensitivity: fc.double({ min: 0, max: 0.3, noNaN: true }),
    dragAreaM2: fc.double({ min: 0, max: 2, noNaN: true }),
    liftAreaM2: fc.double({ min: -1, max: 5, noNaN: true }),
    maxPowerW: fc.double({ min: 5e3, max: 1.2e6, noNaN: true }),
    drive: fc.constantFrom('rear', 'front', 'all'),
    rollingResistanceCoeff: fc.double({ min: 0, max: 0.05, noNaN: true }),
    maxDecelG: fc.option(fc.double({ min: 0.3, max: 4, noNaN: true }), { nil: undefined }),
    fuelKg: fc.double({ min: 0, max: 120, noNaN: true }),
    gears: fc.option(fc.array(fc.double({ min: 0.6, max: 4, noNaN: true }), { minLength: 1, maxLength: 7 }), {
      nil: undefined,
    }),
  })
  .map((v) => {
    const powertrain: Record<string, unknown> = { maxPowerW: v.maxPowerW, drive: v.drive };
    if (v.gears) {
      powertrain['gearRatios'] = [...v.gears].sort((x, y) => y - x);
      powertrain['finalDrive'] = 3.7;
      powertrain['wheelRadiusM'] = 0.31;
      powertrain['torqueCurve'] = { rpm: [1000, 4000, 7000], torqueNm: [150, 260, 210] };
      powertrain['shiftTimeS'] = 0.1;
    }
    return {
      name: 'fuzzed car',
      massKg: v.massKg,
      rollingResistanceCoeff: v.rollingResistanceCoeff,
      tyre: { muLong: v.muLong, muLat: v.muLat, ggExponent: v.ggExponent, loadSensitivity: v.loadSensitivity },
      aero: { dragAreaM2: v.dragAreaM2, liftAreaM2: v.liftAreaM2 },
      powertrain,
      ...(v.maxDecelG !== undefined ? { brakes: { maxDecelG: v.maxDecelG } } : {}),
      fuel: { massKg: v.fuelKg },
    };
  });

/** One NMEA line: RMC or GGA with plausible or broken fields, a right, wrong or missing checksum. */
export const nmeaLine: fc.Arbitrary<string> = fc
  .record({
    talker: fc.constantFrom('GP', 'GN', 'GL'),
    kind: fc.oneof(
      { weight: 6, arbitrary: fc.constantFrom('RMC', 'GGA') },
      { weight: 1, arbitrary: fc.constantFrom('GSV', 'VTG') },
    ),
    second: fc.nat({ max: 86399 }),
    fraction: fc.constantFrom('', '.00', '.5', '.25'),
    lat: fc.double({ min: 0, max: 89.9, noNaN: true }),
    lon: fc.double({ min: 0, max: 179.9, noNaN: true }),
    ns: fc.oneof(
      { weight: 9, arbitrary: fc.constantFrom('N', 'S') },
      { weight: 1, arbitrary: fc.constantFrom('X', '') },
    ),
    ew: fc.oneof({ weight: 9, arbitrary: fc.constantFrom('E', 'W') }, { weight: 1, arbitrary: fc.constant('') }),
    knots: fc.constantFrom('', '0.0', '12.5', '88.2', 'x'),
    status: fc.oneof({ weight: 9, arbitrary: fc.constant('A') }, { weight: 1, arbitrary: fc.constant('V') }),
    checksum: fc.oneof(
      { weight: 7, arbitrary: fc.constant('right') },
      { weight: 1, arbitrary: fc.constantFrom('wrong', 'none', 'garbled') },
    ),
    garbage: fc.option(fc.string({ maxLength: 8 }), { nil: undefined, freq: 8 }),
  })
  .map((v) => {
    const hh = String(Math.floor(v.second / 3600)).padStart(2, '0');
    const mm = String(Math.floor((v.second % 3600) / 60)).padStart(2, '0');
    const ss = String(v.second % 60).padStart(2, '0');
    const time = `${hh}${mm}${ss}${v.fraction}`;
    const angle = (deg: number, digits: number) =>
      `${String(Math.floor(deg)).padStart(digits, '0')}${((deg % 1) * 60).toFixed(4).padStart(7, '0')}`;
    const lat = angle(v.lat, 2);
    const lon = angle(v.lon, 3);
    const fields =
      v.kind === 'RMC'
        ? [`${v.talker}RMC`, time, v.status, lat, v.ns, lon, v.ew, v.knots, '0.0', '150626', '', '']
        : [
            `${v.talker}${v.kind}`,
            time,
            lat,
            v.ns,
            lon,
            v.ew,
            v.status === 'A' ? '1' : '0',
            '08',
            '0.9',
            '100.0',
            'M',
            '',
            'M',
            '',
            '',
          ];
    let body = fields.join(',');
    if (v.garbage !== undefined) body += v.garbage;
    const sum = nmeaChecksum(body);
    const star =
      v.checksum === 'right'
        ? `*${sum.toString(16).toUpperCase().padStart(2, '0')}`
        : v.checksum === 'wrong'
          ? `*${((sum + 1) & 255).toString(16).toUpperCase().padStart(2, '0')}`
          : v.checksum === 'garbled'
            ? '*ZZ'
            : '';
    return `$${body}${star}`;
  });

/** A GPX document or a near miss of one: points with or without time, lat/lon, speed; sometimes cut short. */
export const gpxText: fc.Arbitrary<string> = fc
  .record({
    points: fc.array(
      fc.record({
        lat: fc.oneof(
          { weight: 9, arbitrary: fc.double({ min: 47, max: 47.01, noNaN: true }).map(String) },
          {
            weight: 1,
            arbitrary: fc.oneof(fc.double({ min: -95, max: 95, noNaN: true }).map(String), fc.constantFrom('', 'x')),
          },
        ),
        lon: fc.oneof(
          { weight: 9, arbitrary: fc.double({ min: 8, max: 8.01, noNaN: true }).map(String) },
          {
            weight: 1,
            arbitrary: fc.oneof(fc.double({ min: -185, max: 185, noNaN: true }).map(String), fc.constantFrom('', 'y')),
          },
        ),
        second: fc.option(fc.nat({ max: 5000 }), { nil: undefined, freq: 12 }),
        speed: fc.option(fc.double({ min: 0, max: 90, noNaN: true }), { nil: undefined }),
      }),
      { maxLength: 20 },
    ),
    cut: fc.nat({ max: 60 }),
    sorted: fc.oneof({ weight: 4, arbitrary: fc.constant(true) }, { weight: 1, arbitrary: fc.constant(false) }),
  })
  .map(({ points, cut, sorted }) => {
    // Mostly in time order, as a logger writes them; sometimes not.
    if (sorted) points.sort((p, q) => (p.second ?? 0) - (q.second ?? 0));
    const body = points
      .map((p) => {
        const time =
          p.second === undefined
            ? ''
            : `<time>${new Date(Date.UTC(2026, 5, 15, 10, 0, p.second)).toISOString()}</time>`;
        const speed = p.speed === undefined ? '' : `<extensions><speed>${p.speed}</speed></extensions>`;
        return `<trkpt lat="${p.lat}" lon="${p.lon}">${time}${speed}</trkpt>`;
      })
      .join('');
    const text = `<?xml version="1.0"?><gpx version="1.1" creator="test"><trk><trkseg>${body}</trkseg></trk></gpx>`;
    return cut > 50 ? text.slice(0, text.length - (cut - 50) * 3) : text;
  });

/**
 * Run parameters: a fixed seed by default, so CI is reproducible; FUZZ_SEED=n explores other cases and
 * FUZZ_RUNS_SCALE=k multiplies every run count (a long local soak).
 */
export function runs(numRuns: number, seed: number): fc.Parameters<unknown> {
  const scale = Number(process.env['FUZZ_RUNS_SCALE'] ?? 1);
  const chosen = process.env['FUZZ_SEED'];
  return {
    numRuns: Math.max(1, Math.round(numRuns * scale)),
    seed: chosen !== undefined ? Number(chosen) + seed : seed,
  };
}

/** A value at, just inside or beyond an edge of a range, or a value no range admits; `expected` is what it is. */
export interface EdgeValue {
  value: unknown;
  /** Written into a JSON file as this text (NaN and Infinity have no JSON spelling: the file is then not JSON). */
  json: string;
  label: string;
}

const numberEdge = (value: number, label: string): EdgeValue => ({
  value,
  json: Number.isFinite(value) ? JSON.stringify(value) : String(value),
  label,
});

/**
 * The edges of a range (each bound, the nearest double inside it and a value beyond it, relative and absolute),
 * then non-finite numbers, signed zero, the extremes of the double format, and a number written as a string.
 */
export function edgeValues(range: { min: number; max: number; minInclusive: boolean }): EdgeValue[] {
  const { min, max } = range;
  const step = (x: number, towards: number) => (x === towards ? x : x + (towards - x) * 1e-9 || towards);
  return [
    numberEdge(min, 'lower bound'),
    numberEdge(step(min, max), 'just above the lower bound'),
    numberEdge(min === 0 ? -1e-9 : min - Math.abs(min) * 1e-6, 'just below the lower bound'),
    numberEdge(min - Math.max(1, Math.abs(min)) * 10, 'far below the lower bound'),
    numberEdge(max, 'upper bound'),
    numberEdge(step(max, min), 'just below the upper bound'),
    numberEdge(max + Math.abs(max) * 1e-6 || 1e-9, 'just above the upper bound'),
    numberEdge(max * 10 + 1, 'far above the upper bound'),
    numberEdge(Number.NaN, 'NaN'),
    numberEdge(Number.POSITIVE_INFINITY, 'Infinity'),
    numberEdge(Number.NEGATIVE_INFINITY, '-Infinity'),
    { value: -0, json: '-0', label: 'negative zero' },
    numberEdge(1e308, '1e308'),
    numberEdge(-1e308, '-1e308'),
    numberEdge(1e-300, '1e-300'),
    { value: Number.POSITIVE_INFINITY, json: '1e400', label: '1e400 (Infinity once parsed)' },
    {
      value: String(Math.min(max, Math.max(min, 1))),
      json: JSON.stringify(String(Math.min(max, Math.max(min, 1)))),
      label: 'a number as a string',
    },
    { value: 'abc', json: '"abc"', label: 'text' },
    { value: true, json: 'true', label: 'true' },
  ];
}

/** Whether a range admits a value (the bounds as the range states them; a non-number never). */
export function admits(range: { min: number; max: number; minInclusive: boolean }, value: unknown): boolean {
  if (typeof value !== 'number' || !Number.isFinite(value)) return false;
  return (range.minInclusive ? value >= range.min : value > range.min) && value <= range.max;
}
