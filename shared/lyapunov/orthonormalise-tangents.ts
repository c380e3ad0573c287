/**
 * Re-orthonormalises the k tangent vectors stored after the n state components of `Y`
 * (vector v occupies Y[n + v·n .. n + v·n + n)) by modified Gram–Schmidt, i.e. the QR
 * factorisation Benettin et al. (1980) use, and writes ln R_vv into `logR`. Returns false when a
 * vector is zero or not finite (the exponents are then meaningless). Allocation-free.
 */
export function orthonormaliseTangents(
  Y: Float64Array,
  n: number,
  k: number,
  logR: Float64Array,
): boolean {
  for (let v = 0; v < k; v++) {
    const ov = n + v * n;
    for (let u = 0; u < v; u++) {
      const ou = n + u * n;
      let dot = 0;
      for (let i = 0; i < n; i++) dot += Y[ou + i]! * Y[ov + i]!;
      for (let i = 0; i < n; i++) Y[ov + i] = Y[ov + i]! - dot * Y[ou + i]!;
    }
    let norm = 0;
    for (let i = 0; i < n; i++) norm += Y[ov + i]! * Y[ov + i]!;
    norm = Math.sqrt(norm);
    if (!(norm > 0 && Number.isFinite(norm))) return false;
    for (let i = 0; i < n; i++) Y[ov + i] = Y[ov + i]! / norm;
    logR[v] = Math.log(norm);
  }
  return true;
}
