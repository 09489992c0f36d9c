// The sweep and what-if report pages in a real browser: Debian's Chromium driven by playwright-core,
// headless, fresh profile, background networking off. The pages are written by the built CLI, opened from
// disk, and must draw every chart with no console error and no request beyond the file itself.
// The runs drive the centreline (--line centreline), where the loop's four corners give four braking zones.

import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { saveScreenshot, type Chromium } from './chromium.js';
import type { ReportPages } from './report-pages.js';
import { projectRoot, runCli } from '../helpers/cli.js';

const HOSTILE_CAR = '<img src=x onerror="window.__sweepInjected=1"><script>window.__sweepInjected=2</script>';

export function describeSweepReport(browser: Chromium, pages: ReportPages): void {
  describe('sweep report', () => {
    const workFolder = pages.folder;
    let loop: string;
    let hostileCar: string;

    beforeAll(() => {
      loop = pages.testLoop();
      const car = JSON.parse(readFileSync(path.join(projectRoot, 'cars', 'brackle-club.json'), 'utf8')) as Record<
        string,
        unknown
      >;
      hostileCar = path.join(workFolder, 'hostile-car.json');
      writeFileSync(hostileCar, JSON.stringify({ ...car, name: HOSTILE_CAR }));
    });

    const open = browser.open;

    /** Per chart: how many paths are drawn with a visible extent, and how many point markers. */
    async function drawn(page: Page): Promise<{ name: string | null; paths: number; points: number }[]> {
      return page.$$eval('svg.chart', (svgs) =>
        svgs.map((svg) => ({
          name: svg.getAttribute('data-chart'),
          paths: Array.from(svg.querySelectorAll('path.series, path.bar')).filter((p) => {
            const box = (p as SVGGraphicsElement).getBBox();
            return (p.getAttribute('d') ?? '').length > 10 && box.width + box.height > 5;
          }).length,
          points: Array.from(svg.querySelectorAll('circle.point')).filter(
            (c) => (c as SVGGraphicsElement).getBBox().width > 0,
          ).length,
        })),
      );
    }

    it('opens a grid sweep page with every chart drawn and no console error', async () => {
      const file = path.join(workFolder, 'hostile-sweep-grid.html');
      const run = runCli([
        'sweep',
        '--track',
        loop,
        '--car',
        hostileCar,
        '--line',
        'centreline',
        '--vary',
        'massKg=600:640:20',
        'tyre.muLat=-5%:+5%:5%',
        '--workers',
        '1',
        '--html',
        file,
      ]);
      expect(run.code, run.stderr).toBe(0);
      const { page, problems, dialogs, requests } = await open(file);
      const charts = await drawn(page);
      expect(charts.map((c) => c.name)).toEqual([
        'lap-time-massKg',
        'braking-shift-massKg',
        'lap-time-tyre.muLat',
        'braking-shift-tyre.muLat',
      ]);
      for (const chart of charts) {
        // Lap time: one line per value of the other field (3); shift: one line per corner of the loop (4).
        expect(chart.paths, `${chart.name} drawn lines`).toBe(chart.name!.startsWith('lap-time') ? 3 : 4);
        expect(chart.points, `${chart.name} markers`).toBeGreaterThanOrEqual(9);
      }
      expect(await page.locator('.sensitivity table tbody tr').count()).toBe(1 + 4 + 1);
      expect(await page.title()).toContain(HOSTILE_CAR);
      expect(
        await page.evaluate(() => (window as unknown as { __sweepInjected?: number }).__sweepInjected),
      ).toBeUndefined();
      expect(await page.$$('body img, body script, body iframe, body object')).toHaveLength(0);
      expect(problems).toEqual([]);
      expect(dialogs).toEqual([]);
      expect(requests.filter((url) => !url.startsWith('file:'))).toEqual([]);
      await saveScreenshot(page, 'sweep-report');
    });

    it('opens a one-at-a-time sweep page and a what-if page with every chart drawn', async () => {
      const sweep = path.join(workFolder, 'hostile-sweep-oat.html');
      const oat = runCli([
        'sweep',
        '--track',
        loop,
        '--car',
        hostileCar,
        '--line',
        'centreline',
        '--vary',
        'massKg=600:640:20',
        'tyre.muLong=-10%:+10%:5%',
        '--mode',
        'one-at-a-time',
        '--workers',
        '1',
        '--html',
        sweep,
      ]);
      expect(oat.code, oat.stderr).toBe(0);
      const whatif = path.join(workFolder, 'hostile-whatif.html');
      const change = runCli([
        'whatif',
        '--track',
        loop,
        '--car',
        hostileCar,
        '--line',
        'centreline',
        '--set',
        'massKg=+20',
        '--html',
        whatif,
      ]);
      expect(change.code, change.stderr).toBe(0);
      for (const [file, expected] of [
        [sweep, 4],
        [whatif, 1],
      ] as const) {
        const { page, problems, requests } = await open(file);
        const charts = await drawn(page);
        expect(charts).toHaveLength(expected);
        for (const chart of charts) expect(chart.paths, `${chart.name} drawn paths`).toBeGreaterThan(0);
        if (file === whatif) expect(charts[0]!.paths).toBe(4);
        expect(problems).toEqual([]);
        expect(requests.filter((url) => !url.startsWith('file:'))).toEqual([]);
        await saveScreenshot(page, file === whatif ? 'whatif-report' : 'sweep-oat-report');
      }
    });
  });
}
