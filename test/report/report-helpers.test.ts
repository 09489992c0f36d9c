// The report's small helpers: escaping, JSON for a script element, axis ticks and the drawing decimation.

import { describe, expect, it } from 'vitest';
import { escapeHtml, jsonForScript } from '../../src/report/html/escape.js';
import { niceTicks } from '../../src/report/html/scale.js';
import { minMaxIndices, strideIndices } from '../../src/report/html/downsample.js';
import { gripClass } from '../../src/report/html/palette.js';

describe('escapeHtml', () => {
  it('turns the five HTML-significant characters into entities', () => {
    // OWASP XSS Prevention Cheat Sheet, rule 1 (& < > " ').
    expect(escapeHtml(`<a href="x" title='y'>&</a>`)).toBe(
      '&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;&amp;&lt;/a&gt;',
    );
    expect(escapeHtml('Kettle Corner')).toBe('Kettle Corner');
  });
});

describe('jsonForScript', () => {
  it('cannot close its script element and reads back unchanged', () => {
    const value = { name: '</script><script>alert(1)</script> & <!-- \u2028' };
    const text = jsonForScript(value);
    expect(text).not.toMatch(/[<>&\u2028]/);
    expect(JSON.parse(text)).toEqual(value);
  });
});

describe('niceTicks', () => {
  it('picks 1, 2 or 5 times a power of ten as d3-array does', () => {
    // d3-array README: ticks(0, 1, 5) and ticks(0, 10, 10) (from memory of its documented examples).
    expect(niceTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(0, 10, 10)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    // Step 1472/10 = 147 lies above 100 * sqrt(2), so the step is 200.
    expect(niceTicks(0, 1472, 10)).toEqual([0, 200, 400, 600, 800, 1000, 1200, 1400]);
    expect(niceTicks(-1.5, 1.5, 6)).toEqual([-1.5, -1, -0.5, 0, 0.5, 1, 1.5]);
  });
});

describe('drawing decimation', () => {
  it('keeps a one-sample spike and the ends while dropping most samples', () => {
    const values = new Float64Array(10_000).map((_, i) => Math.sin(i / 500));
    values[4321] = 50;
    values[7777] = -50;
    const kept = minMaxIndices(values, 8);
    expect(kept.length).toBeLessThanOrEqual(2 * Math.ceil(10_000 / 8) + 1);
    expect(kept).toContain(4321);
    expect(kept).toContain(7777);
    expect(kept[0]).toBe(0);
    expect(kept[kept.length - 1]).toBe(9999);
    for (let k = 1; k < kept.length; k++) expect(kept[k]!).toBeGreaterThan(kept[k - 1]!);
  });

  it('strides with the last sample always kept', () => {
    expect(strideIndices(10, 4)).toEqual([0, 4, 8, 9]);
    expect(strideIndices(9, 4)).toEqual([0, 4, 8]);
  });
});

describe('grip classes on the map', () => {
  it('splits at 90 % and 102 % of the envelope', () => {
    expect([0.5, 0.89, 0.9, 1, 1.02, 1.03].map(gripClass)).toEqual([
      'unused',
      'unused',
      'near',
      'near',
      'near',
      'over',
    ]);
  });
});
