import { HASTINGS_POWELL_BENCHMARK } from '@tropline/core';
import type { SweepRequest } from '@tropline/widgets';

/**
 * A sweep of the grazer's handling time in Hastings & Powell's (1991) three-level benchmark
 * (b1 = a·h), recording the top level's long-run maxima: three values over 0.4–0.6 with short
 * spans by default, so a test or story computes it in the page in moments. Any field may be
 * overridden.
 */
export function benchmarkSweep(overrides: Partial<SweepRequest> = {}): SweepRequest {
  const { model, initial } = HASTINGS_POWELL_BENCHMARK;
  return {
    model,
    initial,
    parameter: '/levels/1/handlingTime',
    from: 0.4,
    to: 0.6,
    steps: 3,
    observe: model.levels[2]!.id,
    transient: 500,
    window: 500,
    ...overrides,
  };
}
