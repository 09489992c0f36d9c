// Lap times as minutes:seconds.milliseconds, the way timing screens and lap charts print them (common practice,
// no source): the sign in front of the whole time, and a time that rounds up to a whole minute carried over.

import { describe, expect, it } from 'vitest';
import { formatLapTime } from '../src/units.js';

describe('formatLapTime', () => {
  it('prints m:ss.sss', () => {
    expect(formatLapTime(0)).toBe('0:00.000');
    expect(formatLapTime(83.4567)).toBe('1:23.457');
    expect(formatLapTime(3600)).toBe('60:00.000');
  });

  it('puts the sign of a negative time in front of the whole time', () => {
    expect(formatLapTime(-5)).toBe('-0:05.000');
    expect(formatLapTime(-65.25)).toBe('-1:05.250');
  });

  it('carries a time that rounds to the next minute', () => {
    expect(formatLapTime(59.9996)).toBe('1:00.000');
  });
});
