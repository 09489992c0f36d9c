// Sample indices on a lap: a closed lap's samples run round (index n is index 0 again, -1 is n - 1), an open
// path's stop at its ends. The wrap is the floored modulo of Knuth (TAOCP vol. 1, 1.2.4), x mod n = x - n floor(x/n).

/** Index k of a closed lap of n samples, brought into 0..n-1 from either side (any integer k). */
export function wrapIndex(k: number, n: number): number {
  return ((k % n) + n) % n;
}

/** A station on a closed lap of lengthM, brought into [0, lengthM) from either side: the same floored modulo. */
export const wrapDistanceM: (distanceM: number, lengthM: number) => number = wrapIndex;

/** Index k of a path of n samples: wrapped on a closed lap, held at the first or last sample on an open path. */
export function lapIndex(k: number, n: number, closed: boolean): number {
  return closed ? wrapIndex(k, n) : Math.min(n - 1, Math.max(0, k));
}
