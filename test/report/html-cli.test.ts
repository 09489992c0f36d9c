// `--html FILE` and `--svg DIR` on `reflap simulate`, end to end through the built CLI.

import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cli.js';

let folder: string;
let hostileCar: string;
const track = 'tracks/tarnwick-club.json';

beforeAll(() => {
  folder = mkdtempSync(join(tmpdir(), 'reflap-html-'));
  hostileCar = join(folder, 'hostile-car.json');
  const car = JSON.parse(readFileSync('cars/brackle-club.json', 'utf8')) as Record<string, unknown>;
  writeFileSync(hostileCar, JSON.stringify({ ...car, name: '<script>window.__reportInjected=1</script>' }));
});

describe('reflap simulate --html / --svg', () => {
  it('writes the page and one SVG per chart, and says where', () => {
    const html = join(folder, 'reference.html');
    const svgDir = join(folder, 'charts');
    const run = runCli(['simulate', '--track', track, '--car', hostileCar, '--html', html, '--svg', svgDir]);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    expect(run.stdout).toContain(`Report written to ${html}`);
    const page = readFileSync(html, 'utf8');
    expect(page.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(page).toContain('&lt;script&gt;window.__reportInjected=1&lt;/script&gt;');
    expect(page.match(/<script\b/g)).toHaveLength(2);
    expect(readdirSync(svgDir).sort()).toEqual(['g-g.svg', 'grip.svg', 'pedals.svg', 'speed.svg', 'track-map.svg']);
  });

  it('refuses a report path that is one of the inputs, exit 2, and writes none of the outputs', () => {
    const svgDir = join(folder, 'refused-charts');
    const before = readFileSync(hostileCar, 'utf8');
    const run = runCli(['simulate', '--track', track, '--car', hostileCar, '--svg', svgDir, '--html', hostileCar]);
    expect(run.code).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(readFileSync(hostileCar, 'utf8')).toBe(before);
    expect(existsSync(svgDir)).toBe(false);
  });
});
