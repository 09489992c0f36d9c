// Hostile text in reports and on the terminal: right-to-left overrides and the other bidi controls (Unicode
// UAX #9) are shown as \u escapes, not obeyed; the car page has the same Content-Security-Policy as every page
// and escapes a hostile car name.

import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { escapeHtml, jsonForScript } from '../../src/report/html/escape.js';
import { carPageHtml } from '../../src/report/html/car-page.js';
import { describeCar } from '../../src/car/describe.js';
import { buildEnvelope } from '../../src/car/build-envelope.js';
import { ambientFrom } from '../../src/car/ambient.js';
import { InputError } from '../../src/errors.js';
import { neutraliseBidi } from '../../src/bidi.js';
import { testCar } from '../helpers/cars.js';

// U+202E RIGHT-TO-LEFT OVERRIDE makes "fast\u202Egnp.exe" display as "fastexe.png" (Unicode UAX #9, 2.2).
const OVERRIDDEN = 'fast\u202egnp.exe';
const EVERY_CONTROL = '\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069';

describe('bidi controls', () => {
  it('are written as visible escapes by every path that shows text from a file', () => {
    expect(neutraliseBidi(OVERRIDDEN)).toBe('fast\\u202egnp.exe');
    expect(neutraliseBidi(EVERY_CONTROL)).toBe('\\u202a\\u202b\\u202c\\u202d\\u202e\\u2066\\u2067\\u2068\\u2069');
    expect(escapeHtml(OVERRIDDEN)).toBe('fast\\u202egnp.exe');
    expect(new InputError(`car.json: name: ${OVERRIDDEN}`).message).toBe('car.json: name: fast\\u202egnp.exe');
  });

  it('reach the page script as visible text: the JSON reads back as the escape, not the control', () => {
    const text = jsonForScript({ name: OVERRIDDEN + EVERY_CONTROL });
    expect(text).not.toMatch(/[\u202a-\u202e\u2066-\u2069]/);
    expect((JSON.parse(text) as { name: string }).name).toBe(neutraliseBidi(OVERRIDDEN + EVERY_CONTROL));
  });
});

describe('the car page', () => {
  const hostileName = `<img src=x onerror="window.__carInjected=1"> ${OVERRIDDEN}`;
  const car = { ...testCar(), name: hostileName };
  const envelope = buildEnvelope(car, ambientFrom());
  const page = carPageHtml(describeCar(car, ambientFrom(), envelope), envelope);

  it('has a Content-Security-Policy admitting only its own style sheet, no script, no network', () => {
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]+)">/.exec(page)?.[1];
    expect(csp).toBeDefined();
    expect(csp).toContain("default-src 'none'");
    expect(csp).toContain("script-src 'none'");
    expect(csp).toContain("connect-src 'none'");
    expect(csp).not.toMatch(/unsafe-inline|unsafe-eval|\*/);
    // Hash source as the W3C Content Security Policy Level 3 defines it: base64 of the SHA-256 of the style text.
    const style = /<style>([^<]*)<\/style>/.exec(page)![1]!;
    expect(csp).toContain(`style-src 'sha256-${createHash('sha256').update(style).digest('base64')}'`);
    // A style attribute would need 'unsafe-inline': the page has none, and no script at all.
    expect(page).not.toMatch(/<[^>]*\sstyle\s*=/i);
    expect(page).not.toMatch(/<script\b/i);
  });

  it('escapes a hostile car name (OWASP XSS Prevention Cheat Sheet, rule 1) and shows its override', () => {
    expect(page).not.toContain('<img');
    expect(page).toContain('&lt;img src=x onerror=&quot;window.__carInjected=1&quot;&gt; fast\\u202egnp.exe');
    expect(page).not.toMatch(/[\u202a-\u202e\u2066-\u2069]/);
  });
});
