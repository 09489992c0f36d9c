// Greedy label placement with collision boxes (common practice in chart and map labelling, no single source): each
// label takes its first clear candidate in order, never covers an obstacle or another label, stays inside its area,
// and is left out (-1) only when every candidate collides.

import { describe, expect, it } from 'vitest';
import { boxAround, boxesOverlap, placeLabels } from '../../src/report/html/label-placement.js';

describe('placeLabels', () => {
  it('moves a label that would cover an earlier one to its next candidate', () => {
    const first = boxAround(50, 10, 20, 10);
    const second = [boxAround(55, 10, 20, 10), boxAround(55, 24, 20, 10)];
    expect(placeLabels([[first], second])).toEqual([0, 1]);
  });

  it('leaves out a label whose every candidate collides, and keeps the gap it is given', () => {
    const taken = boxAround(50, 10, 20, 10);
    // 21 px apart centre to centre: clear with no gap, touching within a 2 px gap.
    const beside = boxAround(71, 10, 20, 10);
    expect(placeLabels([[taken], [beside]], { gap: 0 })).toEqual([0, 0]);
    expect(placeLabels([[taken], [beside]], { gap: 2 })).toEqual([0, -1]);
  });

  it('respects obstacles, the area and a further test of each place', () => {
    const obstacle = boxAround(0, 0, 10, 10);
    const outside = boxAround(200, 0, 10, 10);
    const onObstacle = boxAround(2, 2, 10, 10);
    const refused = boxAround(40, 40, 10, 10);
    const fine = boxAround(60, 60, 10, 10);
    const chosen = placeLabels([[onObstacle, outside, refused, fine]], {
      obstacles: [obstacle],
      within: { x: -20, y: -20, width: 120, height: 120 },
      isClear: (box) => box !== refused,
    });
    expect(chosen).toEqual([3]);
  });

  it('treats boxes that only touch as apart', () => {
    expect(boxesOverlap({ x: 0, y: 0, width: 10, height: 10 }, { x: 10, y: 0, width: 10, height: 10 })).toBe(false);
    expect(boxesOverlap({ x: 0, y: 0, width: 10, height: 10 }, { x: 9, y: 9, width: 10, height: 10 })).toBe(true);
  });
});
