// Plausible ranges of the physical quantities reflap takes in: wide enough for any car from a kart to a
// prototype (and any logger's units), narrow enough that a typo of a few orders of magnitude, a value near the
// largest double or a unit mix-up is refused at the edge instead of turning into NaN or Infinity inside.
// Bounds are from general engineering knowledge (from memory), each chosen with a wide margin.

/** Fastest speed anywhere in a record (car, envelope, log), m/s: 200 m/s is 720 km/h. */
export const MAX_SPEED_MPS = 200;
/** Largest acceleration in any direction, m/s^2: about 10 g, beyond any car's tyres and aero. */
export const MAX_ACCEL_MPS2 = 100;
/** Coast-down: quadratic term a = k v^2, 1/m; a car's drag gives about 0.0005 to 0.002. */
export const MAX_COAST_QUADRATIC_PER_M = 1;
