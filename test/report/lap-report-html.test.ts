// The lap report page as text: self-contained (no network address), the expected charts with units and
// legends, escaped input text, a Content-Security-Policy that admits exactly the page's own script and
// style, and a size that stays small for a long lap.

import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { XMLValidator } from 'fast-xml-parser';
import { chartSvgs, lapReportHtml } from '../../src/report/html/page.js';
import {
  comparisonInput,
  HOSTILE_CAR_NAME,
  HOSTILE_CORNER_NAME,
  HOSTILE_TRACK_NAME,
  referenceInput,
} from './report-fixtures.js';
import { SAFETY_CAUTION } from '../../src/report/lap-summary.js';

const comparisonPage = lapReportHtml(comparisonInput());
const referencePage = lapReportHtml(referenceInput());

function chartNames(html: string): string[] {
  return [...html.matchAll(/<svg[^>]*\bdata-chart="([^"]+)"/g)].map((m) => m[1]!).sort();
}

function chartSource(html: string, name: string): string {
  const start = html.search(new RegExp(`<svg[^>]*data-chart="${name}"`));
  return html.slice(start, html.indexOf('</svg>', start) + 6);
}

function inlineBlocks(html: string, tag: 'script' | 'style'): { attributes: string; body: string }[] {
  return [...html.matchAll(new RegExp(`<${tag}([^>]*)>([\\s\\S]*?)</${tag}>`, 'g'))].map((m) => ({
    attributes: m[1]!,
    body: m[2]!,
  }));
}

describe('lap report page', () => {
  it('refers to no http or https address and loads nothing from outside', () => {
    for (const page of [comparisonPage, referencePage]) {
      expect(page).not.toMatch(/https?:/i);
      expect(page).not.toMatch(/\/\/[a-z0-9.-]+\.[a-z]{2,}/i);
      // No element that would fetch anything: no src or href attribute, no <link>, no @import or url() to a file.
      expect(page).not.toMatch(/<[^>]*\s(src|href|xlink:href)\s*=/i);
      expect(page).not.toMatch(/<link\b|@import/i);
      for (const match of page.matchAll(/url\(([^)]*)\)/g)) expect(match[1]).toMatch(/^#clip-[a-z]+$/);
    }
  });

  it('holds the map, speed, delta, pedals, grip use and g-g charts, each drawn, with a legend and units', () => {
    expect(chartNames(comparisonPage)).toEqual(['delta', 'gg', 'grip', 'map', 'pedals', 'speed']);
    // A reference lap alone has no driver and so no time delta.
    expect(chartNames(referencePage)).toEqual(['gg', 'grip', 'map', 'pedals', 'speed']);
    const units: Record<string, RegExp[]> = {
      speed: [/speed, km\/h/, /distance, m/],
      delta: [/delta, s/, /distance, m/],
      pedals: [/throttle ↑, %/, /distance, m/],
      grip: [/grip use, %/, /distance, m/],
      gg: [/lateral acceleration, g/, /longitudinal acceleration, g/],
      map: [/\d+ m</],
    };
    for (const [name, patterns] of Object.entries(units)) {
      const svg = chartSource(comparisonPage, name);
      for (const pattern of patterns) expect(svg, `${name} axis units`).toMatch(pattern);
      expect(svg, `${name} legend`).toContain('class="legend"');
      const drawn = [...svg.matchAll(/<path[^>]*\sd="([^"]*)"/g)].filter((m) => m[1]!.length > 20);
      expect(drawn.length, `${name} paths`).toBeGreaterThan(0);
    }
    expect(chartSource(comparisonPage, 'gg')).toContain('demonstrated');
    expect(comparisonPage).toContain(SAFETY_CAUTION.replace(/'/g, '&#39;'));
    expect(referencePage).toContain('<footer>');
  });

  it('admits exactly its own inline script and style through the Content-Security-Policy hashes', () => {
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]+)">/.exec(comparisonPage)?.[1];
    expect(csp).toBeDefined();
    expect(csp).toContain("default-src 'none'");
    expect(csp).toContain("connect-src 'none'");
    expect(csp).not.toMatch(/unsafe-inline|unsafe-eval|\*/);
    // Hash sources as the W3C Content Security Policy Level 3 defines them: base64 of the SHA-256 of the element's text.
    const scripts = inlineBlocks(comparisonPage, 'script').filter(
      (block) => !block.attributes.includes('application/json'),
    );
    expect(scripts).toHaveLength(1);
    const scriptHash = createHash('sha256').update(scripts[0]!.body).digest('base64');
    expect(csp).toContain(`script-src 'sha256-${scriptHash}'`);
    const styles = inlineBlocks(comparisonPage, 'style');
    expect(styles).toHaveLength(1);
    expect(csp).toContain(`style-src 'sha256-${createHash('sha256').update(styles[0]!.body).digest('base64')}'`);
    // Inline style attributes would need 'unsafe-inline'; the page has none.
    expect(comparisonPage).not.toMatch(/<[^>]*\sstyle\s*=/i);
  });

  it('escapes hostile car, track and corner names everywhere, the page data included', () => {
    const input = comparisonInput({
      carName: HOSTILE_CAR_NAME,
      trackName: HOSTILE_TRACK_NAME,
      cornerName: HOSTILE_CORNER_NAME,
    });
    const page = lapReportHtml(input);
    expect(page).not.toContain('<img');
    expect(page).not.toContain('onerror="');
    expect(page).not.toContain('<svg onload');
    expect(page.match(/<script\b/g)).toHaveLength(2);
    expect(page.match(/<\/script>/g)).toHaveLength(2);
    // OWASP XSS Prevention Cheat Sheet, rule 1: & < > " ' as entities in text and attribute values.
    expect(page).toContain('&lt;img src=x onerror=&quot;window.__reportInjected=1&quot;&gt;');
    expect(page).toContain('&lt;/script&gt;&lt;script&gt;window.__reportInjected=2&lt;/script&gt;');
    // The data for the script carries the corner name as JSON with < > & as \u escapes, and reads back unchanged.
    const data = inlineBlocks(page, 'script').find((block) => block.attributes.includes('application/json'))!;
    expect(data.body).not.toMatch(/[<>&]/);
    const parsed = JSON.parse(data.body) as { corners: { label: string }[] };
    expect(parsed.corners[0]!.label).toBe(`corner 1: ${HOSTILE_CORNER_NAME}`);
  });

  it('stays under 3 MB for a 5 km lap at 1 m step', () => {
    // The invented loop is 2 S + 672 m long for straights of S m: S = 2165 m gives about 5 km.
    const input = comparisonInput({ straightM: 2165, stepM: 1 });
    expect(input.reference.track.lengthM).toBeGreaterThan(4950);
    expect(input.reference.trace.count).toBeGreaterThan(4950);
    const bytes = Buffer.byteLength(lapReportHtml(input), 'utf8');
    const referenceBytes = Buffer.byteLength(
      lapReportHtml({ reference: input.reference, carName: input.carName, envelope: input.envelope }),
      'utf8',
    );
    console.log(
      `lap report for ${(input.reference.track.lengthM / 1000).toFixed(2)} km at 1 m: ${(bytes / 1024).toFixed(0)} KiB with a driver, ${(referenceBytes / 1024).toFixed(0)} KiB reference only`,
    );
    expect(bytes).toBeLessThan(3 * 1024 * 1024);
    expect(referenceBytes).toBeLessThan(bytes);
  });

  it('writes each chart as a standalone, well-formed SVG file with its namespace', () => {
    const charts = chartSvgs(comparisonInput());
    expect(charts.map((c) => c.name).sort()).toEqual([
      'delta.svg',
      'g-g.svg',
      'grip.svg',
      'pedals.svg',
      'speed.svg',
      'track-map.svg',
    ]);
    for (const chart of charts) {
      expect(
        chart.svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"'),
      ).toBe(true);
      // Well-formed XML per fast-xml-parser's validator (an SVG viewer rejects anything less).
      expect(XMLValidator.validate(chart.svg), chart.name).toBe(true);
    }
  });
});
