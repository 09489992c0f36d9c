// `reflap session` end to end on the bundled demo circuit: a log of laps written by `simulate` for the demo car and
// for a copy of it with less braking grip (tyre.muLong), driven in turn; a one-lap log; and a log with no complete lap.

import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';
import { readTrace, sharedGripPair, writeSessionLog } from '../helpers/logs.js';
import { onSharedLine } from '../helpers/shared-line.js';
import { expectConverted } from '../report/converted-quantities.js';
import { escapeHtml } from '../../src/report/html/escape.js';

const track = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const carFile = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const work = mkdtempSync(path.join(tmpdir(), 'reflap-session-'));
// The laps and every run drive the demo car's racing line, computed once for the test run.
const { highGrip, lowGrip } = sharedGripPair(track, carFile, 1.2);

const session = (telemetry: string, extra: string[] = []) =>
  runCli(['session', ...onSharedLine(track, carFile), '--telemetry', telemetry, ...extra]);
/** A trace's own lap time: its last row's time plus the 0.02 s step writeSessionLog adds between laps. */
const lapTimeOf = (file: string) => {
  const trace = readTrace(file);
  return trace.rows.at(-1)![trace.header.indexOf('time_s')]! + 0.02;
};

describe('a session of four laps and a partial fifth', () => {
  it('lists the laps, their sectors and the corners across them', () => {
    const file = writeSessionLog(path.join(work, 'four.csv'), [highGrip, lowGrip, highGrip, lowGrip, highGrip], 0.5);
    const html = path.join(work, 'session.html');
    const run = session(file, ['--json', '--html', html]);
    expect(run.code, run.stderr).toBe(0);
    const result = JSON.parse(run.stdout);
    const complete = result.laps.filter((lap: { complete: boolean }) => lap.complete);
    expect(complete.map((lap: { lap: number }) => lap.lap)).toEqual([1, 2, 3, 4]);
    const partial = result.laps.filter((lap: { complete: boolean }) => !lap.complete);
    expect(partial).toHaveLength(1);
    expect(partial[0].reason).toBeTruthy();
    // Lap times are the traces' own (the log's times run on from lap to lap); within 0.05 s for the line's
    // interpolation at the traces' 1 m spacing (common practice).
    complete.forEach((lap: { lapTimeS: number; sectorsS: number[] }, k: number) => {
      expect(Math.abs(lap.lapTimeS - lapTimeOf(k % 2 === 0 ? highGrip : lowGrip))).toBeLessThan(0.05);
      // Issue 13: the sector times add up to the lap time (0.01 s).
      expect(lap.sectorsS).toHaveLength(3);
      expect(Math.abs(lap.sectorsS.reduce((a, b) => a + b, 0) - lap.lapTimeS)).toBeLessThan(0.01);
    });
    expect(result.bestLapTimeS).toBe(Math.min(...complete.map((lap: { lapTimeS: number }) => lap.lapTimeS)));
    expect([1, 3]).toContain(result.bestLap);
    expect(result.sessionBestS).toBeLessThanOrEqual(result.bestLapTimeS + 1e-9);
    for (const key of ['demonstratedLapTimeS', 'referenceLapTimeS']) expect(typeof result[key]).toBe('number');
    expect(result.corners.length).toBeGreaterThanOrEqual(7);
    for (const corner of result.corners) {
      for (const key of ['id', 'bestTimeS', 'medianTimeS', 'spreadBrakingPointM', 'spreadMinSpeedKph', 'bestLap'])
        expect(corner).toHaveProperty(key);
      // Two corner times a and b, each on two laps: the median is (a + b) / 2, the best min(a, b), and the sample
      // standard deviation |a - b| / sqrt(3) (definition of the sample standard deviation, n - 1 = 3).
      const halfGap = corner.medianTimeS - corner.bestTimeS;
      expect(Math.abs(corner.spreadTimeS - (2 * halfGap) / Math.sqrt(3))).toBeLessThan(2e-4);
      if (halfGap > 0.005) expect([1, 3]).toContain(corner.bestLap);
    }
    expect(new Set(result.byTimeAvailable)).toEqual(new Set(result.corners.map((c: { id: number }) => c.id)));
    const page = readFileSync(html, 'utf8');
    expect(page).toMatch(/^<!DOCTYPE html>/i);
    // Each note is listed once on the page, above the best lap, not again under its comparison.
    expect(result.notes.length).toBeGreaterThan(0);
    for (const text of result.notes as string[]) expect(page.split(`<li>${escapeHtml(text)}</li>`)).toHaveLength(2);
    // Under imperial the partial lap's reason in the lap table and the notes name feet: each figure is the JSON's
    // metric one converted (1 ft = 0.3048 m, NIST SP 811, appendix B), within both roundings.
    const imperialHtml = path.join(work, 'session-imperial.html');
    const imperial = session(file, ['--units', 'imperial', '--html', imperialHtml]);
    expect(imperial.code, imperial.stderr).toBe(0);
    const tableReason = new RegExp(`^${partial[0].lap} .* no: (.*)$`, 'm').exec(imperial.stdout)![1]!.trim();
    expectConverted(partial[0].reason, tableReason);
    expect(tableReason).toMatch(/\d ft\b/);
    const imperialNotes = imperial.stdout
      .split('\n')
      .flatMap((line) => (line.startsWith('Note: ') ? [line.slice(6)] : []));
    expect(imperialNotes).toHaveLength(result.notes.length);
    result.notes.forEach((metricText: string, k: number) => expectConverted(metricText, imperialNotes[k]!));
    // The page says the same as the terminal.
    expect(readFileSync(imperialHtml, 'utf8')).toContain(`no: ${tableReason}`);
  });

  it('prints the four answers side by side, the rankings and the caution', () => {
    const file = writeSessionLog(path.join(work, 'two.csv'), [lowGrip, highGrip]);
    const run = session(file);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/Where could my lap be/);
    for (const answer of ['Best lap \\(lap 2\\)', 'Session best', 'With the grip already shown', 'Reference'])
      expect(run.stdout).toMatch(new RegExp(answer));
    expect(run.stdout).toMatch(/Time available .*most first/);
    expect(run.stdout).toMatch(/Least consistent/);
    expect(run.stdout).toMatch(/Caution/);
  });
});

describe('a session with one lap', () => {
  it('shows the session view with a note', () => {
    const run = session(highGrip, ['--json']);
    expect(run.code, run.stderr).toBe(0);
    const result = JSON.parse(run.stdout);
    expect(result.sessionBestS).toBeCloseTo(result.bestLapTimeS, 6);
    expect(result.notes.join(' ')).toMatch(/one complete lap/);
  });
});

describe('bad input', () => {
  it('refuses a log with no complete lap: one line, exit 2, nothing written', () => {
    const file = writeSessionLog(path.join(work, 'partial.csv'), [highGrip], 0.4);
    const html = path.join(work, 'never.html');
    const run = session(file, ['--html', html, '--units', 'imperial']);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/complete lap/);
    // An error echoes the input, which is metric, whatever the units of the output.
    expect(run.stderr).toMatch(/\d m (after|before|into)/);
    expect(existsSync(html)).toBe(false);
  });
});
