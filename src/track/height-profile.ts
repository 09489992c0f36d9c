// A track's height profile from a log's GPS altitudes (GPX ele, NMEA GGA): each fix at its distance along the
// centreline, the fixes gathered per grid station and fitted by the weighted Whittaker smoother (./whittaker.ts,
// weights = fixes per station, cyclic on a closed track, so the profile closes on itself however the altitude drifted
// over the session). Its accuracy is stated from the log itself: the scatter of the fixes about the profile, what that
// scatter leaves in a smoothed station if the fixes' errors were independent, and, with two laps or more, how far
// the laps' own profiles differ (GPS heights drift over minutes, so this is usually the larger).

import type { TrackGrid } from './types.js';
import { whittakerSmooth } from './whittaker.js';

/** Default cut-off wavelength of the height smoothing, m: our own choice, longer than a crest or a dip on a circuit
 * (tens of metres) is short, so it keeps hills and drops GPS height noise, which is metres from fix to fix. */
export const DEFAULT_HEIGHT_SMOOTHING_M = 100;

/**
 * Integral over all x of 1 / (1 + x^4)^2 = 3 pi / (4 sqrt 2): the Whittaker smoother's squared gain in units of its
 * cut-off (Gradshteyn and Ryzhik 3.241.4: integral over x > 0 of 1 / (1 + x^4)^2 is (1/4) B(1/4, 7/4)).
 */
const GAIN_SQUARED_INTEGRAL = (3 * Math.PI) / (4 * Math.SQRT2);

export interface HeightProfile {
  /** Height of each station above the log's datum, m. */
  zM: Float64Array;
  smoothingM: number;
  fixes: number;
  /** Whole laps (fixes round at least 90 % of the track). */
  laps: number;
  /** RMS of the fixes about the profile, m. */
  scatterM: number;
  /** Standard error of a station's height if the fixes' errors were independent, m. */
  independentErrorM: number;
  /** RMS difference of one whole lap's own profile from the others', divided by sqrt(laps), m (NaN under 2 laps). */
  lapErrorM: number;
  /** The stated accuracy of the profile: the larger of the two, m. */
  accuracyM: number;
  /** Stations no fix came near (filled in by the smoother). */
  emptyStations: number;
}

/**
 * `alongM` is each fix's distance along the centreline (0 to the track's length), `lapOf` its lap (0, 1, ...), for the
 * lap-to-lap spread.
 */
export function heightProfile(
  track: TrackGrid,
  alongM: Float64Array,
  altitudeM: Float64Array,
  lapOf: Int32Array,
  smoothingM = DEFAULT_HEIGHT_SMOOTHING_M,
): HeightProfile {
  const n = track.distanceM.length;
  const fit = (pick: (k: number) => boolean) => {
    const sum = new Float64Array(n);
    const weight = new Float64Array(n);
    for (let k = 0; k < alongM.length; k++) {
      if (!pick(k) || !Number.isFinite(altitudeM[k]!) || !Number.isFinite(alongM[k]!)) continue;
      const j = stationOf(track, alongM[k]!);
      sum[j] = sum[j]! + altitudeM[k]!;
      weight[j] = weight[j]! + 1;
    }
    const mean = new Float64Array(n);
    for (let j = 0; j < n; j++) mean[j] = weight[j]! > 0 ? sum[j]! / weight[j]! : 0;
    return { z: whittakerSmooth(mean, track.stepM, smoothingM, track.closed, weight), weight };
  };
  const { z, weight } = fit(() => true);
  let fixes = 0;
  let squares = 0;
  let empty = 0;
  for (let k = 0; k < alongM.length; k++) {
    if (!Number.isFinite(altitudeM[k]!) || !Number.isFinite(alongM[k]!)) continue;
    squares += (altitudeM[k]! - z[stationOf(track, alongM[k]!)]!) ** 2;
    fixes++;
  }
  for (let j = 0; j < n; j++) if (weight[j] === 0) empty++;
  const scatterM = fixes > 0 ? Math.sqrt(squares / fixes) : NaN;
  // White noise of variance s^2 at a density of rho fixes per metre has the spectral density s^2 / rho; through the
  // smoother's gain 1 / (1 + (k / kc)^4) its variance is s^2 / rho * kc * GAIN_SQUARED_INTEGRAL / (2 pi).
  const lengthM = track.closed ? track.lengthM : track.distanceM[n - 1]!;
  const perMetre = fixes / Math.max(lengthM, track.stepM);
  const kc = (2 * Math.PI) / smoothingM;
  const independentErrorM = Math.sqrt(
    ((scatterM * scatterM) / perMetre) * kc * (GAIN_SQUARED_INTEGRAL / (2 * Math.PI)),
  );
  const spread = lapSpread(lapOf, fit, n);
  const laps = spread.laps;
  const lapErrorM = spread.errorM;
  return {
    zM: z,
    smoothingM,
    fixes,
    laps,
    scatterM,
    independentErrorM,
    lapErrorM,
    accuracyM: Number.isFinite(lapErrorM) ? Math.max(independentErrorM, lapErrorM) : independentErrorM,
    emptyStations: empty,
  };
}

/**
 * Each lap's own profile against the profile of all the other laps (leave one out), at the stations where the lap has
 * fixes, its constant part removed (the datum is free): the RMS over those stations of all laps, over sqrt(laps) for
 * the mean of the laps. Only laps with fixes round at least MIN_LAP_SHARE of the track take part (a part lap's own
 * profile is mostly the smoother's filling-in).
 */
function lapSpread(
  lapOf: Int32Array,
  fit: (pick: (k: number) => boolean) => { z: Float64Array; weight: Float64Array },
  n: number,
): { errorM: number; laps: number } {
  const ids = [...new Set(Array.from(lapOf))];
  const whole = ids.filter((id) => {
    const { weight } = fit((k) => lapOf[k] === id);
    return coveredShare(weight) >= MIN_LAP_SHARE;
  });
  if (whole.length < 2) return { errorM: NaN, laps: whole.length };
  let squares = 0;
  let count = 0;
  for (const id of whole) {
    const own = fit((k) => lapOf[k] === id);
    const rest = fit((k) => lapOf[k] !== id && whole.includes(lapOf[k]!)).z;
    let mean = 0;
    let m = 0;
    for (let j = 0; j < n; j++) {
      if (own.weight[j] === 0) continue;
      mean += own.z[j]! - rest[j]!;
      m++;
    }
    mean /= m;
    for (let j = 0; j < n; j++) {
      if (own.weight[j] === 0) continue;
      squares += (own.z[j]! - rest[j]! - mean) ** 2;
      count++;
    }
  }
  return { errorM: Math.sqrt(squares / count) / Math.sqrt(whole.length), laps: whole.length };
}

/** A lap counts as whole when its fixes fall in at least this share of the track's 20 m stretches. */
const MIN_LAP_SHARE = 0.9;

function coveredShare(weight: Float64Array): number {
  const stretch = 20;
  let covered = 0;
  let stretches = 0;
  for (let start = 0; start < weight.length; start += stretch) {
    stretches++;
    for (let j = start; j < Math.min(weight.length, start + stretch); j++) {
      if (weight[j]! > 0) {
        covered++;
        break;
      }
    }
  }
  return covered / stretches;
}

function stationOf(track: TrackGrid, alongM: number): number {
  const n = track.distanceM.length;
  const j = Math.round(alongM / track.stepM);
  return track.closed ? ((j % n) + n) % n : Math.min(n - 1, Math.max(0, j));
}
