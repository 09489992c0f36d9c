// The lap-against-lap report in Chromium (playwright-core, headless, fresh profile, background networking off):
// three traces and both deltas drawn, the gain map beside the grip map, the readout of the third lap, and y axes
// that rescale to a zoomed corner so that the values drawn there fill the plot.

import { describe, expect, it } from 'vitest';
import type { Chromium } from './chromium.js';
import type { ReportPages } from './report-pages.js';

interface PageData {
  length: number;
  d: number[];
  series: Record<string, number[] | null>;
  corners: { id: number; from: number; to: number }[];
}

export function describeAgainstReport(browser: Chromium, pages: ReportPages): void {
  describe('lap-against-lap report', () => {
    it('draws three traces, reads the third lap out and rescales the y axes to a zoomed corner', async () => {
      const { page, problems, requests, dialogs } = await browser.open(pages.lapAgainstLap());
      await page.setViewportSize({
        width: 1280,
        height: Math.ceil(await page.evaluate(() => document.documentElement.scrollHeight)),
      });
      const drawn = await page.$$eval('svg.chart', (svgs) =>
        svgs.map((svg) => ({
          name: svg.getAttribute('data-chart'),
          paths: Array.from(svg.querySelectorAll('path')).filter((p) => (p.getAttribute('d') ?? '').length > 10).length,
        })),
      );
      const isCornerChart = (name: string | null) => /^corner-/.test(name ?? '');
      expect(
        drawn
          .map((c) => c.name)
          .filter((name) => !isCornerChart(name))
          .sort(),
      ).toEqual(['delta', 'gg', 'grip', 'map', 'map-gain', 'pedals', 'speed']);
      // One small chart per corner of the lap against lap, and their legend.
      expect(drawn.filter((c) => /^corner-\d+$/.test(c.name ?? '')).length).toBeGreaterThan(0);
      // Every chart has something drawn (the corner charts' legend is swatches and text alone).
      for (const chart of drawn)
        if (chart.name !== 'corner-legend') expect(chart.paths, chart.name ?? undefined).toBeGreaterThan(0);

      const area = page.locator('svg[data-chart="speed"] .hover-area');
      const box = (await area.boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.4, box.y + box.height / 2);
      expect(await page.$eval('[data-field="speedO"]', (cell) => cell.textContent)).toMatch(/^\d+\.\d km\/h$/);
      expect(await page.$eval('[data-field="deltaO"]', (cell) => cell.textContent)).toMatch(/^[+-]?\d+\.\d{3} s$/);
      expect(await page.$$eval('.map-dot', (dots) => dots.map((dot) => dot.getAttribute('visibility')))).toEqual([
        'visible',
        'visible',
      ]);

      const data = JSON.parse(await page.$eval('#lap-data', (element) => element.textContent ?? '')) as PageData;
      const corner = data.corners[1]!;
      await page.click(`tr.corner-row[data-corner="${corner.id}"]`);
      for (const [chart, keys] of [
        ['speed', ['vR', 'vD', 'vO']],
        ['delta', ['dt', 'dtO']],
      ] as const) {
        const state = await page.$eval(`svg[data-chart="${chart}"]`, (svg) => {
          const matrix = (svg.querySelector('.zoom') as SVGGraphicsElement).transform.baseVal.consolidate()!.matrix;
          return {
            whole: svg.getAttribute('data-y-domain')!.split(' ').map(Number),
            shown: svg.getAttribute('data-y-shown')!.split(' ').map(Number),
            top: Number(svg.getAttribute('data-plot-top')),
            bottom: Number(svg.getAttribute('data-plot-bottom')),
            ky: matrix.d,
            ty: matrix.f,
            ticks: Array.from(svg.querySelectorAll('.y-ticks text')).map((t) => Number(t.textContent)),
          };
        });
        // The values inside the corner, from the page's own data, lie inside the shown axis, which is narrower than
        // the whole lap's.
        let low = Infinity;
        let high = -Infinity;
        data.d.forEach((distance, i) => {
          if (distance < corner.from || distance > corner.to) return;
          for (const key of keys) {
            const value = data.series[key]![i]!;
            low = Math.min(low, value);
            high = Math.max(high, value);
          }
        });
        const [a, b] = state.shown as [number, number];
        expect(a, chart).toBeLessThanOrEqual(low);
        expect(b, chart).toBeGreaterThanOrEqual(high);
        expect(b - a, chart).toBeLessThan(state.whole[1]! - state.whole[0]!);
        if (chart === 'delta') expect(a <= 0 && b >= 0).toBe(true);
        // A value drawn at its whole-lap height lands, after the group's transform, where a linear axis over the shown
        // domain puts it (the two-point form of a straight line).
        const height = state.bottom - state.top;
        const atWhole = (v: number) =>
          state.bottom - ((v - state.whole[0]!) / (state.whole[1]! - state.whole[0]!)) * height;
        const atShown = (v: number) => state.bottom - ((v - a) / (b - a)) * height;
        for (const v of [low, high]) expect(state.ky * atWhole(v) + state.ty).toBeCloseTo(atShown(v), 3);
        // The tick labels are redrawn for the shown domain.
        expect(state.ticks.length).toBeGreaterThanOrEqual(2);
        for (const tick of state.ticks)
          expect(tick >= a - 1e-9 && tick <= b + 1e-9, `${chart} tick ${tick}`).toBe(true);
      }
      // The pedals keep their 0-100 % axis at any zoom.
      expect(await page.$eval('svg[data-chart="pedals"] .zoom', (g) => g.getAttribute('transform'))).toMatch(
        /^translate\(\S+ 0\)/,
      );
      await page.click('#zoom-reset');
      const reset = await page.$eval(
        'svg[data-chart="speed"] .zoom',
        (g) => (g as SVGGraphicsElement).transform.baseVal.consolidate()!.matrix.d,
      );
      expect(reset).toBeCloseTo(1, 9);

      expect(problems).toEqual([]);
      expect(dialogs).toEqual([]);
      expect(requests.filter((url) => !url.startsWith('file:'))).toEqual([]);
    });
  });
}
