import { parseModel } from '../../shared/model/model-validation';
import type { ChainModel } from '../../shared/model/chain-model';

/**
 * The nondimensional three-level chain of Hastings & Powell (1991, Ecology 72:896–903) in
 * Tropline's model JSON: r = K = e = 1, a1 = 5, a2 = 0.1, b2 = a2·h2 = 2, d1 = 0.4, d2 = 0.01, and
 * b1 = a1·h1 as given (they sweep it over 2.0–6.2). Level names and units are invented.
 */
export function benchmarkChain(b1: number): ChainModel {
  return parseModel({
    timeUnit: 'year',
    levels: [
      { id: 'algae', name: 'Littoral algae', unit: 'g C m^-2', growthRate: 1, carryingCapacity: 1 },
      {
        id: 'grazers',
        name: 'Grazing snails',
        unit: 'g C m^-2',
        attackRate: 5,
        handlingTime: b1 / 5,
        efficiency: 1,
        mortality: 0.4,
      },
      {
        id: 'fish',
        name: 'Pumpkinseed',
        unit: 'g C m^-2',
        attackRate: 0.1,
        handlingTime: 20,
        efficiency: 1,
        mortality: 0.01,
      },
    ],
  });
}

/** A start on the benchmark attractor's basin (any positive state near it does). */
export const BENCHMARK_INITIAL = { algae: 0.76, grazers: 0.16, fish: 9.9 } as const;
