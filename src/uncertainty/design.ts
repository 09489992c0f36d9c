// Where the draws of the uncertain parameters fall: a Latin hypercube (McKay, Beckman and Conover, Technometrics 21
// (1979) 239-245), each parameter's range cut into as many strata of equal probability as there are draws, one draw
// in each stratum at a random place, the strata of the parameters paired by independent random permutations; then
// normal scores by the inverse normal (src/numeric/normal.ts), and correlations given by the car file imposed with
// the Cholesky factor of their matrix (which keeps each normal margin exactly; the stratification holds exactly for a
// parameter correlated with none). Seeded: the same seed gives the same draws.

import { CholeskyDecomposition, type Matrix } from 'ml-matrix';
import { seededRandom } from '../numeric/seeded-random.js';
import { normalQuantile } from '../numeric/normal.js';

/** Uniform draws, `count` rows of `dims` numbers in (0, 1), one per stratum in each column. */
export function latinHypercube(count: number, dims: number, seed: number): Float64Array {
  const { uniform } = seededRandom(seed);
  const out = new Float64Array(count * dims);
  const order = new Int32Array(count);
  for (let d = 0; d < dims; d++) {
    for (let i = 0; i < count; i++) order[i] = i;
    // Fisher-Yates shuffle (Knuth, TAOCP vol. 2, algorithm P).
    for (let i = count - 1; i > 0; i--) {
      const j = Math.floor(uniform() * (i + 1));
      const swap = order[i]!;
      order[i] = order[j]!;
      order[j] = swap;
    }
    for (let i = 0; i < count; i++) {
      // Strictly inside the stratum, so that the normal score stays finite.
      const within = Math.min(1 - 1e-12, Math.max(1e-12, uniform()));
      out[i * dims + d] = (order[i]! + within) / count;
    }
  }
  return out;
}

/** Standard normal scores of a Latin hypercube, correlated by `correlation` (dims x dims, or null for none). */
export function normalDraws(count: number, dims: number, seed: number, correlation: Matrix | null): Float64Array {
  const u = latinHypercube(count, dims, seed);
  const z = new Float64Array(count * dims);
  for (let k = 0; k < z.length; k++) z[k] = normalQuantile(u[k]!);
  if (!correlation || dims < 2) return z;
  const lower = new CholeskyDecomposition(correlation).lowerTriangularMatrix;
  const out = new Float64Array(count * dims);
  for (let i = 0; i < count; i++) {
    for (let a = 0; a < dims; a++) {
      let sum = 0;
      for (let b = 0; b <= a; b++) sum += lower.get(a, b) * z[i * dims + b]!;
      out[i * dims + a] = sum;
    }
  }
  return out;
}
