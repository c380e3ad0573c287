// Hand-written declarations for odex 2.0.4 (it ships no .d.ts; see odex-module.js).

/** Right-hand side: returns y' at (x, y). Arrays are plain, 0-based. */
export type Derivative = (x: number, y: number[]) => number[];

/** Called after every accepted step; return false to stop. */
export type OutputFunction = (
  nr: number,
  xold: number,
  x: number,
  y: number[],
  dense?: (c: number, x: number) => number,
) => boolean | void;

export enum Outcome {
  Converged = 0,
  MaxStepsExceeded = 1,
  EarlyReturn = 2,
}

export interface SolveResult {
  y: number[];
  outcome: Outcome;
  nStep: number;
  xEnd: number;
  nAccept: number;
  nReject: number;
  nEval: number;
}

export class Solver {
  constructor(n: number);
  n: number;
  uRound: number;
  maxSteps: number;
  initialStepSize: number;
  maxStepSize: number;
  maxExtrapolationColumns: number;
  stepSizeSequence: number;
  stabilityCheckCount: number;
  stabilityCheckTableLines: number;
  denseOutput: boolean;
  denseOutputErrorEstimator: boolean;
  denseComponents: number[] | undefined;
  interpolationFormulaDegree: number;
  stepSizeReductionFactor: number;
  stepSizeFac1: number;
  stepSizeFac2: number;
  stepSizeFac3: number;
  stepSizeFac4: number;
  stepSafetyFactor1: number;
  stepSafetyFactor2: number;
  relativeTolerance: number | number[];
  absoluteTolerance: number | number[];
  debug: boolean;
  grid(dt: number, out: (xOut: number, yOut: number[]) => unknown): OutputFunction;
  solve(f: Derivative, x: number, y0: number[], xEnd: number, solOut?: OutputFunction): SolveResult;
}
