// Quasi-static load transfer of a rigid car: longitudinal m ax h / L between the axles (Gillespie, Fundamentals
// of Vehicle Dynamics, SAE 1992, ch. 2 and 6), and lateral m ay h / t on each axle in proportion to that axle's
// share of the roll stiffness (Milliken and Milliken, Race Car Vehicle Dynamics, ch. 18, roll-centre heights
// taken as zero so that all lateral transfer goes through the springs and bars).

/** Load moved from the front axle to the rear by a forward acceleration, N (negative under braking). */
export function longitudinalLoadTransferN(
  massKg: number,
  axMps2: number,
  cgHeightM: number,
  wheelbaseM: number,
): number {
  return (massKg * axMps2 * cgHeightM) / wheelbaseM;
}

/** Load moved from the inner to the outer tyre of one axle by a lateral acceleration, N (signed like ay). */
export function lateralLoadTransferN(
  massKg: number,
  ayMps2: number,
  cgHeightM: number,
  trackM: number,
  rollStiffnessShare: number,
): number {
  return (rollStiffnessShare * massKg * ayMps2 * cgHeightM) / trackM;
}
