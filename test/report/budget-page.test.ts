// `reflap budget --html/--svg`: the point on the friction circle drawn where the lateral demand puts it, the arrows
// to the boundary as long as the figures of the friction ellipse (Milliken and Milliken, Race Car Vehicle Dynamics,
// 1995, ch. 2: a_x = a_x,max sqrt(1 - (a_y / a_y,max)^2)), the linear split's ticks at (1 - share) of the straight
// line, and nothing left beyond the limit.

import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { projectRoot, runCli } from '../helpers/cli.js';

const work = mkdtempSync(path.join(tmpdir(), 'reflap-budget-page-'));
const car = path.join(projectRoot, 'cars', 'brackle-club.json');

const attribute = (svg: string, element: string, name: string) =>
  Number(new RegExp(`<${element}[^>]*class="${name}"[^>]*`).exec(svg)![0].match(/data-g="([^"]+)"/)![1]);
const pixel = (svg: string, className: string, key: string) =>
  Number(new RegExp(`class="${className}"[^>]*\\b${key}="([^"]+)"`).exec(svg)![1]);

describe('the budget picture', () => {
  it('puts the demand and the arrows where the friction ellipse puts them', () => {
    const html = path.join(work, 'budget.html');
    const svgs = path.join(work, 'svg');
    // 40 km/h: drag is under 0.01 g there for a club car (from memory), so the tyres' ellipse alone sets the figures.
    const run = runCli([
      'budget',
      '--car',
      car,
      '--speed-kph',
      '40',
      '--lateral-g',
      '0.8',
      '--html',
      html,
      '--svg',
      svgs,
      '--json',
    ]);
    expect(run.code, run.stderr).toBe(0);
    const result = JSON.parse(run.stdout);
    const page = readFileSync(html, 'utf8');
    const svg = readFileSync(path.join(svgs, 'budget.svg'), 'utf8');
    expect(svg).toMatch(/^<\?xml/);
    for (const picture of [page, svg]) {
      const [lat0, lat1] = /data-lateral-px="([^ ]+) ([^"]+)"/.exec(picture)!.slice(1).map(Number) as [number, number];
      const [lon0, lon1] = /data-longitudinal-px="([^ ]+) ([^"]+)"/.exec(picture)!.slice(1).map(Number) as [
        number,
        number,
      ];
      // The demand: 0.8 g lateral, on the zero of the longitudinal axis.
      expect(attribute(picture, 'circle', 'demand')).toBeCloseTo(0.8, 4);
      expect(pixel(picture, 'demand', 'cx')).toBeCloseTo(lat0 + 0.8 * (lat1 - lat0), 0);
      // The braking arrow ends at the braking left on the ellipse, drawn downward.
      const braking = -attribute(picture, 'line', 'braking-left');
      expect(pixel(picture, 'braking-left', 'y2')).toBeCloseTo(lon0 - braking * (lon1 - lon0), 0);
      // Friction ellipse: braking left = straight-line braking times sqrt(1 - share^2) (within 0.03 g for drag).
      const share = 0.8 / result.lateralLimitG;
      expect(Math.abs(braking - result.straightLine.brakingG * Math.sqrt(1 - share * share))).toBeLessThan(0.03);
      // Linear split: (1 - share) of the straight line (within 0.03 g: drag is counted, not split).
      const linear = -attribute(picture, 'line', 'linear-braking');
      expect(Math.abs(linear - result.straightLine.brakingG * (1 - share))).toBeLessThan(0.03);
      expect(linear).toBeLessThan(braking);
    }
    expect(page).toContain('Caution');
    expect(page).not.toMatch(/https?:/);
  });

  it('draws no arrows beyond the lateral limit and says so', () => {
    const html = path.join(work, 'beyond.html');
    const run = runCli(['budget', '--car', car, '--speed-kph', '60', '--lateral-g', '3', '--html', html]);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/Report written to/);
    const page = readFileSync(html, 'utf8');
    expect(page).not.toMatch(/class="braking-left"/);
    expect(page).toMatch(/beyond the lateral limit/);
  });
});
