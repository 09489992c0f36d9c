// Bisection for the largest value that still holds: a predicate true from lo up to some point and false beyond it
// (a force the tyres can give, a speed the car can still accelerate at). Halving keeps the bracket [lo, hi] with
// lo holding; after k steps the answer is within (hi - lo) / 2^k (Burden and Faires, Numerical Analysis, 2.1).

/**
 * The largest value in [lo, hi] found to hold, given that lo holds and hi does not: at most maxSteps halvings,
 * stopping early once the bracket is no wider than widthTolerance.
 */
export function largestHolding(
  holds: (value: number) => boolean,
  lo: number,
  hi: number,
  maxSteps: number,
  widthTolerance = 0,
): number {
  for (let k = 0; k < maxSteps && hi - lo > widthTolerance; k++) {
    const mid = 0.5 * (lo + hi);
    if (holds(mid)) lo = mid;
    else hi = mid;
  }
  return lo;
}
