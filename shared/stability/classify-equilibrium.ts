import type { Eigenvalue } from './eigenvalues';

/** Plain-language class of an equilibrium from its Jacobian eigenvalues. */
export type EquilibriumClass =
  | 'stable node'
  | 'stable spiral'
  | 'unstable node'
  | 'unstable spiral'
  | 'saddle'
  | 'saddle focus'
  | 'non-hyperbolic';

/** Stability of an equilibrium: whether it attracts, its class and a sentence for readers. */
export interface StabilityVerdict {
  /** Whether every eigenvalue has a negative real part (the equilibrium attracts nearby states). */
  readonly stable: boolean;
  /** Plain-language class. */
  readonly classification: EquilibriumClass;
  /** One sentence for non-specialists. */
  readonly description: string;
  /** Largest real part of the eigenvalues (the local growth rate of small deviations). */
  readonly leadingRealPart: number;
}

const DESCRIPTIONS: Record<EquilibriumClass, string> = {
  'stable node': 'Nearby states return to it directly, without oscillating.',
  'stable spiral': 'Nearby states return to it in damped oscillations.',
  'unstable node': 'Nearby states move away from it directly.',
  'unstable spiral': 'Nearby states spiral away from it in growing oscillations.',
  saddle: 'Some nearby states approach it, others move away: it does not attract.',
  'saddle focus':
    'Nearby states oscillate: some approach, others spiral away; it does not attract.',
  'non-hyperbolic':
    'A borderline case (an eigenvalue with zero real part): linearisation cannot decide; a bifurcation is near.',
};

/**
 * Classifies an equilibrium from its eigenvalues. A real part within `zeroTolerance` (relative
 * to the largest eigenvalue magnitude, at least absolute 1e-12) counts as zero.
 */
export function classifyEquilibrium(
  values: readonly Eigenvalue[],
  zeroTolerance = 1e-9,
): StabilityVerdict {
  const scale = Math.max(1, ...values.map((v) => Math.hypot(v.re, v.im)));
  const eps = Math.max(1e-12, zeroTolerance * scale);
  const neg = values.filter((v) => v.re < -eps).length;
  const pos = values.filter((v) => v.re > eps).length;
  const oscillating = values.some((v) => Math.abs(v.im) > eps);
  const leadingRealPart = values.reduce((m, v) => Math.max(m, v.re), -Infinity);
  let classification: EquilibriumClass;
  if (neg + pos < values.length) classification = 'non-hyperbolic';
  else if (pos === 0) classification = oscillating ? 'stable spiral' : 'stable node';
  else if (neg === 0) classification = oscillating ? 'unstable spiral' : 'unstable node';
  else classification = oscillating ? 'saddle focus' : 'saddle';
  return {
    stable: pos === 0 && neg === values.length,
    classification,
    description: DESCRIPTIONS[classification],
    leadingRealPart,
  };
}
