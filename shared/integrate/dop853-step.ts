import type { Dop853Settings, RhsFunction } from './dop853-options';

// Dormand–Prince 8(5,3) tableau: nodes C, stage weights A, the 5th- and 3rd-order error
// weights and the order-7 dense-output weights D, as published with Hairer's DOP853 (Hairer,
// Nørsett & Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, §II.10;
// dop853.f, 2004). Transcribed from SciPy's `scipy/integrate/_ivp/dop853_coefficients.py`, which
// reproduces those published digits with 0-based stage numbers: stages 0..11 form the step, stage
// 12 is f(t+h, y_new), stages 13..15 exist only for dense output. Module-local constants (not
// imports, which some loaders turn into getters) let the loop multiply by literals.
const C1 = 0.526001519587677318785587544488e-1;
const C2 = 0.789002279381515978178381316732e-1;
const C3 = 0.11835034190722739672675719751;
const C4 = 0.28164965809277260327324280249;
const C5 = 0.333333333333333333333333333333;
const C6 = 0.25;
const C7 = 0.307692307692307692307692307692;
const C8 = 0.651282051282051282051282051282;
const C9 = 0.6;
const C10 = 0.857142857142857142857142857142;
const C11 = 1.0;
const A1_0 = 5.26001519587677318785587544488e-2;
const A2_0 = 1.97250569845378994544595329183e-2;
const A2_1 = 5.91751709536136983633785987549e-2;
const A3_0 = 2.95875854768068491816892993775e-2;
const A3_2 = 8.87627564304205475450678981324e-2;
const A4_0 = 2.41365134159266685502369798665e-1;
const A4_2 = -8.84549479328286085344864962717e-1;
const A4_3 = 9.24834003261792003115737966543e-1;
const A5_0 = 3.7037037037037037037037037037e-2;
const A5_3 = 1.70828608729473871279604482173e-1;
const A5_4 = 1.25467687566822425016691814123e-1;
const A6_0 = 3.7109375e-2;
const A6_3 = 1.70252211019544039314978060272e-1;
const A6_4 = 6.02165389804559606850219397283e-2;
const A6_5 = -1.7578125e-2;
const A7_0 = 3.70920001185047927108779319836e-2;
const A7_3 = 1.70383925712239993810214054705e-1;
const A7_4 = 1.07262030446373284651809199168e-1;
const A7_5 = -1.53194377486244017527936158236e-2;
const A7_6 = 8.27378916381402288758473766002e-3;
const A8_0 = 6.24110958716075717114429577812e-1;
const A8_3 = -3.36089262944694129406857109825;
const A8_4 = -8.68219346841726006818189891453e-1;
const A8_5 = 2.75920996994467083049415600797e1;
const A8_6 = 2.01540675504778934086186788979e1;
const A8_7 = -4.34898841810699588477366255144e1;
const A9_0 = 4.77662536438264365890433908527e-1;
const A9_3 = -2.48811461997166764192642586468;
const A9_4 = -5.90290826836842996371446475743e-1;
const A9_5 = 2.12300514481811942347288949897e1;
const A9_6 = 1.52792336328824235832596922938e1;
const A9_7 = -3.32882109689848629194453265587e1;
const A9_8 = -2.03312017085086261358222928593e-2;
const A10_0 = -9.3714243008598732571704021658e-1;
const A10_3 = 5.18637242884406370830023853209;
const A10_4 = 1.09143734899672957818500254654;
const A10_5 = -8.14978701074692612513997267357;
const A10_6 = -1.85200656599969598641566180701e1;
const A10_7 = 2.27394870993505042818970056734e1;
const A10_8 = 2.49360555267965238987089396762;
const A10_9 = -3.0467644718982195003823669022;
const A11_0 = 2.27331014751653820792359768449;
const A11_3 = -1.05344954667372501984066689879e1;
const A11_4 = -2.00087205822486249909675718444;
const A11_5 = -1.79589318631187989172765950534e1;
const A11_6 = 2.79488845294199600508499808837e1;
const A11_7 = -2.85899827713502369474065508674;
const A11_8 = -8.87285693353062954433549289258;
const A11_9 = 1.23605671757943030647266201528e1;
const A11_10 = 6.43392746015763530355970484046e-1;
const A12_0 = 5.42937341165687622380535766363e-2;
const A12_5 = 4.45031289275240888144113950566;
const A12_6 = 1.89151789931450038304281599044;
const A12_7 = -5.8012039600105847814672114227;
const A12_8 = 3.1116436695781989440891606237e-1;
const A12_9 = -1.52160949662516078556178806805e-1;
const A12_10 = 2.01365400804030348374776537501e-1;
const A12_11 = 4.47106157277725905176885569043e-2;
const E5_0 = 0.1312004499419488073250102996e-1;
const E5_5 = -0.1225156446376204440720569753e1;
const E5_6 = -0.4957589496572501915214079952;
const E5_7 = 0.1664377182454986536961530415e1;
const E5_8 = -0.350328848749973681688648729;
const E5_9 = 0.3341791187130174790297318841;
const E5_10 = 0.8192320648511571246570742613e-1;
const E5_11 = -0.2235530786388629525884427845e-1;
const BHH_0 = 0.244094488188976377952755905512;
const BHH_8 = 0.733846688281611857341361741547;
const BHH_11 = 0.220588235294117647058823529412e-1;

/** A linear combination of stages: [stage index, weight] pairs, in the order they are summed. */
export type StageCombination = readonly (readonly [number, number])[];

/**
 * The tableau as {@link dop853Attempt} sums it, for code generated from it (`dop853-fused.ts`):
 * stage s (1..11) evaluates at y + h·Σ stages[s], the new state is y + h·Σ weights, and the
 * error estimates are Σ error5 and (Σ weights) − Σ error3, each summed left to right.
 */
// prettier-ignore
export const DOP853_TABLEAU: {
  readonly stages: readonly StageCombination[];
  readonly weights: StageCombination;
  readonly error5: StageCombination;
  readonly error3: StageCombination;
} = {
  stages: [
    [],
    [[0, A1_0]],
    [[0, A2_0], [1, A2_1]],
    [[0, A3_0], [2, A3_2]],
    [[0, A4_0], [2, A4_2], [3, A4_3]],
    [[0, A5_0], [3, A5_3], [4, A5_4]],
    [[0, A6_0], [3, A6_3], [4, A6_4], [5, A6_5]],
    [[0, A7_0], [3, A7_3], [4, A7_4], [5, A7_5], [6, A7_6]],
    [[0, A8_0], [3, A8_3], [4, A8_4], [5, A8_5], [6, A8_6], [7, A8_7]],
    [[0, A9_0], [3, A9_3], [4, A9_4], [5, A9_5], [6, A9_6], [7, A9_7], [8, A9_8]],
    [
      [0, A10_0], [3, A10_3], [4, A10_4], [5, A10_5], [6, A10_6], [7, A10_7], [8, A10_8],
      [9, A10_9],
    ],
    [
      [0, A11_0], [3, A11_3], [4, A11_4], [5, A11_5], [6, A11_6], [7, A11_7], [8, A11_8],
      [9, A11_9], [10, A11_10],
    ],
  ],
  weights: [
    [0, A12_0], [5, A12_5], [6, A12_6], [7, A12_7], [8, A12_8], [9, A12_9], [10, A12_10],
    [11, A12_11],
  ],
  error5: [
    [0, E5_0], [5, E5_5], [6, E5_6], [7, E5_7], [8, E5_8], [9, E5_9], [10, E5_10], [11, E5_11],
  ],
  error3: [[0, BHH_0], [8, BHH_8], [11, BHH_11]],
};

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
  for (let i = 0; i < n; i++) yt[i] = y[i]! + h * (A1_0 * k0[i]!);
  rhs(t + C1 * h, yt, k1);
  for (let i = 0; i < n; i++) yt[i] = y[i]! + h * (A2_0 * k0[i]! + A2_1 * k1[i]!);
  rhs(t + C2 * h, yt, k2);
  for (let i = 0; i < n; i++) yt[i] = y[i]! + h * (A3_0 * k0[i]! + A3_2 * k2[i]!);
  rhs(t + C3 * h, yt, k3);
  for (let i = 0; i < n; i++) {
    yt[i] = y[i]! + h * (A4_0 * k0[i]! + A4_2 * k2[i]! + A4_3 * k3[i]!);
  }
  rhs(t + C4 * h, yt, k4);
  for (let i = 0; i < n; i++) {
    yt[i] = y[i]! + h * (A5_0 * k0[i]! + A5_3 * k3[i]! + A5_4 * k4[i]!);
  }
  rhs(t + C5 * h, yt, k5);
  for (let i = 0; i < n; i++) {
    yt[i] = y[i]! + h * (A6_0 * k0[i]! + A6_3 * k3[i]! + A6_4 * k4[i]! + A6_5 * k5[i]!);
  }
  rhs(t + C6 * h, yt, k6);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! + h * (A7_0 * k0[i]! + A7_3 * k3[i]! + A7_4 * k4[i]! + A7_5 * k5[i]! + A7_6 * k6[i]!);
  }
  rhs(t + C7 * h, yt, k7);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (A8_0 * k0[i]! +
          A8_3 * k3[i]! +
          A8_4 * k4[i]! +
          A8_5 * k5[i]! +
          A8_6 * k6[i]! +
          A8_7 * k7[i]!);
  }
  rhs(t + C8 * h, yt, k8);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (A9_0 * k0[i]! +
          A9_3 * k3[i]! +
          A9_4 * k4[i]! +
          A9_5 * k5[i]! +
          A9_6 * k6[i]! +
          A9_7 * k7[i]! +
          A9_8 * k8[i]!);
  }
  rhs(t + C9 * h, yt, k9);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (A10_0 * k0[i]! +
          A10_3 * k3[i]! +
          A10_4 * k4[i]! +
          A10_5 * k5[i]! +
          A10_6 * k6[i]! +
          A10_7 * k7[i]! +
          A10_8 * k8[i]! +
          A10_9 * k9[i]!);
  }
  rhs(t + C10 * h, yt, k10);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (A11_0 * k0[i]! +
          A11_3 * k3[i]! +
          A11_4 * k4[i]! +
          A11_5 * k5[i]! +
          A11_6 * k6[i]! +
          A11_7 * k7[i]! +
          A11_8 * k8[i]! +
          A11_9 * k9[i]! +
          A11_10 * k10[i]!);
  }
  rhs(t + C11 * h, yt, k11);
  // New state from the 8th-order weights; error from the 5th- and 3rd-order embedded pairs,
  // combined as in DOP853 so that the estimate behaves like an 8th-order one.
  const m = s.errorComponents;
  const atol = s.atol;
  const rtol = s.rtol;
  let err5 = 0;
  let err3 = 0;
  for (let i = 0; i < n; i++) {
    const b =
      A12_0 * k0[i]! +
      A12_5 * k5[i]! +
      A12_6 * k6[i]! +
      A12_7 * k7[i]! +
      A12_8 * k8[i]! +
      A12_9 * k9[i]! +
      A12_10 * k10[i]! +
      A12_11 * k11[i]!;
    const yi = y[i]!;
    const yni = yi + h * b;
    yn[i] = yni;
    if (i < m) {
      const sk = atol + rtol * Math.max(Math.abs(yi), Math.abs(yni));
      const e3 = b - BHH_0 * k0[i]! - BHH_8 * k8[i]! - BHH_11 * k11[i]!;
      const e5 =
        E5_0 * k0[i]! +
        E5_5 * k5[i]! +
        E5_6 * k6[i]! +
        E5_7 * k7[i]! +
        E5_8 * k8[i]! +
        E5_9 * k9[i]! +
        E5_10 * k10[i]! +
        E5_11 * k11[i]!;
      err3 += (e3 / sk) * (e3 / sk);
      err5 += (e5 / sk) * (e5 / sk);
    }
  }
  let deno = err5 + 0.01 * err3;
  if (deno <= 0) deno = 1;
  return Math.abs(h) * err5 * Math.sqrt(1 / (m * deno));
}
