import * as T from './dop853-tableau';
import type { Dop853Settings, RhsFunction } from './dop853-options';

/**
 * One DOP853 step attempt from (t, y) of size h: the twelve stages into k[0..11] (k[0] = f(t, y)
 * on entry), the 8th-order solution into `yn`, and the scaled error norm as the return value, the
 * 5th- and 3rd-order embedded estimates combined as in DOP853 so that it behaves like an
 * 8th-order one (Hairer, Nørsett & Wanner, Solving ODEs I, §II.10). Makes 11 rhs evaluations.
 */
export function dop853Attempt(
  rhs: RhsFunction,
  n: number,
  t: number,
  h: number,
  y: Float64Array,
  yn: Float64Array,
  yt: Float64Array,
  k: readonly Float64Array[],
  s: Dop853Settings,
): number {
  const k0 = k[0]!;
  const k1 = k[1]!;
  const k2 = k[2]!;
  const k3 = k[3]!;
  const k4 = k[4]!;
  const k5 = k[5]!;
  const k6 = k[6]!;
  const k7 = k[7]!;
  const k8 = k[8]!;
  const k9 = k[9]!;
  const k10 = k[10]!;
  const k11 = k[11]!;
  for (let i = 0; i < n; i++) yt[i] = y[i]! + h * (T.A1_0 * k0[i]!);
  rhs(t + T.C1 * h, yt, k1);
  for (let i = 0; i < n; i++) yt[i] = y[i]! + h * (T.A2_0 * k0[i]! + T.A2_1 * k1[i]!);
  rhs(t + T.C2 * h, yt, k2);
  for (let i = 0; i < n; i++) yt[i] = y[i]! + h * (T.A3_0 * k0[i]! + T.A3_2 * k2[i]!);
  rhs(t + T.C3 * h, yt, k3);
  for (let i = 0; i < n; i++) {
    yt[i] = y[i]! + h * (T.A4_0 * k0[i]! + T.A4_2 * k2[i]! + T.A4_3 * k3[i]!);
  }
  rhs(t + T.C4 * h, yt, k4);
  for (let i = 0; i < n; i++) {
    yt[i] = y[i]! + h * (T.A5_0 * k0[i]! + T.A5_3 * k3[i]! + T.A5_4 * k4[i]!);
  }
  rhs(t + T.C5 * h, yt, k5);
  for (let i = 0; i < n; i++) {
    yt[i] = y[i]! + h * (T.A6_0 * k0[i]! + T.A6_3 * k3[i]! + T.A6_4 * k4[i]! + T.A6_5 * k5[i]!);
  }
  rhs(t + T.C6 * h, yt, k6);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h * (T.A7_0 * k0[i]! + T.A7_3 * k3[i]! + T.A7_4 * k4[i]! + T.A7_5 * k5[i]! + T.A7_6 * k6[i]!);
  }
  rhs(t + T.C7 * h, yt, k7);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A8_0 * k0[i]! +
          T.A8_3 * k3[i]! +
          T.A8_4 * k4[i]! +
          T.A8_5 * k5[i]! +
          T.A8_6 * k6[i]! +
          T.A8_7 * k7[i]!);
  }
  rhs(t + T.C8 * h, yt, k8);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A9_0 * k0[i]! +
          T.A9_3 * k3[i]! +
          T.A9_4 * k4[i]! +
          T.A9_5 * k5[i]! +
          T.A9_6 * k6[i]! +
          T.A9_7 * k7[i]! +
          T.A9_8 * k8[i]!);
  }
  rhs(t + T.C9 * h, yt, k9);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A10_0 * k0[i]! +
          T.A10_3 * k3[i]! +
          T.A10_4 * k4[i]! +
          T.A10_5 * k5[i]! +
          T.A10_6 * k6[i]! +
          T.A10_7 * k7[i]! +
          T.A10_8 * k8[i]! +
          T.A10_9 * k9[i]!);
  }
  rhs(t + T.C10 * h, yt, k10);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (T.A11_0 * k0[i]! +
          T.A11_3 * k3[i]! +
          T.A11_4 * k4[i]! +
          T.A11_5 * k5[i]! +
          T.A11_6 * k6[i]! +
          T.A11_7 * k7[i]! +
          T.A11_8 * k8[i]! +
          T.A11_9 * k9[i]! +
          T.A11_10 * k10[i]!);
  }
  rhs(t + T.C11 * h, yt, k11);
  // New state from the 8th-order weights; error from the 5th- and 3rd-order embedded pairs,
  // combined as in DOP853 so that the estimate behaves like an 8th-order one.
  const m = s.errorComponents;
  let err5 = 0;
  let err3 = 0;
  for (let i = 0; i < n; i++) {
    const b =
      T.A12_0 * k0[i]! +
      T.A12_5 * k5[i]! +
      T.A12_6 * k6[i]! +
      T.A12_7 * k7[i]! +
      T.A12_8 * k8[i]! +
      T.A12_9 * k9[i]! +
      T.A12_10 * k10[i]! +
      T.A12_11 * k11[i]!;
    const yi = y[i]!;
    const yni = yi + h * b;
    yn[i] = yni;
    if (i < m) {
      const sk = s.atol + s.rtol * Math.max(Math.abs(yi), Math.abs(yni));
      const e3 = b - T.BHH_0 * k0[i]! - T.BHH_8 * k8[i]! - T.BHH_11 * k11[i]!;
      const e5 =
        T.E5_0 * k0[i]! +
        T.E5_5 * k5[i]! +
        T.E5_6 * k6[i]! +
        T.E5_7 * k7[i]! +
        T.E5_8 * k8[i]! +
        T.E5_9 * k9[i]! +
        T.E5_10 * k10[i]! +
        T.E5_11 * k11[i]!;
      err3 += (e3 / sk) * (e3 / sk);
      err5 += (e5 / sk) * (e5 / sk);
    }
  }
  let deno = err5 + 0.01 * err3;
  if (deno <= 0) deno = 1;
  return Math.abs(h) * err5 * Math.sqrt(1 / (m * deno));
}
