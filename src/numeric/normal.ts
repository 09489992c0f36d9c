// The standard normal distribution: quantile by Wichura's algorithm AS 241 (Applied Statistics 37 (1988) 477-484,
// PPND16, about 1e-16 relative), and the logarithm of its distribution function through the complementary error
// function of Numerical Recipes (Press et al., 2nd ed. 1992, section 6.2, erfcc: fractional error below 1.2e-7),
// written in log form so that it stays finite far into the lower tail.

const A = [
  3.387132872796366608, 133.14166789178437745, 1971.5909503065514427, 13731.693765509461125, 45921.953931549871457,
  67265.770927008700853, 33430.575583588128105, 2509.0809287301226727,
];
const B = [
  1, 42.313330701600911252, 687.1870074920579083, 5394.1960214247511077, 21213.794301586595867, 39307.89580009271061,
  28729.085735721942674, 5226.495278852854561,
];
const C = [
  1.42343711074968357734, 4.6303378461565452959, 5.7694972214606914055, 3.64784832476320460504, 1.27045825245236838258,
  0.24178072517745061177, 0.0227238449892691845833, 7.7454501427834140764e-4,
];
const D = [
  1, 2.05319162663775882187, 1.6763848301838038494, 0.68976733498510000455, 0.14810397642748007459,
  0.0151986665636164571966, 5.475938084995344946e-4, 1.05075007164441684324e-9,
];
const E = [
  6.6579046435011037772, 5.4637849111641143699, 1.7848265399172913358, 0.29656057182850489123, 0.026532189526576123093,
  0.0012426609473880784386, 2.71155556874348757815e-5, 2.01033439929228813265e-7,
];
const F = [
  1, 0.59983220655588793769, 0.13692988092273580531, 0.0148753612908506148525, 7.868691311456132591e-4,
  1.8463183175100546818e-5, 1.4215117583164458887e-7, 2.04426310338993978564e-15,
];

function horner(coefficients: readonly number[], x: number): number {
  let value = coefficients[coefficients.length - 1]!;
  for (let k = coefficients.length - 2; k >= 0; k--) value = value * x + coefficients[k]!;
  return value;
}

/** z with Phi(z) = p, for 0 < p < 1 (AS 241). */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normal quantile needs 0 < p < 1 (got ${p})`);
  const q = p - 0.5;
  if (Math.abs(q) <= 0.425) {
    const r = 0.180625 - q * q;
    return (q * horner(A, r)) / horner(B, r);
  }
  let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
  let value: number;
  if (r <= 5) {
    r -= 1.6;
    value = horner(C, r) / horner(D, r);
  } else {
    r -= 5;
    value = horner(E, r) / horner(F, r);
  }
  return q < 0 ? -value : value;
}

/** ln erfc(x) for x >= 0 (Numerical Recipes' erfcc, kept in log form). */
function logErfcNonNegative(x: number): number {
  const t = 1 / (1 + 0.5 * x);
  const poly =
    -1.26551223 +
    t *
      (1.00002368 +
        t *
          (0.37409196 +
            t *
              (0.09678418 +
                t *
                  (-0.18628806 +
                    t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277))))))));
  return Math.log(t) - x * x + poly;
}

/** ln Phi(z), finite for any finite z. */
export function logNormalCdf(z: number): number {
  const x = -z / Math.SQRT2;
  // Phi(z) = erfc(-z / sqrt 2) / 2.
  if (x >= 0) return logErfcNonNegative(x) - Math.LN2;
  return Math.log1p(-0.5 * Math.exp(logErfcNonNegative(-x)));
}

export function normalCdf(z: number): number {
  return Math.exp(logNormalCdf(z));
}

const LOG_SQRT_TWO_PI = 0.5 * Math.log(2 * Math.PI);

/** ln phi(z), the log density of the standard normal. */
export function logNormalPdf(z: number): number {
  return -0.5 * z * z - LOG_SQRT_TWO_PI;
}

/**
 * Student's t quantile for nu degrees of freedom by the expansion in z = Phi^-1(p) of Abramowitz and Stegun,
 * Handbook of Mathematical Functions (1964), 26.7.5 (four terms; within 0.001 of the tables for nu >= 4).
 */
export function studentQuantile(p: number, nu: number): number {
  const z = normalQuantile(p);
  const z2 = z * z;
  const g1 = (z * (z2 + 1)) / 4;
  const g2 = (z * ((5 * z2 + 16) * z2 + 3)) / 96;
  const g3 = (z * (((3 * z2 + 19) * z2 + 17) * z2 - 15)) / 384;
  const g4 = (z * ((((79 * z2 + 776) * z2 + 1482) * z2 - 1920) * z2 - 945)) / 92160;
  return z + g1 / nu + g2 / (nu * nu) + g3 / nu ** 3 + g4 / nu ** 4;
}
