// The session's corner verdicts: which kind a corner's numbers make, and sentences without a "-0.00" (issue 16: no
// "-0.0" in text for people).

import { describe, expect, it } from 'vitest';
import { cornerVerdicts } from '../../../src/compare/session/corner-verdicts.js';

const corner = { id: 6, name: 'Orrin Corner', bestLap: 1, spreadTimeS: 0.08, referenceTimeS: 9.334 };

describe('corner verdicts', () => {
  it('calls a corner driven at the reference once and 0.07 s slower at the median a matter of consistency', () => {
    // The best lap 0.001 s under the reference (a lap may beat it by rounding of the traces): that reads 0.00 s.
    const [verdict] = cornerVerdicts([{ ...corner, bestTimeS: 9.333, medianTimeS: 9.402 }], 4);
    expect(verdict!.kind).toBe('consistency');
    expect(verdict!.text).toContain('(0.00 s off the reference)');
    expect(verdict!.text).not.toMatch(/-0\.00/);
    // The median gives 9.402 - 9.333 = 0.069 s more than the best: 0.07 s (arithmetic).
    expect(verdict!.text).toContain('the median lap gives 0.07 s more');
  });
});
