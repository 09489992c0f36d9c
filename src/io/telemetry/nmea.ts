// NMEA 0183 GPS logs: RMC (time, date, status, position, speed over ground in knots) and GGA (time, position,
// fix quality) from any talker, each sentence's checksum verified (XOR of the characters between '$' and '*',
// two hex digits, NMEA 0183 v4.10 sec. 5.2.1), combined by timestamp into one sample per fix. GGA's antenna
// altitude (field 9, metres above mean sea level) is kept; other sentence types are named in a note.

import { InputError } from '../../errors.js';
import type { TelemetrySession } from '../../telemetry/types.js';
import { fillGaps, gpsSession, withAltitude } from './session.js';

export { looksLikeNmea } from './sniff.js';

const KNOT_MPS = 1852 / 3600;

/** XOR of the character codes of `body` (the text between '$' and '*'). */
export function nmeaChecksum(body: string): number {
  let sum = 0;
  for (let i = 0; i < body.length; i++) sum ^= body.charCodeAt(i);
  return sum;
}

interface Fix {
  timeKey: string;
  secondOfDay: number;
  dayNumber: number | null;
  latDeg: number;
  lonDeg: number;
  speedMps: number;
  altitudeM: number;
  line: number;
}

function parseTimeOfDay(field: string): number {
  if (!/^\d{6}(\.\d+)?$/.test(field)) return NaN;
  return Number(field.slice(0, 2)) * 3600 + Number(field.slice(2, 4)) * 60 + Number(field.slice(4));
}

/** ddmm.mmmm / dddmm.mmmm with a hemisphere letter -> signed degrees. */
function parseAngle(field: string, hemisphere: string, degreeDigits: number): number {
  if (!/^\d+(\.\d+)?$/.test(field) || (field.indexOf('.') < 0 && field.length < degreeDigits + 2)) return NaN;
  const degrees = Number(field.slice(0, degreeDigits));
  const minutes = Number(field.slice(degreeDigits));
  if (!(minutes < 60)) return NaN;
  const value = degrees + minutes / 60;
  if (hemisphere === 'S' || hemisphere === 'W') return -value;
  if (hemisphere === 'N' || hemisphere === 'E') return value;
  return NaN;
}

/** ddmmyy -> days since 1970-01-01 (years 80-99 read as 19xx, the rest 20xx). */
function parseDate(field: string): number | null {
  if (!/^\d{6}$/.test(field)) return null;
  const yy = Number(field.slice(4, 6));
  const ms = Date.UTC(yy >= 80 ? 1900 + yy : 2000 + yy, Number(field.slice(2, 4)) - 1, Number(field.slice(0, 2)));
  return Number.isFinite(ms) ? Math.round(ms / 86400000) : null;
}

/** What a fix sentence (RMC or GGA) says, or null when it reports no fix. */
interface FixReading {
  latDeg: number;
  lonDeg: number;
  speedMps: number;
  altitudeM: number;
}

/** Reads the fields of an RMC or GGA sentence; an RMC date updates the day through setDay. */
function readFixSentence(kind: string, fields: string[], setDay: (day: number) => void): FixReading | null {
  if (kind === 'RMC') {
    // $--RMC,hhmmss.ss,A,llll.ll,a,yyyyy.yy,a,x.x(knots),x.x(course),ddmmyy,...; status V = no fix.
    const day = parseDate(fields[9] ?? '');
    if (day !== null) setDay(day);
    if (fields[2] !== 'A' || fields[12] === 'N') return null;
    const knots = Number(fields[7]);
    return {
      latDeg: parseAngle(fields[3] ?? '', fields[4] ?? '', 2),
      lonDeg: parseAngle(fields[5] ?? '', fields[6] ?? '', 3),
      speedMps: fields[7] !== '' && Number.isFinite(knots) ? knots * KNOT_MPS : NaN,
      altitudeM: NaN,
    };
  }
  // $--GGA,hhmmss.ss,llll.ll,a,yyyyy.yy,a,quality,satellites,hdop,altitude,M,...; quality 0 = no fix.
  if (!(Number(fields[6]) > 0)) return null;
  // Altitude in the unit of field 10, which NMEA 0183 fixes as M (metres); an empty field is no altitude.
  const altitude = Number(fields[9]);
  return {
    latDeg: parseAngle(fields[2] ?? '', fields[3] ?? '', 2),
    lonDeg: parseAngle(fields[4] ?? '', fields[5] ?? '', 3),
    speedMps: NaN,
    altitudeM: fields[9] !== '' && fields[10] === 'M' && Number.isFinite(altitude) ? altitude : NaN,
  };
}

/** The fixes of a log in the order they arrive, one per time stamp, with counts of what was skipped. */
interface FixList {
  fixes: Fix[];
  badChecksums: number;
  noChecksum: number;
  withoutFix: number;
  sentences: number;
  otherKinds: Set<string>;
}

function collectFixes(text: string, source: string): FixList {
  const list: FixList = {
    fixes: [],
    badChecksums: 0,
    noChecksum: 0,
    withoutFix: 0,
    sentences: 0,
    otherKinds: new Set<string>(),
  };
  const order = list.fixes;
  let currentDay: number | null = null;
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  lines.forEach((rawLine, lineIndex) => {
    const start = rawLine.indexOf('$');
    if (start < 0) return;
    const line = rawLine.slice(start).trim();
    const star = line.lastIndexOf('*');
    if (star < 0) {
      list.noChecksum++;
      return;
    }
    list.sentences++;
    const body = line.slice(1, star);
    const stated = line.slice(star + 1, star + 3);
    if (!/^[0-9A-Fa-f]{2}$/.test(stated) || parseInt(stated, 16) !== nmeaChecksum(body)) {
      list.badChecksums++;
      return;
    }
    const fields = body.split(',');
    const kind = fields[0]!.slice(-3);
    if (fields[0]!.length !== 5 || (kind !== 'RMC' && kind !== 'GGA')) {
      if (/^[A-Z]{2}[A-Z]{3}$/.test(fields[0]!)) list.otherKinds.add(kind);
      return;
    }
    const timeKey = fields[1] ?? '';
    const secondOfDay = parseTimeOfDay(timeKey);
    if (Number.isNaN(secondOfDay)) return;
    const reading = readFixSentence(kind, fields, (day) => (currentDay = day));
    if (reading === null) {
      list.withoutFix++;
      return;
    }
    const { latDeg, lonDeg, speedMps, altitudeM } = reading;
    if (Number.isNaN(latDeg) || Number.isNaN(lonDeg)) {
      throw new InputError(`${source}: line ${lineIndex + 1}: ${fields[0]} sentence has an unreadable position`);
    }
    // The same ranges as the CSV reader's: a latitude of 95 or a longitude of 181 is not a place.
    if (!(Math.abs(latDeg) <= 90 && Math.abs(lonDeg) <= 180)) {
      throw new InputError(
        `${source}: line ${lineIndex + 1}: ${fields[0]} position ${latDeg.toFixed(5)}, ${lonDeg.toFixed(5)} is outside latitude -90 to 90 and longitude -180 to 180`,
      );
    }
    // Sentences of one fix share its time stamp and arrive together; look back over the last two fixes.
    const held = [order[order.length - 1], order[order.length - 2]].find(
      (fix) => fix !== undefined && fix.timeKey === timeKey,
    );
    if (held) {
      if (Number.isNaN(held.speedMps)) held.speedMps = speedMps;
      if (Number.isNaN(held.altitudeM)) held.altitudeM = altitudeM;
      if (held.dayNumber === null) held.dayNumber = currentDay;
      return;
    }
    order.push({
      timeKey,
      secondOfDay,
      dayNumber: currentDay,
      latDeg,
      lonDeg,
      speedMps,
      altitudeM,
      line: lineIndex + 1,
    });
  });
  return list;
}

/** Seconds from the first fix: the RMC date where known; otherwise the time of day, a day added at each midnight. */
function fixTimesS(order: readonly Fix[], source: string): Float64Array {
  const count = order.length;
  const timeS = new Float64Array(count);
  let extraDays = 0;
  const firstDay = order.find((fix) => fix.dayNumber !== null)?.dayNumber ?? 0;
  for (let i = 0; i < count; i++) {
    const fix = order[i]!;
    let t =
      fix.dayNumber !== null
        ? (fix.dayNumber - firstDay) * 86400 + fix.secondOfDay
        : fix.secondOfDay + extraDays * 86400;
    if (i > 0 && fix.dayNumber === null && t < timeS[i - 1]! - 43200) {
      extraDays++;
      t += 86400;
    }
    if (i > 0 && t <= timeS[i - 1]!) {
      throw new InputError(
        `${source}: line ${fix.line}: time ${fix.timeKey} runs backwards (earlier than the fix before it)`,
      );
    }
    timeS[i] = t;
  }
  const t0 = timeS[0]!;
  for (let i = 0; i < count; i++) timeS[i] = timeS[i]! - t0;
  return timeS;
}

const counted = (count: number, one: string, many: string) => `${count} ${count === 1 ? one : many}`;

export function parseNmeaText(text: string, source: string): TelemetrySession {
  const list = collectFixes(text, source);
  const order = list.fixes;
  if (list.sentences === 0 && list.noChecksum === 0) throw new InputError(`${source}: no NMEA sentences found`);
  if (order.length === 0) {
    const bad = list.badChecksums;
    const skipped = bad > 0 ? ` (${bad} sentence${bad > 1 ? 's' : ''} skipped for bad checksums)` : '';
    throw new InputError(`${source}: no RMC or GGA sentence with a GPS fix${skipped}`);
  }
  const count = order.length;
  const timeS = fixTimesS(order, source);
  const lat = Float64Array.from(order, (fix) => fix.latDeg);
  const lon = Float64Array.from(order, (fix) => fix.lonDeg);
  const speed = Float64Array.from(order, (fix) => fix.speedMps);
  const altitude = Float64Array.from(order, (fix) => fix.altitudeM);
  const speedSamples = order.filter((fix) => !Number.isNaN(fix.speedMps)).length;
  const altitudeSamples = order.filter((fix) => !Number.isNaN(fix.altitudeM)).length;
  const notes: string[] = [];
  if (list.badChecksums > 0)
    notes.push(`skipped ${counted(list.badChecksums, 'sentence', 'sentences')} with bad checksums`);
  if (list.noChecksum > 0)
    notes.push(`skipped ${counted(list.noChecksum, 'sentence', 'sentences')} without a checksum`);
  if (list.withoutFix > 0) notes.push(`ignored ${counted(list.withoutFix, 'sentence', 'sentences')} without a GPS fix`);
  if (count < 2) throw new InputError(`${source}: only one GPS fix; a lap needs many`);

  let speedMps: Float64Array | null = null;
  if (speedSamples > 0) {
    fillGaps(speed, timeS);
    speedMps = speed;
    if (speedSamples < count) notes.push(`${count - speedSamples} fixes without RMC speed: filled by interpolation`);
  }
  if (list.otherKinds.size > 0) notes.push(`sentences not used: ${[...list.otherKinds].sort().join(', ')}`);
  return withAltitude(gpsSession(source, timeS, lat, lon, speedMps, notes), altitude, altitudeSamples, 'GGA');
}
