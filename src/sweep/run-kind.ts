// What one run of the pool is: a setup change of a sweep (./evaluate.ts), or one draw of an uncertain reference
// (src/uncertainty/evaluate-draw.ts), told apart by the context, so the same workers serve both.

import { evaluateRun, outcomeWidth, type SweepContext } from './evaluate.js';
import { drawOutcomeWidth, evaluateDraw } from '../uncertainty/evaluate-draw.js';

/** Numbers each run writes. */
export function runWidth(context: SweepContext): number {
  return context.draw ? drawOutcomeWidth({ ...context, draw: context.draw }) : outcomeWidth(context.corners.length);
}

export function runOne(
  context: SweepContext,
  values: ArrayLike<number>,
  out: Float64Array,
  offset: number,
  where: string,
): void {
  if (context.draw) evaluateDraw({ ...context, draw: context.draw }, values, out, offset, where);
  else evaluateRun(context, values, out, offset, where);
}
