// Labels a reader can read, measured in Chromium (playwright-core, headless, fresh profile, background networking
// off) from the text the browser lays out, not from the program's own estimates: on the demo's driver page in
// imperial units, the corner numbers of every distance chart sit at their apex and clear of each other, also after a
// zoom; the map's corner numbers clear each other and the track; the g-g envelope curves carry their speeds, clear
// of each other; the read-out speaks mph and feet.

import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import type { Chromium } from './chromium.js';
import type { ReportPages } from './report-pages.js';
import { projectRoot } from '../helpers/cli.js';
import { onSharedLine } from '../helpers/shared-line.js';

const velmora = path.join(projectRoot, 'tracks', 'velmora-downs.json');
const gtCar = path.join(projectRoot, 'cars', 'tarnfell-gt.json');

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Boxes that share more than half a pixel each way (anti-aliasing aside, common practice). */
const overlap = (a: Box, b: Box) =>
  a.x + 0.5 < b.x + b.width && b.x + 0.5 < a.x + a.width && a.y + 0.5 < b.y + b.height && b.y + 0.5 < a.y + a.height;

function overlappingPairs(boxes: (Box & { name: string })[]): string[] {
  const pairs: string[] = [];
  for (let i = 0; i < boxes.length; i++)
    for (let j = i + 1; j < boxes.length; j++)
      if (overlap(boxes[i]!, boxes[j]!)) pairs.push(`${boxes[i]!.name} / ${boxes[j]!.name}`);
  return pairs;
}

/** The visible corner labels of each distance chart: their laid-out boxes, and where their apex is on the plot. */
async function cornerLabelsOf(page: Page) {
  return page.$$eval('svg[data-distance-chart]', (svgs) =>
    svgs.map((svg) => {
      const data = JSON.parse(document.getElementById('lap-data')!.textContent!) as { length: number };
      const left = Number(svg.getAttribute('data-plot-left'));
      const width = Number(svg.getAttribute('data-plot-width'));
      const axis = svg.querySelector('.x-axis')!;
      const ticks = Array.from(axis.querySelectorAll('text.tick')).map((t) => Number(t.textContent));
      return {
        chart: svg.getAttribute('data-chart')!,
        left,
        width,
        length: data.length,
        ticks,
        labels: Array.from(svg.querySelectorAll<SVGTextElement>('.corner-label'))
          .filter((text) => text.getAttribute('visibility') !== 'hidden')
          .map((text) => {
            const box = text.getBBox();
            return {
              name: text.getAttribute('data-corner')!,
              at: Number(text.getAttribute('data-at')),
              x: box.x,
              y: box.y,
              width: box.width,
              height: box.height,
            };
          }),
      };
    }),
  );
}

export function describeLabels(browser: Chromium, pages: ReportPages): void {
  describe('labels', () => {
    let page: Page;
    let problems: string[];

    beforeAll(async () => {
      // The run's exit code is checked in pages.cli (report-pages.ts). The reference is on the demo car's racing line,
      // computed once per run: what is measured here is the layout.
      const log = pages.demo().log;
      const file = pages.cli('imperial', [
        'compare',
        ...onSharedLine(velmora, gtCar),
        '--telemetry',
        log,
        '--units',
        'imperial',
      ]);
      const opened = await browser.open(file);
      page = opened.page;
      problems = opened.problems;
      await page.setViewportSize({
        width: 1280,
        height: Math.ceil(await page.evaluate(() => document.documentElement.scrollHeight)),
      });
    });

    it('numbers the corners of every distance chart at their apex, clear of each other, before and after a zoom', async () => {
      const whole = await cornerLabelsOf(page);
      expect(whole.length).toBe(4);
      for (const chart of whole) {
        // The demo track has eight corners; the whole-lap view may thin a crowded one, never most of them.
        expect(chart.labels.length, chart.chart).toBeGreaterThanOrEqual(7);
        expect(overlappingPairs(chart.labels), chart.chart).toEqual([]);
        for (const label of chart.labels) {
          // Centred on the apex: x = left + at / length * width (a linear axis from 0 to the lap's length).
          const apexX = chart.left + (label.at / chart.length) * chart.width;
          expect(Math.abs(label.x + label.width / 2 - apexX), `${chart.chart} corner ${label.name}`).toBeLessThan(1);
        }
      }
      await page.click('tr.corner-row[data-corner="4"]');
      const zoomed = await cornerLabelsOf(page);
      for (const chart of zoomed) {
        const from = chart.ticks[0]!;
        const labels = chart.labels;
        // Corner 4 and its close neighbour 5 of the chicane are both shown once the view is on them.
        expect(labels.map((l) => l.name)).toContain('4');
        expect(overlappingPairs(labels), chart.chart).toEqual([]);
        // Every shown label lies on the plot, ordered as its apex along the lap.
        for (const label of labels) {
          expect(label.x).toBeGreaterThanOrEqual(chart.left - label.width);
          expect(label.x).toBeLessThanOrEqual(chart.left + chart.width);
        }
        expect(labels.map((l) => l.at)).toEqual([...labels.map((l) => l.at)].sort((a, b) => a - b));
        expect(from).toBeGreaterThan(0);
      }
      await page.click('#zoom-reset');
    });

    it('keeps the map numbers apart and off the track, and names the g-g curves by speed', async () => {
      const marks = await page.$$eval('svg[data-chart="map"] .corner-mark circle', (circles) =>
        circles.map((c) => {
          const box = (c as SVGCircleElement).getBBox();
          return {
            name: c.parentElement!.getAttribute('data-corner')!,
            ...{ x: box.x, y: box.y, width: box.width, height: box.height },
          };
        }),
      );
      expect(marks.length).toBe(8);
      expect(overlappingPairs(marks)).toEqual([]);
      // Off the track: no point of the drawn surface's centre path within the mark's radius.
      const onTrack = await page.$eval('svg[data-chart="map"]', (svg) => {
        const surface = svg.querySelector<SVGPathElement>('.track-surface')!;
        const length = surface.getTotalLength();
        const half = Number(surface.getAttribute('stroke-width')) / 2;
        const circles = Array.from(svg.querySelectorAll<SVGCircleElement>('.corner-mark circle'));
        const hits: string[] = [];
        for (const circle of circles) {
          const cx = circle.cx.baseVal.value;
          const cy = circle.cy.baseVal.value;
          const r = circle.r.baseVal.value;
          for (let s = 0; s <= length; s += 1) {
            const p = surface.getPointAtLength(s);
            if (Math.hypot(p.x - cx, p.y - cy) < r + half - 0.5) {
              hits.push(circle.parentElement!.getAttribute('data-corner')!);
              break;
            }
          }
        }
        return hits;
      });
      expect(onTrack).toEqual([]);
      const curves = await page.$$eval('svg[data-chart="gg"] .curve-label', (texts) =>
        texts.map((t) => {
          const box = (t as SVGTextElement).getBBox();
          return { name: t.textContent!, x: box.x, y: box.y, width: box.width, height: box.height };
        }),
      );
      const caption = await page.$eval(
        'svg[data-chart="gg"]',
        (svg) => /envelope at ([\d, ]+) mph/.exec(svg.textContent!)![1]!,
      );
      expect(curves.map((c) => c.name)).toEqual(caption.split(', ').map((speed) => `${speed} mph`));
      expect(overlappingPairs(curves)).toEqual([]);
    });

    it('reads out mph and feet under the pointer', async () => {
      const area = page.locator('svg[data-chart="speed"] .hover-area');
      const box = (await area.boundingBox())!;
      await page.mouse.move(box.x + box.width * 0.3, box.y + box.height / 2);
      expect(await page.$eval('[data-field="speedR"]', (cell) => cell.textContent)).toMatch(/^\d+\.\d mph$/);
      expect(await page.$eval('[data-field="distance"]', (cell) => cell.textContent)).toMatch(/^\d+ ft$/);
      expect(problems).toEqual([]);
    });

    it('draws the car page in the report frame with its curves named, and no tick label on a curve', async () => {
      // The run's exit code is checked in pages.cli (report-pages.ts).
      const file = pages.cli('car-bicycle', ['car', '--car', 'cars/tarnfell-gt.json', '--model', 'bicycle']);
      const opened = await browser.open(file);
      const car = opened.page;
      // The frame every report page shares, with a caution about the car rather than a lap.
      expect(await car.$$eval('header h1, footer .caution, section.summary .tile', (e) => e.length)).toBeGreaterThan(4);
      const caution = await car.$eval('footer .caution', (e) => e.textContent!);
      expect(caution).toMatch(/car file/);
      expect(caution).not.toMatch(/reference lap/);
      const measured = await car.$eval('svg[data-chart="car-envelope"]', (svg) => {
        const curves = Array.from(svg.querySelectorAll<SVGPathElement>('path.envelope'));
        const points = curves.flatMap((path) => {
          const length = path.getTotalLength();
          const out: { x: number; y: number }[] = [];
          for (let s = 0; s <= length; s += 1) out.push(path.getPointAtLength(s));
          return out;
        });
        const boxOf = (e: Element) => {
          const b = (e as SVGGraphicsElement).getBBox();
          return { name: e.textContent!, x: b.x, y: b.y, width: b.width, height: b.height };
        };
        const tickLabels = Array.from(svg.querySelectorAll('text'))
          .filter((t) => /^-?\d+(\.\d+)?$/.test(t.textContent!.trim()))
          .map(boxOf);
        const onCurve = tickLabels
          .filter((b) => points.some((p) => p.x > b.x && p.x < b.x + b.width && p.y > b.y && p.y < b.y + b.height))
          .map((b) => b.name);
        const speeds = curves.map((path) => path.getAttribute('data-speed')!);
        const labels = Array.from(svg.querySelectorAll('.curve-label')).map(boxOf);
        const titles = Array.from(svg.querySelectorAll('text')).map((t) => t.textContent!);
        return { onCurve, speeds, labels, titles };
      });
      expect(measured.onCurve).toEqual([]);
      expect(measured.labels.map((l) => l.name)).toEqual(measured.speeds.map((speed) => `${speed} km/h`));
      expect(overlappingPairs(measured.labels)).toEqual([]);
      expect(measured.titles).toEqual(
        expect.arrayContaining([
          'lateral acceleration, g (left turn +)',
          'longitudinal acceleration, g (drive +, braking −)',
        ]),
      );
      expect(opened.problems).toEqual([]);
    });
  });
}
