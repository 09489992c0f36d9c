// Every report page reflap writes, in Chromium (playwright-core, headless, fresh profile, background networking off):
// drawn, no console errors, no requests, and its layout against a stored reference image with a tolerance
// (page-image.ts; the images are rewritten only by scripts/update-page-images.sh). The session page's own checks
// come first: the laps and corners it lists against the laps the log was built from, and its small multiples.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { Chromium } from './chromium.js';
import { comparePageImage, IMAGE_TOLERANCE, UPDATE_PAGE_IMAGES } from './page-image.js';
import type { ReportPages } from './report-pages.js';
import { projectRoot, runCli } from '../helpers/cli.js';
import { once } from '../helpers/once.js';
import { readTrace, sharedGripPair, writeSessionLog } from '../helpers/logs.js';
import { onSharedLine } from '../helpers/shared-line.js';

const velmora = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const gtCar = path.join(projectRoot, 'cars', 'tarnfell-gt.json');
const clubCar = path.join(projectRoot, 'cars', 'brackle-club.json');

/** The session page: four complete laps (high, low, high, low braking grip) and half a fifth, the laps and the
 * reference on the demo car's racing line as the run's other session tests drive it (computed once per run). */
function writeSessionPage(work: string): { file: string; lapTimesS: number[] } {
  const { highGrip, lowGrip } = sharedGripPair(velmora, gtCar, 1.2);
  const log = writeSessionLog(path.join(work, 'session.csv'), [highGrip, lowGrip, highGrip, lowGrip, highGrip], 0.5);
  const file = path.join(work, 'session.html');
  const run = runCli(['session', ...onSharedLine(velmora, gtCar), '--telemetry', log, '--html', file]);
  if (run.code !== 0) throw new Error(run.stderr);
  // A trace's own lap time: its last row's time plus the 0.02 s step writeSessionLog adds between laps.
  const lapTimeOf = (trace: string) => {
    const rows = readTrace(trace);
    return rows.rows.at(-1)![rows.header.indexOf('time_s')]! + 0.02;
  };
  return { file, lapTimesS: [highGrip, lowGrip, highGrip, lowGrip].map(lapTimeOf) };
}

export type SessionPage = () => { file: string; lapTimesS: number[] };

/** The session page, written at its first use. */
export function sessionPage(pages: ReportPages): SessionPage {
  return once(() => writeSessionPage(pages.folder));
}

/** The session page's own checks, on its HTML (no browser needed). */
export function describeSessionPage(session: SessionPage): void {
  describe('the session page', () => {
    const html = once(() => readFileSync(session().file, 'utf8'));
    it('lists every lap with its time and the corners across the laps', () => {
      const rows = [
        ...html().matchAll(/<tr class="lap-row[^"]*" data-lap="(\d+)"><td>[^<]*<\/td><td class="strong">([^<]+)</g),
      ];
      expect(rows.map((m) => Number(m[1]))).toEqual([1, 2, 3, 4, 5]);
      // Lap times m:ss.sss against the traces' own (within 0.05 s, the line's interpolation at 1 m, common practice).
      session().lapTimesS.forEach((expected, k) => {
        const [minutes, seconds] = rows[k]![2]!.split(':').map(Number);
        expect(Math.abs(minutes! * 60 + seconds! - expected)).toBeLessThan(0.05);
      });
      // The best lap is a high-grip lap by construction (laps 1 and 3).
      expect(/<tr class="lap-row best" data-lap="(\d+)"/.exec(html())![1]).toMatch(/^[13]$/);
    });

    it('draws one small multiple per corner with every complete lap and the reference', () => {
      const cornerRows = [...html().matchAll(/<tr class="corner-row" data-corner="(\d+)"/g)].map((m) => m[1]);
      const multiples = [...html().matchAll(/data-corner-multiple="(\d+)"/g)].map((m) => m[1]);
      expect(multiples.length).toBeGreaterThanOrEqual(7);
      for (const id of multiples) expect(cornerRows).toContain(id);
      for (const id of multiples) {
        const start = html().indexOf(`data-corner-multiple="${id}"`);
        const svg = html().slice(start, html().indexOf('</svg>', start));
        // The four complete laps, each with a speed and a brake line, and the reference's pair.
        expect([...svg.matchAll(/<g class="lap-trace" data-lap="(\d+)"/g)].map((m) => Number(m[1])).sort()).toEqual([
          1, 2, 3, 4,
        ]);
        expect(svg.match(/<path class="speed" d="M/g)).toHaveLength(5);
        expect(svg.match(/<path class="brake" d="M/g)).toHaveLength(5);
      }
    });
  });
}

/** Every report page, by the name of its reference image, written at its first use. */
function pageFiles(pages: ReportPages, session: SessionPage): Record<string, () => string> {
  const onLoop = () => ['--track', pages.testLoop(), '--car', clubCar, '--line', 'centreline'];
  return {
    'reference-lap': pages.referenceLap,
    'driver-lap': pages.driverLap,
    'lap-against-lap': pages.lapAgainstLap,
    car: () => pages.cli('car', ['car', '--car', clubCar]),
    sweep: () =>
      pages.cli('sweep', [
        'sweep',
        ...onLoop(),
        '--vary',
        'massKg=600:640:20',
        'tyre.muLat=-5%:+5%:5%',
        '--workers',
        '1',
      ]),
    whatif: () => pages.cli('whatif', ['whatif', ...onLoop(), '--set', 'massKg=+20']),
    budget: () => pages.cli('budget', ['budget', '--car', clubCar, '--speed-kph', '80', '--radius-m', '60']),
    session: () => session().file,
  };
}

export function describePageImages(browser: Chromium, pages: ReportPages, session: SessionPage): void {
  describe('every report page', () => {
    const files = pageFiles(pages, session);
    for (const name of Object.keys(files)) {
      it(`${name}: drawn, quiet, offline, and laid out as its reference image`, async () => {
        const { page, problems, requests, dialogs } = await browser.open(files[name]!());
        // Every picture (charts, legends, the car's g-g-v envelope) has something drawn in it.
        const empty = await page.$$eval('svg[role="img"]', (svgs) =>
          svgs
            .filter(
              (svg) =>
                !Array.from(svg.querySelectorAll('path, circle, line, polyline, rect.bar')).some((shape) => {
                  const box = (shape as SVGGraphicsElement).getBBox();
                  return box.width + box.height > 5;
                }),
            )
            .map((svg) => svg.getAttribute('aria-label')),
        );
        expect(await page.$$eval('svg[role="img"]', (svgs) => svgs.length)).toBeGreaterThan(0);
        expect(empty).toEqual([]);
        const difference = await comparePageImage(await browser.scratch(), page, name);
        if (!UPDATE_PAGE_IMAGES) {
          expect(difference).not.toBeNull();
          const { actual, reference, meanDifference, changedShare } = difference!;
          expect(actual.width).toBe(reference.width);
          expect(Math.abs(actual.height - reference.height) / reference.height).toBeLessThanOrEqual(
            IMAGE_TOLERANCE.heightShare,
          );
          expect(meanDifference).toBeLessThanOrEqual(IMAGE_TOLERANCE.meanDifference);
          expect(changedShare).toBeLessThanOrEqual(IMAGE_TOLERANCE.changedShare);
        }
        if (name === 'session') {
          // A corner row of the session's table zooms the best lap's charts below it.
          await page.click('tr.corner-row[data-corner="2"]');
          expect(await page.$eval('#zoom-label', (label) => label.textContent)).toMatch(/^corner 2/);
        }
        expect(problems).toEqual([]);
        expect(dialogs).toEqual([]);
        expect(requests.filter((url) => !url.startsWith('file:'))).toEqual([]);
      });
    }
  });
}
