// The speed at which a rising power demand meets the power available, by bisection: a reference solution the
// solver tests compute by hand, independently of the program.

export function speedWherePowerMeets(demandW: (speedMps: number) => number, powerW: number): number {
  let lo = 1;
  let hi = 200;
  for (let k = 0; k < 100; k++) {
    const mid = (lo + hi) / 2;
    if (demandW(mid) < powerW) lo = mid;
    else hi = mid;
  }
  return lo;
}
