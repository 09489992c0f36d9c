// The odex integrator (Hairer and Wanner's GBS extrapolation code ODEX, E. Hairer, S. P. Norsett and G. Wanner,
// Solving Ordinary Differential Equations I, Springer 1993, section II.9), loaded with typings of our own: the
// package ships TypeScript sources that do not compile under strict settings, so the compiler is kept off them.

import { createRequire } from 'node:module';

export type Derivative = (t: number, y: number[]) => number[];
/** Called after each accepted step; return false to stop the integration there. */
export type StepObserver = (
  step: number,
  tOld: number,
  t: number,
  y: number[],
  dense?: (component: number, t: number) => number,
) => boolean | void;

export interface OdexResult {
  y: number[];
  /** 0 converged, 1 too many steps, 2 stopped by the observer. */
  outcome: number;
  nStep: number;
  nAccept: number;
  nReject: number;
  nEval: number;
}

export interface OdexSolver {
  absoluteTolerance: number | number[];
  relativeTolerance: number | number[];
  maxSteps: number;
  maxStepSize: number;
  initialStepSize: number;
  denseOutput: boolean;
  solve(f: Derivative, t0: number, y0: number[], tEnd: number, observer?: StepObserver): OdexResult;
}

interface OdexModule {
  Solver: new (dimension: number) => OdexSolver;
}

const odex = createRequire(import.meta.url)('odex') as OdexModule;

export const newOdexSolver = (dimension: number): OdexSolver => new odex.Solver(dimension);
