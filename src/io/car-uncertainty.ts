// The car file's uncertainty block and origin notes: which fields are uncertain and by how much (a standard
// deviation in the field's own unit, named as sweeps name fields), how pairs of them are correlated, and where each
// value came from. Validated against the car they belong to, so a typo or an impossible correlation is one message.

import type { z } from 'zod';
import type { Zod } from './lazy-libraries.js';
import { mlMatrix } from '../numeric/matrix-library.js';
import type { Car, CarUncertainty } from '../car/types.js';
import { CAR_FIELDS, closestField, readCarField } from '../sweep/fields.js';

/** The schemas of the two blocks, built by the car file's schema with its zod. */
export function uncertaintySchemas(z: Zod) {
  return {
    uncertainty: z.strictObject({
      sd: z.record(z.string(), z.number().finite().nonnegative()),
      correlation: z
        .array(z.strictObject({ fields: z.tuple([z.string(), z.string()]), r: z.number().finite().min(-1).max(1) }))
        .optional(),
    }),
    origin: z.record(z.string(), z.string().max(1000)),
  };
}

type UncertaintyFile = z.infer<ReturnType<typeof uncertaintySchemas>['uncertainty']>;

function knownField(field: string, where: string): string | null {
  if (Object.hasOwn(CAR_FIELDS, field)) return null;
  return `${where}: unknown field '${field}' (did you mean '${closestField(field)}'?)`;
}

/** The validated block, or the list of what is wrong with it (each naming its place in the file). */
export function uncertaintyOf(data: UncertaintyFile, car: Car): { uncertainty: CarUncertainty; problems: string[] } {
  const problems: string[] = [];
  for (const field of Object.keys(data.sd)) {
    const unknown = knownField(field, 'field uncertainty.sd');
    if (unknown) problems.push(unknown);
    else if (readCarField(car, field) === null)
      problems.push(`field uncertainty.sd: '${field}' is uncertain but the car file gives it no value`);
  }
  const correlation = (data.correlation ?? []).map(({ fields, r }) => ({ fields: [fields[0], fields[1]] as const, r }));
  correlation.forEach(({ fields }, k) => {
    for (const field of fields)
      if (!Object.hasOwn(data.sd, field))
        problems.push(`field uncertainty.correlation.${k}: '${field}' has no standard deviation in uncertainty.sd`);
    if (fields[0] === fields[1])
      problems.push(`field uncertainty.correlation.${k}: a field cannot be correlated with itself`);
  });
  if (problems.length === 0 && correlation.length > 0) {
    // The pairs must make a valid correlation matrix (positive definite), or no draws can have them.
    const fields = Object.keys(data.sd);
    const { CholeskyDecomposition, Matrix } = mlMatrix();
    const matrix = Matrix.eye(fields.length, fields.length);
    for (const {
      fields: [a, b],
      r,
    } of correlation) {
      matrix.set(fields.indexOf(a), fields.indexOf(b), r);
      matrix.set(fields.indexOf(b), fields.indexOf(a), r);
    }
    if (!new CholeskyDecomposition(matrix).isPositiveDefinite())
      problems.push(
        'field uncertainty.correlation: the correlations contradict one another (their matrix is not positive definite)',
      );
  }
  return { uncertainty: { sd: { ...data.sd }, correlation }, problems };
}

export function originProblems(origin: Record<string, string>): string[] {
  return Object.keys(origin).flatMap((field) => knownField(field, 'field origin') ?? []);
}
