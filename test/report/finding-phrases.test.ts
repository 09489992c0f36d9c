// The findings' sentences in both unit systems (the comparison's, lap against lap, the line's): every speed and
// distance of the imperial sentence is the metric sentence's number converted through the exact definitions 1 mph = 0.44704 m/s and 1 ft = 0.3048 m (NIST SP 811,
// appendix B), and the record's SI number converted the same way; seconds, per cent and g are the same in both.

import { describe, expect, it } from 'vitest';
import type { Claim, Finding } from '../../src/compare/types.js';
import { CLAIM_KINDS } from '../../src/compare/findings.js';
import { claimText, findingText } from '../../src/report/finding-phrases.js';
import type { AgainstFinding, Difference } from '../../src/compare/against/against-findings.js';
import type { DriverLineResult, LineFinding } from '../../src/compare/driver-line/driver-line.js';
import { againstFindingText, differenceText } from '../../src/report/against-phrases.js';
import { lineFindingText, lineNotes } from '../../src/report/line-phrases.js';
import { displayUnits } from '../../src/report/units.js';
import { expectConverted } from './converted-quantities.js';

const MPS_PER_MPH = 0.44704; // NIST SP 811, appendix B (exact)
const M_PER_FT = 0.3048; // NIST SP 811, appendix B (exact)

const metric = displayUnits('metric');
const imperial = displayUnits('imperial');

/** One claim of every kind, numbers of the size a club lap gives (invented). */
const CLAIMS: Claim[] = [
  {
    kind: 'brakes-late-and-hard',
    brakingPointDeltaM: 11.3,
    brakingSpeedMps: 41.7,
    overDriven: true,
    peakGripUse: 1.08,
  },
  { kind: 'lifts-before-braking-point', brakingPointDeltaM: -105.04, brakingSpeedMps: 65.81 },
  { kind: 'brakes-early', brakingPointDeltaM: -27.4, brakingSpeedMps: 78.3, brakingPointDeltaS: -0.34 },
  { kind: 'brakes-late', brakingPointDeltaM: 6.2, brakingSpeedMps: 35.1 },
  { kind: 'lifts-where-flat', liftSpeedMps: 57.2 },
  { kind: 'lifts-early', liftPointDeltaM: -23.9 },
  { kind: 'coasts', coastingS: 1.46 },
  { kind: 'slowest-point-low', minSpeedDeltaMps: -6.16, referenceMinSpeedMps: 62.39 },
  { kind: 'slowest-point-misplaced', minSpeedOffsetFromApexM: 56.2, referenceMinSpeedOffsetFromApexM: -12.4 },
  { kind: 'exit-slow', exitSpeedDeltaMps: -3.9 },
  { kind: 'grip-unused', unusedLengthM: 158.3 },
  { kind: 'over-the-limit', peakGripUse: 1.12 },
  { kind: 'loses-in-exit', entryTimeLostS: 0.06, middleTimeLostS: 0.08, exitTimeLostS: 0.57 },
];

describe('a clause of every kind', () => {
  it('covers every kind of claim', () => {
    expect(new Set(CLAIMS.map((claim) => claim.kind))).toEqual(
      new Set(CLAIM_KINDS.filter((kind) => !kind.startsWith('loses-in-') || kind === 'loses-in-exit')),
    );
  });

  for (const claim of CLAIMS)
    it(`${claim.kind}: mph and feet in imperial, each the metric number converted`, () => {
      const metricText = claimText(claim, metric);
      const imperialText = claimText(claim, imperial);
      expect(imperialText).not.toMatch(/km\/h| m\b/);
      expectConverted(metricText, imperialText);
    });

  it('writes the record’s SI numbers through the exact factors, rounded to whole mph and feet', () => {
    const text = claimText(
      { kind: 'brakes-early', brakingPointDeltaM: -27.4, brakingSpeedMps: 78.3, brakingPointDeltaS: -0.34 },
      imperial,
    );
    // 27.4 m / 0.3048 = 89.9 ft; 78.3 m/s / 0.44704 = 175.2 mph (NIST SP 811 factors, worked by hand).
    expect(text).toBe('braking begins 90 ft before the reference at 175 mph (0.34 s at that speed)');
    expect([Math.round(27.4 / M_PER_FT), Math.round(78.3 / MPS_PER_MPH)]).toEqual([90, 175]);
    expect(claimText({ kind: 'slowest-point-low', minSpeedDeltaMps: -6.16, referenceMinSpeedMps: 62.39 }, metric)).toBe(
      // 6.16 m/s x 3.6 = 22.2 km/h; 62.39 m/s x 3.6 = 224.6 km/h (SI definition of the km/h).
      "the slowest point is 22 km/h under the reference's 225 km/h",
    );
  });
});

describe('a whole finding', () => {
  const finding: Finding = {
    corner: 8,
    cornerName: 'Marrow Curve',
    timeS: 0.706,
    claims: [CLAIMS[2]!, CLAIMS[6]!, CLAIMS[7]!],
  };

  it('names the corner and the time at stake in both systems, with the clauses in order', () => {
    const metricText = findingText(finding, metric);
    expect(metricText).toMatch(/^corner 8 \(Marrow Curve\): braking begins 27 m before .*, worth about 0\.71 s; /);
    const imperialText = findingText(finding, imperial);
    expect(imperialText).toMatch(/^corner 8 \(Marrow Curve\): braking begins 90 ft before .*, worth about 0\.71 s; /);
    expect(imperialText).not.toMatch(/km\/h| m\b/);
    expectConverted(metricText, imperialText);
  });
});

describe('lap against lap', () => {
  /** One difference of every kind, both laps' numbers of the size a club lap gives (invented). */
  const DIFFERENCES: Difference[] = [
    { kind: 'braking-point', laterM: 57.2, fastBeforeTurnInM: 141.3, slowBeforeTurnInM: 198.5 },
    { kind: 'braking-point', laterM: -3.4, fastBeforeTurnInM: -95.2, slowBeforeTurnInM: -98.6 },
    { kind: 'does-without-brake' },
    { kind: 'brakes-where-other-lifts' },
    { kind: 'peak-braking', harderMps2: 7.1, fastPeakMps2: 25.0, slowPeakMps2: 17.9 },
    { kind: 'brake-build', soonerS: 0.21, fastBuildS: 0.35, slowBuildS: 0.56 },
    { kind: 'brake-release', deeperM: 14.2, fastFromApexM: -2.1, slowFromApexM: -16.3 },
    { kind: 'brake-release', deeperM: -9.0, fastFromApexM: 0.2, slowFromApexM: 9.2 },
    { kind: 'slowest-speed', moreMps: 0.83, fastMinSpeedMps: 62.5, slowMinSpeedMps: 61.67 },
    { kind: 'slowest-place', fastFromApexM: 3.7, slowFromApexM: -8.8 },
    { kind: 'exit-speed', fasterMps: -1.39, fastExitSpeedMps: 45.1, slowExitSpeedMps: 46.49 },
    { kind: 'coasting', lessS: 0.42 },
  ];

  it('covers every kind of difference', () => {
    expect(new Set(DIFFERENCES.map((d) => d.kind)).size).toBe(10);
  });

  for (const difference of DIFFERENCES)
    it(`${difference.kind}: mph and feet in imperial, each the metric number converted`, () => {
      const metricText = differenceText(difference, metric);
      const imperialText = differenceText(difference, imperial);
      expect(imperialText).not.toMatch(/km\/h| m\b/);
      expectConverted(metricText, imperialText);
    });

  it('a whole finding names the quicker lap, its differences and the way to the reference', () => {
    const finding: AgainstFinding = {
      corner: 1,
      cornerName: 'Corvel Hairpin',
      timeS: 1.21,
      fastLabel: 'lap 3',
      differences: DIFFERENCES.slice(0, 1).concat(DIFFERENCES.slice(10, 11)),
      entryTimeLostS: 0.9,
      middleTimeLostS: 0.2,
      exitTimeLostS: 0.11,
      toReferenceS: 0,
      nearReference: true,
    };
    const metricText = againstFindingText(finding, metric);
    // 57.2 m / 0.3048 = 187.7 ft (NIST SP 811 factor, worked by hand).
    expect(metricText).toMatch(/^corner 1 \(Corvel Hairpin\): lap 3 is 1\.21 s quicker here; it brakes 57 m later/);
    const imperialText = againstFindingText(finding, imperial);
    expect(imperialText).toMatch(/^corner 1 \(Corvel Hairpin\): lap 3 is 1\.21 s quicker here; it brakes 188 ft later/);
    expect(imperialText).toMatch(/copying it is enough\.$/);
    expectConverted(metricText, imperialText);
  });
});

describe('the line', () => {
  const FINDINGS: LineFinding[] = [
    { corner: 3, cornerName: 'Quillon Bend', kind: 'diagonal-entry', brakeAtTurnIn: 0.96, driftUnderBrakingM: 5.87 },
    { corner: 4, cornerName: null, kind: 'turns-in-inside', insideOfReferenceM: 3.42 },
    { corner: 5, cornerName: null, kind: 'misses-apex', wideM: 2.61, apexMissM: 1.4 },
  ];

  for (const finding of FINDINGS)
    it(`${finding.kind}: feet in imperial to a tenth, each the metric number converted`, () => {
      const metricText = lineFindingText(finding, metric);
      const imperialText = lineFindingText(finding, imperial);
      expect(imperialText).not.toMatch(/ m\b/);
      expectConverted(metricText, imperialText);
    });

  it('states the resolution in the reader’s units', () => {
    const line = { scatterM: 0.24, resolutionM: 0.48, placedResolutionM: 3, fromGps: true } as DriverLineResult;
    const [scatter, gps] = lineNotes(line, imperial);
    // 0.24 m / 0.3048 = 0.79 ft; 0.48 m = 1.6 ft; 3 m = 9.8 ft (NIST SP 811 factor, worked by hand).
    expect(scatter).toBe(
      "line: the log's positions scatter by 0.79 ft across the track, so line differences under 1.6 ft are not reported",
    );
    expect(gps).toMatch(/reported only from 9\.8 ft$/);
    lineNotes(line, metric).forEach((note, k) => expectConverted(note, lineNotes(line, imperial)[k]!));
  });
});
