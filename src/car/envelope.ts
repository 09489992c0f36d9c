// The g-g-v envelope: the accelerations a car can reach at each speed. The solver sees only this interface,
// so a point-mass model, a bicycle model or an envelope fitted to a driver's own data plug in unchanged.
// loadFactor: the normal force from gravity and the road's own curvature (slope, bank, crest or compression) as a
// share of the car's weight on level ground; 1 (left out) is a flat road, and gives exactly the flat limits.
// Call the methods on the envelope (`envelope.accelLimitMps2(v, ay)`): an implementation may keep its numbers on the
// object and share one set of methods between cars; to pass one on, wrap it (`(v) => envelope.gearAt(v)`).

export interface Envelope {
  /** Short label for reports: 'point-mass', 'bicycle', 'demonstrated'. */
  readonly kind: string;
  /** Top speed the car can reach on a level straight, m/s (finite). */
  readonly topSpeedMps: number;
  /** Pure lateral limit at this speed, m/s^2; side > 0 for a left turn, < 0 for a right turn. */
  lateralLimitMps2(speedMps: number, side: number, loadFactor?: number): number;
  /** Where the model has a closed form for it: the largest v^2 at which a lateral demand d0 + d1 v^2 (signed, m/s^2)
   * fits lateralLimitMps2 under a load factor l0 + l1 v^2, to rounding; null where the closed form does not apply.
   * The solver settles the last units in the last place against lateralLimitMps2 itself. */
  cornerSpeedSquaredEstimate?(load0: number, loadPerV2: number, demand0: number, demandPerV2: number): number | null;
  /** Largest net forward acceleration at this speed while using lateralMps2 (signed) for turning, m/s^2;
   * net of drag and rolling resistance, so it may be negative near top speed. */
  accelLimitMps2(speedMps: number, lateralMps2: number, loadFactor?: number): number;
  /** Largest net deceleration at this speed while turning with lateralMps2, m/s^2, positive; drag helps. Never less
   * than coastDecelMps2 at the same speed and a positive load factor (the tyres' braking force is never negative): the
   * solver skips the braking limit on a descent that coasting alone holds the car on. */
  brakeLimitMps2(speedMps: number, lateralMps2: number, loadFactor?: number): number;
  /** Deceleration with neither drive nor brakes (drag plus rolling resistance), m/s^2, positive. */
  coastDecelMps2(speedMps: number, loadFactor?: number): number;
  /** Share of the tyres' friction limit in use by this combination (1 = on the limit, above 1 = beyond it); the
   * engine's power limit is not part of it (see driveLimitMps2). */
  gripUse(speedMps: number, axMps2: number, ayMps2: number): number;
  /** Drive the engine can give at this speed (and gear), as force over mass, m/s^2, before the tyre limit and
   * before drag: the pedal's full travel. */
  driveLimitMps2(speedMps: number): number;
  /** Gear in use at this speed where the car has gears, else 0. */
  gearAt(speedMps: number): number;
}
