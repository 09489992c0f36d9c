// Rounding to a number of decimal places, one definition for every output: the decimal digits of the number's
// exact binary value, rounded half away from zero (ECMAScript Number.prototype.toFixed), so that a value and its
// negative round alike; a rounded zero is always +0.

/** value rounded to `digits` decimal places; a non-finite value passes through. */
export function roundToDigits(value: number, digits: number): number {
  if (!Number.isFinite(value)) return value;
  const rounded = Number(value.toFixed(digits));
  return rounded === 0 ? 0 : rounded;
}
