// The two ways into a TrackGrid agree: the demo circuit's segment list (its radii and lengths are the file's
// own design values) sampled every 5 m, as a survey would give it, and read back through the centreline
// spline and smoother, keeps the designed length and corner radii.

import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseTrackText } from '../../src/io/read-track.js';
import type { TrackReadOptions } from '../../src/io/track-read-options.js';

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const options: TrackReadOptions = { stepM: 1, columns: {}, widthM: null, layout: 'auto', smoothingM: null };

describe('centreline from sampled segments', () => {
  it('keeps the length within 0.05 %, the 190 m sweeper within 1 % and the 16 m hairpin within 10 %', () => {
    const text = readFileSync(path.join(projectRoot, 'tracks', 'velmora-downs.json'), 'utf8');
    const design = JSON.parse(text) as {
      segments: { kind: string; radiusM?: number; angleDeg?: number; lengthM?: number }[];
      corners: { atM: number; name: string }[];
    };
    const coarse = parseTrackText(text, 'velmora-downs.json', { ...options, stepM: 5 });
    const rows = ['x_m,y_m'];
    for (let i = 0; i < coarse.xM.length; i++) rows.push(`${coarse.xM[i]!.toFixed(3)},${coarse.yM[i]!.toFixed(3)}`);
    const track = parseTrackText(rows.join('\n'), 'velmora-sampled.csv', options);
    expect(track.closed).toBe(true);

    let designLengthM = 0;
    for (const segment of design.segments)
      designLengthM +=
        segment.kind === 'arc' ? segment.radiusM! * Math.abs((segment.angleDeg! * Math.PI) / 180) : segment.lengthM!;
    expect(Math.abs(track.lengthM / designLengthM - 1)).toBeLessThan(5e-4);

    const at = (name: string) => Math.round(design.corners.find((corner) => corner.name === name)!.atM / track.stepM);
    expect(Math.abs(-1 / track.curvaturePerM[at('Larkspur Sweep')]! / 190 - 1)).toBeLessThan(0.01);
    let hairpinPeak = 0;
    const hairpin = at('Corvel Hairpin');
    for (let i = hairpin - 30; i < hairpin + 30; i++) hairpinPeak = Math.max(hairpinPeak, track.curvaturePerM[i]!);
    expect(Math.abs(1 / hairpinPeak / 16 - 1)).toBeLessThan(0.1);
  });
});
