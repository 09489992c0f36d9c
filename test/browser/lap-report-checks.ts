// The lap report in a real browser: Debian's Chromium driven by playwright-core, headless, fresh profile,
// background networking off. The page is opened from disk and must work with no network at all.

import { existsSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { saveScreenshot, type Chromium } from './chromium.js';
import type { ReportPages } from './report-pages.js';
import { lapReportHtml } from '../../src/report/html/page.js';
import { HOSTILE_CAR_NAME, HOSTILE_CORNER_NAME, HOSTILE_TRACK_NAME, pipelineInput } from '../report/report-fixtures.js';

export function describeLapReport(browser: Chromium, pages: ReportPages): void {
  describe('lap report', () => {
    const open = browser.open;

    async function cursorXs(page: Page): Promise<Array<string | null>> {
      return page.$$eval('svg[data-distance-chart] .cursor', (lines) =>
        lines.map((line) => (line.getAttribute('visibility') === 'visible' ? line.getAttribute('x1') : null)),
      );
    }

    async function axisRange(page: Page): Promise<[number, number]> {
      const ticks = await page.$$eval('svg[data-chart="speed"] .x-axis text', (texts) =>
        texts.map((t) => Number(t.textContent)).filter((v) => Number.isFinite(v)),
      );
      return [Math.min(...ticks), Math.max(...ticks)];
    }

    /** Every chart drawn, a hover that moves the cursor on all of them together, a corner click that zooms, a reset. */
    async function exercise(page: Page, screenshot: string, cornerApexM: number): Promise<void> {
      const charts = await page.$$eval('svg.chart', (svgs) =>
        svgs.map((svg) => {
          const drawn = Array.from(svg.querySelectorAll('path')).filter((p) => {
            const box = (p as SVGGraphicsElement).getBBox();
            return (p.getAttribute('d') ?? '').length > 10 && box.width + box.height > 5;
          });
          return { name: svg.getAttribute('data-chart'), drawn: drawn.length };
        }),
      );
      expect(charts.map((c) => c.name).sort()).toEqual(['delta', 'gg', 'grip', 'map', 'pedals', 'speed']);
      for (const chart of charts) expect(chart.drawn, `${chart.name} has drawn paths`).toBeGreaterThan(0);

      // A viewport as tall as the page, so the hover needs no scrolling and the screenshot shows the page as laid out.
      await page.setViewportSize({
        width: 1280,
        height: Math.ceil(await page.evaluate(() => document.documentElement.scrollHeight)),
      });
      expect((await cursorXs(page)).every((x) => x === null)).toBe(true);
      const area = page.locator('svg[data-chart="pedals"] .hover-area');
      const box = (await area.boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.3, box.y + box.height / 2);
      const first = await cursorXs(page);
      expect(first.every((x) => x !== null && x === first[0])).toBe(true);
      expect(await page.$eval('.map-dot', (dot) => dot.getAttribute('visibility'))).toBe('visible');
      expect(await page.$eval('.gg-dot-driver', (dot) => dot.getAttribute('visibility'))).toBe('visible');
      expect(await page.$eval('[data-field="speedR"]', (dd) => dd.textContent)).toMatch(/^\d+\.\d km\/h$/);
      expect(await page.$eval('[data-field="delta"]', (dd) => dd.textContent)).toMatch(/s$/);
      await page.mouse.move(box.x + box.width * 0.7, box.y + box.height / 2);
      const second = await cursorXs(page);
      expect(second.every((x) => x !== null && x === second[0])).toBe(true);
      expect(Number(second[0])).toBeGreaterThan(Number(first[0]));
      await saveScreenshot(page, screenshot);

      // A click on a corner row zooms every chart alike; a map number too; the reset returns to the whole lap.
      const whole = await axisRange(page);
      await page.click('tr.corner-row[data-corner="2"]');
      const zoomed = await axisRange(page);
      expect(zoomed[1] - zoomed[0]).toBeLessThan((whole[1] - whole[0]) / 2);
      expect(zoomed[0]).toBeLessThanOrEqual(cornerApexM);
      expect(zoomed[1]).toBeGreaterThanOrEqual(cornerApexM);
      const transforms = await page.$$eval('svg[data-distance-chart] .zoom', (groups) =>
        groups.map((g) => g.getAttribute('transform')),
      );
      expect(new Set(transforms.map((t) => /scale\(([^ ]+)/.exec(t ?? '')?.[1])).size).toBe(1);
      expect(transforms[0]).toMatch(/scale\((?!1 )/);
      await saveScreenshot(page, `${screenshot}-zoomed`);
      await page.click('#zoom-reset');
      expect(await axisRange(page)).toEqual(whole);
      await page.click('svg[data-chart="map"] .corner-mark[data-corner="1"]');
      const mapZoom = await axisRange(page);
      expect(mapZoom[1] - mapZoom[0]).toBeLessThan((whole[1] - whole[0]) / 2);
    }

    it('opens the report `reflap demo` writes into out/ and works', async () => {
      // The run's exit code is checked where the demo runs (report-pages.ts).
      const file = pages.demo().report;
      expect(existsSync(file)).toBe(true);
      const { page, problems, requests, dialogs } = await open(file);
      const apex = await page.evaluate(() => {
        const data = JSON.parse(document.getElementById('lap-data')!.textContent) as {
          corners: { id: number; from: number; to: number }[];
        };
        const corner = data.corners.find((c) => c.id === 2)!;
        return (corner.from + corner.to) / 2;
      });
      await exercise(page, 'demo-report', apex);
      expect(problems).toEqual([]);
      expect(dialogs).toEqual([]);
      expect(requests.filter((url) => !url.startsWith('file:'))).toEqual([]);
    });

    it('runs nothing injected through car, track and corner names', async () => {
      // The bundled demo track and car through the library (simulate, then compareLaps on a synthetic driver), with hostile names.
      const input = pipelineInput({
        carName: HOSTILE_CAR_NAME,
        trackName: HOSTILE_TRACK_NAME,
        cornerName: HOSTILE_CORNER_NAME,
      });
      expect(input.comparison!.result.corners.length).toBeGreaterThanOrEqual(2);
      const file = pages.write('hostile', lapReportHtml(input));
      const { page, problems, dialogs, requests } = await open(file);
      await exercise(page, 'hostile-names-report', input.comparison!.result.corners[1]!.apexM);

      expect(await page.title()).toContain(HOSTILE_CAR_NAME);
      expect(await page.locator('tr.corner-row[data-corner="1"] td').first().innerText()).toContain(
        HOSTILE_CORNER_NAME,
      );
      expect(
        await page.evaluate(() => (window as unknown as { __reportInjected?: number }).__reportInjected),
      ).toBeUndefined();
      expect(await page.$$('body img, body iframe, body object, body embed')).toHaveLength(0);
      expect(await page.$$eval('script', (scripts) => scripts.length)).toBe(2);
      expect(dialogs).toEqual([]);
      expect(problems).toEqual([]);
      expect(requests.filter((url) => !url.startsWith('file:'))).toEqual([]);
    });

    it('shows a reference lap alone without errors', async () => {
      const { page, problems } = await open(pages.referenceLap());
      const names = await page.$$eval('svg.chart', (svgs) => svgs.map((svg) => svg.getAttribute('data-chart')));
      expect(names.sort()).toEqual(['gg', 'grip', 'map', 'pedals', 'speed']);
      const area = page.locator('svg[data-chart="speed"] .hover-area');
      await area.scrollIntoViewIfNeeded();
      const box = (await area.boundingBox())!;
      await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
      expect((await cursorXs(page)).every((x) => x !== null)).toBe(true);
      await page.click('tr.corner-row[data-corner="1"]');
      expect(await page.$eval('#zoom-reset', (b) => (b as HTMLButtonElement).disabled)).toBe(false);
      await saveScreenshot(page, 'reference-report');
      expect(problems).toEqual([]);
    });
  });
}
