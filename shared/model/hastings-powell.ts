import type { ChainModel, ConsumerLevel } from './chain-model';
import { levelScales } from './chain-kernel';
import { parseModel } from './model-validation';

/**
 * The nondimensional groups of a chain in the scaling of Hastings & Powell (1991, Ecology
 * 72:896–903), generalised to 2–4 levels: with S₀ = K, Sⱼ = eⱼ·Sⱼ₋₁ and τ = r·t,
 * aⱼ = aⱼ·Sⱼ/r, bⱼ = aⱼ·hⱼ·Sⱼ₋₁, dⱼ = (mⱼ + Fⱼ)/r (effort harvest Fⱼ adds to mortality).
 * For three levels these are the paper's a1, b1, a2, b2, d1, d2. Index 0 of each array is unused
 * (NaN) so that `a[1]` is the paper's a1.
 */
export interface NondimensionalGroups {
  /** Scaled attack rates aⱼ (index j ≥ 1). */
  readonly a: readonly number[];
  /** Scaled half-saturation inverses bⱼ = aⱼ·hⱼ·Sⱼ₋₁ (index j ≥ 1). */
  readonly b: readonly number[];
  /** Scaled mortalities dⱼ = mⱼ/r, effort harvest included (index j ≥ 1). */
  readonly d: readonly number[];
  /** Model time units per nondimensional time unit: 1/r. */
  readonly timeScale: number;
  /** State scales Sⱼ: level j's density is Sⱼ times its nondimensional value. */
  readonly stateScales: readonly number[];
  /** Producer effort harvest F₀/r, which lowers the scaled growth to 1 − F₀/r (0 if none). */
  readonly producerHarvest: number;
}

/** The three-level groups under the paper's own names. */
export interface HastingsPowellGroups {
  readonly a1: number;
  readonly b1: number;
  readonly a2: number;
  readonly b2: number;
  readonly d1: number;
  readonly d2: number;
}

/** Nondimensional groups of a type II chain (see {@link NondimensionalGroups}). */
export function nondimensionalGroups(model: ChainModel): NondimensionalGroups {
  const r = model.levels[0].growthRate;
  const S = levelScales(model);
  const effort = model.levels.map((l) =>
    (model.harvest ?? []).reduce(
      (s, h) => (h.level === l.id && h.kind === 'effort' ? s + h.rate : s),
      0,
    ),
  );
  const a = [NaN];
  const b = [NaN];
  const d = [NaN];
  for (let j = 1; j < model.levels.length; j++) {
    const c = model.levels[j] as ConsumerLevel;
    a.push((c.attackRate * S[j]!) / r);
    b.push(c.attackRate * c.handlingTime * S[j - 1]!);
    d.push((c.mortality + effort[j]!) / r);
  }
  return { a, b, d, timeScale: 1 / r, stateScales: [...S], producerHarvest: effort[0]! / r };
}

/** The paper's six groups of a three-level chain. Throws RangeError for other lengths. */
export function hastingsPowellGroups(model: ChainModel): HastingsPowellGroups {
  if (model.levels.length !== 3)
    throw new RangeError('the Hastings–Powell groups need exactly three levels');
  const { a, b, d } = nondimensionalGroups(model);
  return { a1: a[1]!, b1: b[1]!, a2: a[2]!, b2: b[2]!, d1: d[1]!, d2: d[2]! };
}

/** The dimensional choices the nondimensional groups leave free. */
export interface DimensionalScales {
  /** Producer growth rate r per model time unit (sets the time scale). */
  readonly growthRate: number;
  /** Carrying capacity K (sets the producer's unit). */
  readonly carryingCapacity: number;
  /** Efficiencies e₁, e₂ (set the consumers' units). */
  readonly efficiencies: readonly [number, number];
}

/**
 * Maps the Hastings–Powell groups back onto a dimensional three-level chain with the given
 * scales, names and units: aⱼ = âⱼ·r/Sⱼ, hⱼ = bⱼ/(aⱼ·Sⱼ₋₁), mⱼ = dⱼ·r. The inverse of
 * {@link hastingsPowellGroups} for a model without harvest or stocking.
 */
export function fromHastingsPowell(
  groups: HastingsPowellGroups,
  scales: DimensionalScales,
  labels: Pick<ChainModel, 'timeUnit'> & {
    levels: readonly { id: string; name: string; unit: string }[];
  },
): ChainModel {
  const { growthRate: r, carryingCapacity: K } = scales;
  const [e1, e2] = scales.efficiencies;
  const S = [K, e1 * K, e1 * e2 * K];
  const a1 = (groups.a1 * r) / S[1]!;
  const a2 = (groups.a2 * r) / S[2]!;
  const [l0, l1, l2] = labels.levels;
  if (!l0 || !l1 || !l2) throw new RangeError('three level labels are needed');
  return parseModel({
    timeUnit: labels.timeUnit,
    levels: [
      { ...l0, growthRate: r, carryingCapacity: K },
      {
        ...l1,
        attackRate: a1,
        handlingTime: groups.b1 / (a1 * S[0]!),
        efficiency: e1,
        mortality: groups.d1 * r,
      },
      {
        ...l2,
        attackRate: a2,
        handlingTime: groups.b2 / (a2 * S[1]!),
        efficiency: e2,
        mortality: groups.d2 * r,
      },
    ],
  });
}
