// GPX 1.1 tracks (topografix.com/GPX/1/1): <trk><trkseg><trkpt lat lon><time>, with the optional elevation <ele>
// (metres) and a speed in <extensions> (any element whose local name is "speed", m/s), parsed with fast-xml-parser.
// Other elements of a track point are named in a note.

import { createRequire } from 'node:module';
import type * as FastXmlParser from 'fast-xml-parser';
import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { fillGaps, gpsSession, withAltitude } from './session.js';

export { looksLikeGpx } from './sniff.js';

type XmlNode = Record<string, unknown>;

/** fast-xml-parser, loaded on the first GPX file: every command that may read a log would otherwise pay for it at start. */
let xml: typeof FastXmlParser | null = null;
function xmlLibrary(): typeof FastXmlParser {
  xml ??= createRequire(import.meta.url)('fast-xml-parser') as typeof FastXmlParser;
  return xml;
}

function asArray<T>(value: T | T[] | undefined): T[] {
  if (value === undefined || value === null) return [];
  return Array.isArray(value) ? value : [value];
}

/** Finds the first element named `speed` (any namespace prefix) below an <extensions> node. */
function extensionSpeed(node: unknown): number {
  if (node === null || typeof node !== 'object') return NaN;
  for (const [key, value] of Object.entries(node as XmlNode)) {
    const local = key.includes(':') ? key.slice(key.indexOf(':') + 1) : key;
    if (local === 'speed') {
      const speed = Number(typeof value === 'object' && value !== null ? (value as XmlNode)['#text'] : value);
      if (Number.isFinite(speed)) return speed;
    }
    const nested = extensionSpeed(value);
    if (!Number.isNaN(nested)) return nested;
  }
  return NaN;
}

/** Elements of a track point the reader uses (the speed inside <extensions> is looked for by name). */
const READ_ELEMENTS = new Set(['time', 'ele', 'extensions']);

/** Names of the leaf elements below <extensions> other than the speed, for the note on what is not used. */
function otherExtensions(node: unknown, out: Set<string>): void {
  if (node === null || typeof node !== 'object') return;
  for (const [key, value] of Object.entries(node as XmlNode)) {
    if (key.startsWith('@_') || key === '#text') continue;
    const local = key.includes(':') ? key.slice(key.indexOf(':') + 1) : key;
    if (
      value !== null &&
      typeof value === 'object' &&
      Object.keys(value).some((k) => !k.startsWith('@_') && k !== '#text')
    )
      otherExtensions(value, out);
    else if (local !== 'speed') out.add(key);
  }
}

/** Deeper than any GPX (gpx, trk, trkseg, trkpt, extensions and a vendor block are under ten). */
const MAX_NESTING = 64;

export function parseGpxText(text: string, source: string): TelemetrySession {
  // A plain GPX declares no document type; entities (external, parameter or expanding) are refused, not processed.
  if (/<!DOCTYPE/i.test(text)) {
    throw new InputError(`${source}: not a plain GPX file (it declares a DOCTYPE; GPX needs none)`);
  }
  const { XMLParser, XMLValidator } = xmlLibrary();
  const validation = XMLValidator.validate(text);
  if (validation !== true) {
    throw new InputError(
      `${source}: not a GPX file (not valid XML at line ${validation.err.line}: ${validation.err.msg.replace(/\s+/g, ' ')})`,
    );
  }
  const parser = new XMLParser({
    ignoreAttributes: false,
    attributeNamePrefix: '@_',
    parseTagValue: false,
    isArray: (name) => name === 'trk' || name === 'trkseg' || name === 'trkpt',
    processEntities: false,
    maxNestedTags: MAX_NESTING,
  });
  let document: XmlNode;
  try {
    document = parser.parse(text) as XmlNode;
  } catch (error) {
    // The parser refuses what the validator let through (nesting deeper than MAX_NESTING and the like).
    const reason = error instanceof Error ? error.message.split('\n')[0]! : String(error);
    throw new InputError(`${source}: not a plain GPX file (${reason})`);
  }
  const gpx = document['gpx'] as XmlNode | undefined;
  if (!gpx) throw new InputError(`${source}: no <gpx> element`);
  const points: XmlNode[] = [];
  for (const track of asArray(gpx['trk'] as XmlNode[] | undefined)) {
    for (const segment of asArray(track['trkseg'] as XmlNode[] | undefined)) {
      points.push(...asArray(segment['trkpt'] as XmlNode[] | undefined));
    }
  }
  if (points.length === 0) throw new InputError(`${source}: no track points (<trk><trkseg><trkpt>)`);
  if (points.length < 2) throw new InputError(`${source}: only one track point; a lap needs many`);
  const count = points.length;
  const lat = new Float64Array(count);
  const lon = new Float64Array(count);
  const timeS = new Float64Array(count);
  const speed = new Float64Array(count);
  const elevation = new Float64Array(count);
  let speedSamples = 0;
  let elevationSamples = 0;
  const otherElements = new Set<string>();
  let t0 = 0;
  points.forEach((point, i) => {
    const place = `track point ${i + 1}`;
    lat[i] = Number(point['@_lat']);
    lon[i] = Number(point['@_lon']);
    if (
      !(Math.abs(lat[i]) <= 90) ||
      !(Math.abs(lon[i]) <= 180) ||
      point['@_lat'] === undefined ||
      point['@_lon'] === undefined
    ) {
      throw new InputError(`${source}: ${place}: lat/lon missing or out of range`);
    }
    const stamp = point['time'];
    const ms = typeof stamp === 'string' ? Date.parse(stamp) : NaN;
    if (Number.isNaN(ms)) throw new InputError(`${source}: ${place}: no readable <time> (ISO 8601)`);
    if (i === 0) t0 = ms;
    timeS[i] = (ms - t0) / 1000;
    if (i > 0 && timeS[i] < timeS[i - 1]!)
      throw new InputError(`${source}: ${place}: time runs backwards (${String(stamp)})`);
    speed[i] = extensionSpeed(point['extensions']);
    if (!Number.isNaN(speed[i])) speedSamples++;
    const ele = point['ele'];
    elevation[i] = typeof ele === 'string' && ele.trim() !== '' ? Number(ele) : NaN;
    if (Number.isFinite(elevation[i])) elevationSamples++;
    else elevation[i] = NaN;
    for (const key of Object.keys(point)) if (!key.startsWith('@_') && !READ_ELEMENTS.has(key)) otherElements.add(key);
    otherExtensions(point['extensions'], otherElements);
  });
  const notes: string[] = [];
  let speedMps: Float64Array | null = null;
  if (speedSamples > 0) {
    fillGaps(speed, timeS);
    speedMps = speed;
  }
  if (otherElements.size > 0) notes.push(`track point elements not used: ${[...otherElements].sort().join(', ')}`);
  return withAltitude(gpsSession(source, timeS, lat, lon, speedMps, notes), elevation, elevationSamples, '<ele>');
}
