import { levelScales } from '../model/chain-kernel';
import { specialiseChain } from './specialise-chain';
import { initialVector } from '../model/initial-vector';
import { withParameter } from '../model/parameter-pointer';
import { assessKernel, extinctionThresholds } from '../regime/assess-regime';
import type { Regime } from '../regime/classify-regime';
import {
  ANALYSIS_LIMITS as L,
  WORK_WEIGHT,
  assertBound,
} from '../analyses-contract/analysis-limits';
import type { RegimeMapRequest } from '../analyses-contract/sweep-contract';
import { sweepValues } from './run-sweep';

/** One cell of a regime map. */
export interface RegimeMapCell {
  readonly regime: Regime;
  readonly lyapunovExponent: { readonly value: number; readonly standardError: number };
}

/** Weighted time units a regime map integrates. */
export function regimeMapWork(req: RegimeMapRequest): number {
  return req.x.steps * req.y.steps * (req.transient + req.window) * WORK_WEIGHT.exponent;
}

/** Throws AnalysisBoundsError when the map is too large; call before any work. */
export function assertRegimeMapBounds(req: RegimeMapRequest): void {
  assertBound('map-cells', '/y/steps', req.x.steps * req.y.steps, L.maxMapCells);
  assertBound('span', '/transient', req.transient, L.maxSpan);
  assertBound('span', '/window', req.window, L.maxSpan);
  assertBound('work', '/y/steps', regimeMapWork(req), L.maxWork);
}

/**
 * Computes cells [start, end) in row-major order (cell c is x index c mod nx, y index
 * ⌊c / nx⌋), each from `initial` with both parameters set, by the Benettin classification.
 * Cells are independent, so any split gives the same map.
 */
export function runRegimeMapCells(
  req: RegimeMapRequest,
  start: number,
  end: number,
  onCell?: (index: number) => void,
): RegimeMapCell[] {
  const xs = sweepValues(req.x.from, req.x.to, req.x.steps);
  const ys = sweepValues(req.y.from, req.y.to, req.y.steps);
  const cells: RegimeMapCell[] = [];
  for (let c = start; c < end; c++) {
    const xi = c % xs.length;
    const yi = Math.floor(c / xs.length);
    const model = withParameter(
      withParameter(req.model, req.x.parameter, xs[xi]!),
      req.y.parameter,
      ys[yi]!,
    );
    const { report } = assessKernel(
      specialiseChain(model),
      initialVector(model, req.initial as Record<string, number>),
      extinctionThresholds(model, req.extinction),
      {
        transient: req.transient,
        window: req.window,
        tolerance: req.tolerance,
        absoluteTolerance: req.tolerance * Math.min(...levelScales(model)),
      },
    );
    cells.push({ regime: report.regime, lyapunovExponent: report.lyapunovExponent });
    onCell?.(c);
  }
  return cells;
}

/** Arranges row-major cells into the map response: `cells[yIndex][xIndex]`. */
export function assembleRegimeMap(req: RegimeMapRequest, flat: readonly RegimeMapCell[]) {
  const xs = sweepValues(req.x.from, req.x.to, req.x.steps);
  const ys = sweepValues(req.y.from, req.y.to, req.y.steps);
  return {
    x: { parameter: req.x.parameter, values: xs },
    y: { parameter: req.y.parameter, values: ys },
    cells: ys.map((_, j) => flat.slice(j * xs.length, (j + 1) * xs.length)),
  };
}
