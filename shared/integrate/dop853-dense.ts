import * as T from './dop853-tableau';
import type { RhsFunction } from './dop853-options';

/**
 * Fills the seven coefficient vectors F0..F6 of DOP853's order-7 interpolant on a step
 * [t, t+h] (Hairer's CONTD8): y(t + θh) = y + θ(F0 + (1-θ)(F1 + θ(F2 + (1-θ)(F3 + θ(F4 +
 * (1-θ)(F5 + θF6)))))). Needs the twelve step stages in k[0..11], f(t+h, yNew) in k[12], and
 * computes the three extra stages k[13..15]. Returns the number of rhs evaluations (3).
 */
export function fillDop853Dense(
  rhs: RhsFunction,
  n: number,
  t: number,
  h: number,
  y: Float64Array,
  yNew: Float64Array,
  k: readonly Float64Array[],
  yt: Float64Array,
  f: readonly Float64Array[],
): number {
  const k0 = k[0]!;
  const k5 = k[5]!;
  const k6 = k[6]!;
  const k7 = k[7]!;
  const k8 = k[8]!;
  const k9 = k[9]!;
  const k10 = k[10]!;
  const k11 = k[11]!;
  const k12 = k[12]!;
  const k13 = k[13]!;
  const k14 = k[14]!;
  const k15 = k[15]!;
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A13_0 * k0[i]! +
          T.A13_6 * k6[i]! +
          T.A13_7 * k7[i]! +
          T.A13_8 * k8[i]! +
          T.A13_9 * k9[i]! +
          T.A13_10 * k10[i]! +
          T.A13_11 * k11[i]! +
          T.A13_12 * k12[i]!);
  }
  rhs(t + T.C13 * h, yt, k13);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A14_0 * k0[i]! +
          T.A14_5 * k5[i]! +
          T.A14_6 * k6[i]! +
          T.A14_7 * k7[i]! +
          T.A14_10 * k10[i]! +
          T.A14_11 * k11[i]! +
          T.A14_12 * k12[i]! +
          T.A14_13 * k13[i]!);
  }
  rhs(t + T.C14 * h, yt, k14);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A15_0 * k0[i]! +
          T.A15_5 * k5[i]! +
          T.A15_6 * k6[i]! +
          T.A15_7 * k7[i]! +
          T.A15_8 * k8[i]! +
          T.A15_12 * k12[i]! +
          T.A15_13 * k13[i]! +
          T.A15_14 * k14[i]!);
  }
  rhs(t + T.C15 * h, yt, k15);
  const [f0, f1, f2, f3, f4, f5, f6] = f as [
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
  ];
  for (let i = 0; i < n; i++) {
    const dy = yNew[i]! - y[i]!;
    const hf0 = h * k0[i]!;
    f0[i] = dy;
    f1[i] = hf0 - dy;
    f2[i] = 2 * dy - hf0 - h * k12[i]!;
    const k0i = k0[i]!;
    const k5i = k5[i]!;
    const k6i = k6[i]!;
    const k7i = k7[i]!;
    const k8i = k8[i]!;
    const k9i = k9[i]!;
    const k10i = k10[i]!;
    const k11i = k11[i]!;
    const k12i = k12[i]!;
    const k13i = k13[i]!;
    const k14i = k14[i]!;
    const k15i = k15[i]!;
    f3[i] =
      h *
      (T.D0_0 * k0i +
        T.D0_5 * k5i +
        T.D0_6 * k6i +
        T.D0_7 * k7i +
        T.D0_8 * k8i +
        T.D0_9 * k9i +
        T.D0_10 * k10i +
        T.D0_11 * k11i +
        T.D0_12 * k12i +
        T.D0_13 * k13i +
        T.D0_14 * k14i +
        T.D0_15 * k15i);
    f4[i] =
      h *
      (T.D1_0 * k0i +
        T.D1_5 * k5i +
        T.D1_6 * k6i +
        T.D1_7 * k7i +
        T.D1_8 * k8i +
        T.D1_9 * k9i +
        T.D1_10 * k10i +
        T.D1_11 * k11i +
        T.D1_12 * k12i +
        T.D1_13 * k13i +
        T.D1_14 * k14i +
        T.D1_15 * k15i);
    f5[i] =
      h *
      (T.D2_0 * k0i +
        T.D2_5 * k5i +
        T.D2_6 * k6i +
        T.D2_7 * k7i +
        T.D2_8 * k8i +
        T.D2_9 * k9i +
        T.D2_10 * k10i +
        T.D2_11 * k11i +
        T.D2_12 * k12i +
        T.D2_13 * k13i +
        T.D2_14 * k14i +
        T.D2_15 * k15i);
    f6[i] =
      h *
      (T.D3_0 * k0i +
        T.D3_5 * k5i +
        T.D3_6 * k6i +
        T.D3_7 * k7i +
        T.D3_8 * k8i +
        T.D3_9 * k9i +
        T.D3_10 * k10i +
        T.D3_11 * k11i +
        T.D3_12 * k12i +
        T.D3_13 * k13i +
        T.D3_14 * k14i +
        T.D3_15 * k15i);
  }
  return 3;
}

/** Evaluates component i of the interpolant at θ ∈ [0, 1] from F0..F6 and the step start y. */
export function evalDop853Dense(
  f: readonly Float64Array[],
  y: Float64Array,
  i: number,
  theta: number,
): number {
  const u = 1 - theta;
  const p =
    f[0]![i]! +
    u *
      (f[1]![i]! +
        theta *
          (f[2]![i]! +
            u * (f[3]![i]! + theta * (f[4]![i]! + u * (f[5]![i]! + theta * f[6]![i]!)))));
  return y[i]! + theta * p;
}

/**
 * Writes the monomial coefficients c0..c7 of component i's interpolant in θ (value =
 * Σ c_j θ^j) into `out`, so that callers can differentiate it exactly, e.g. to locate maxima.
 */
export function dop853DenseMonomials(
  f: readonly Float64Array[],
  y: Float64Array,
  i: number,
  out: Float64Array,
): void {
  // Expand the nested form from the inside out: q ← F_j + m(θ)·q with m alternating θ, 1-θ.
  out.fill(0, 0, 8);
  let deg = 0;
  for (let j = 6; j >= 0; j--) {
    out[0] = out[0]! + f[j]![i]!;
    const byTheta = (6 - j) % 2 === 0;
    for (let d = deg + 1; d >= 1; d--) {
      // θ·q shifts up; (1-θ)·q = q - θ·q.
      out[d] = byTheta ? out[d - 1]! : out[d]! - out[d - 1]!;
    }
    if (byTheta) out[0] = 0;
    deg++;
  }
  out[0] = out[0]! + y[i]!;
}
