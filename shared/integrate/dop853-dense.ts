import type { RhsFunction } from './dop853-options';

// Dormand–Prince 8(5,3) tableau: nodes C, stage weights A, the 5th- and 3rd-order error
// weights and the order-7 dense-output weights D, as published with Hairer's DOP853 (Hairer,
// Nørsett & Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, §II.10;
// dop853.f, 2004). Transcribed from SciPy's `scipy/integrate/_ivp/dop853_coefficients.py`, which
// reproduces those published digits with 0-based stage numbers: stages 0..11 form the step, stage
// 12 is f(t+h, y_new), stages 13..15 exist only for dense output. Module-local constants (not
// imports, which some loaders turn into getters) let the loop multiply by literals.
const C13 = 0.1;
const C14 = 0.2;
const C15 = 0.777777777777777777777777777778;
const A13_0 = 5.61675022830479523392909219681e-2;
const A13_6 = 2.53500210216624811088794765333e-1;
const A13_7 = -2.46239037470802489917441475441e-1;
const A13_8 = -1.24191423263816360469010140626e-1;
const A13_9 = 1.5329179827876569731206322685e-1;
const A13_10 = 8.20105229563468988491666602057e-3;
const A13_11 = 7.56789766054569976138603589584e-3;
const A13_12 = -8.298e-3;
const A14_0 = 3.18346481635021405060768473261e-2;
const A14_5 = 2.83009096723667755288322961402e-2;
const A14_6 = 5.35419883074385676223797384372e-2;
const A14_7 = -5.49237485713909884646569340306e-2;
const A14_10 = -1.08347328697249322858509316994e-4;
const A14_11 = 3.82571090835658412954920192323e-4;
const A14_12 = -3.40465008687404560802977114492e-4;
const A14_13 = 1.41312443674632500278074618366e-1;
const A15_0 = -4.28896301583791923408573538692e-1;
const A15_5 = -4.69762141536116384314449447206;
const A15_6 = 7.68342119606259904184240953878;
const A15_7 = 4.06898981839711007970213554331;
const A15_8 = 3.56727187455281109270669543021e-1;
const A15_12 = -1.39902416515901462129418009734e-3;
const A15_13 = 2.9475147891527723389556272149;
const A15_14 = -9.15095847217987001081870187138;
const D0_0 = -0.84289382761090128651353491142e1;
const D0_5 = 0.5667149535193777696253178359;
const D0_6 = -0.30689499459498916912797304727e1;
const D0_7 = 0.2384667656512069828772814968e1;
const D0_8 = 0.21170345824450282767155149946e1;
const D0_9 = -0.8713915837779729920678990749;
const D0_10 = 0.2240437430260788275854177165e1;
const D0_11 = 0.6315787787694688181557024929;
const D0_12 = -0.889903364513333108206981174e-1;
const D0_13 = 0.18148505520854727256656404962e2;
const D0_14 = -0.91946323924783554000451984436e1;
const D0_15 = -0.44360363875948939664310572e1;
const D1_0 = 0.10427508642579134603413151009e2;
const D1_5 = 0.24228349177525818288430175319e3;
const D1_6 = 0.16520045171727028198505394887e3;
const D1_7 = -0.37454675472269020279518312152e3;
const D1_8 = -0.22113666853125306036270938578e2;
const D1_9 = 0.77334326684722638389603898808e1;
const D1_10 = -0.30674084731089398182061213626e2;
const D1_11 = -0.93321305264302278729567221706e1;
const D1_12 = 0.15697238121770843886131091075e2;
const D1_13 = -0.31139403219565177677282850411e2;
const D1_14 = -0.93529243588444783865713862664e1;
const D1_15 = 0.3581684148639408375246589854e2;
const D2_0 = 0.19985053242002433820987653617e2;
const D2_5 = -0.38703730874935176555105901742e3;
const D2_6 = -0.18917813819516756882830838328e3;
const D2_7 = 0.52780815920542364900561016686e3;
const D2_8 = -0.11573902539959630126141871134e2;
const D2_9 = 0.68812326946963000169666922661e1;
const D2_10 = -0.1000605096691083840318386098e1;
const D2_11 = 0.7777137798053443209286926574;
const D2_12 = -0.27782057523535084065932004339e1;
const D2_13 = -0.60196695231264120758267380846e2;
const D2_14 = 0.84320405506677161018159903784e2;
const D2_15 = 0.1199229113618278932803513003e2;
const D3_0 = -0.25693933462703749003312586129e2;
const D3_5 = -0.15418974869023643374053993627e3;
const D3_6 = -0.23152937917604549567536039109e3;
const D3_7 = 0.3576391179106141237828534991e3;
const D3_8 = 0.93405324183624310003907691704e2;
const D3_9 = -0.37458323136451633156875139351e2;
const D3_10 = 0.10409964950896230045147246184e3;
const D3_11 = 0.29840293426660503123344363579e2;
const D3_12 = -0.43533456590011143754432175058e2;
const D3_13 = 0.963245539591882829483949506e2;
const D3_14 = -0.39177261675615439165231486172e2;
const D3_15 = -0.14972683625798562581422125276e3;

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
        (A13_0 * k0[i]! +
          A13_6 * k6[i]! +
          A13_7 * k7[i]! +
          A13_8 * k8[i]! +
          A13_9 * k9[i]! +
          A13_10 * k10[i]! +
          A13_11 * k11[i]! +
          A13_12 * k12[i]!);
  }
  rhs(t + C13 * h, yt, k13);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (A14_0 * k0[i]! +
          A14_5 * k5[i]! +
          A14_6 * k6[i]! +
          A14_7 * k7[i]! +
          A14_10 * k10[i]! +
          A14_11 * k11[i]! +
          A14_12 * k12[i]! +
          A14_13 * k13[i]!);
  }
  rhs(t + C14 * h, yt, k14);
  for (let i = 0; i < n; i++) {
    yt[i] =
      y[i]! +
      h *
        (A15_0 * k0[i]! +
          A15_5 * k5[i]! +
          A15_6 * k6[i]! +
          A15_7 * k7[i]! +
          A15_8 * k8[i]! +
          A15_12 * k12[i]! +
          A15_13 * k13[i]! +
          A15_14 * k14[i]!);
  }
  rhs(t + C15 * h, yt, k15);
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
      (D0_0 * k0i +
        D0_5 * k5i +
        D0_6 * k6i +
        D0_7 * k7i +
        D0_8 * k8i +
        D0_9 * k9i +
        D0_10 * k10i +
        D0_11 * k11i +
        D0_12 * k12i +
        D0_13 * k13i +
        D0_14 * k14i +
        D0_15 * k15i);
    f4[i] =
      h *
      (D1_0 * k0i +
        D1_5 * k5i +
        D1_6 * k6i +
        D1_7 * k7i +
        D1_8 * k8i +
        D1_9 * k9i +
        D1_10 * k10i +
        D1_11 * k11i +
        D1_12 * k12i +
        D1_13 * k13i +
        D1_14 * k14i +
        D1_15 * k15i);
    f5[i] =
      h *
      (D2_0 * k0i +
        D2_5 * k5i +
        D2_6 * k6i +
        D2_7 * k7i +
        D2_8 * k8i +
        D2_9 * k9i +
        D2_10 * k10i +
        D2_11 * k11i +
        D2_12 * k12i +
        D2_13 * k13i +
        D2_14 * k14i +
        D2_15 * k15i);
    f6[i] =
      h *
      (D3_0 * k0i +
        D3_5 * k5i +
        D3_6 * k6i +
        D3_7 * k7i +
        D3_8 * k8i +
        D3_9 * k9i +
        D3_10 * k10i +
        D3_11 * k11i +
        D3_12 * k12i +
        D3_13 * k13i +
        D3_14 * k14i +
        D3_15 * k15i);
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
