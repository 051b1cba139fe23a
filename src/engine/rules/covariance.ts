/**
 * Covariance rule for biased patterns (Tsodyks & Feigel'man 1988):
 *   J_ij = (1/N) Σ_μ (ξ_i^μ − b)(ξ_j^μ − b),   b = 2a − 1 the nominal mean of the ±1 entries,
 * with a uniform threshold θ on the field of the chosen coding: h_i = Σ_j J_ij s_j − θ for ±1
 * neurons, h_i = Σ_j J_ij V_j − θ for 0/1 neurons V = (1 + s)/2. On a stored pattern an
 * active unit's field is ≈ (1 − b)(1 − b²)·c and a silent one's ≈ −(1 + b)(1 − b²)·c with
 * c = 1 (±1) or ½ (0/1), so the default θ = −b(1 − b²)·c sits midway. `threshold` is
 * θ / (1 − b²). With 0/1 neurons silent units add no crosstalk, which is what lets sparse
 * patterns be stored far beyond the unbiased capacity.
 * Returns physical couplings (scale 1) and θ.
 */
export function covarianceCouplings (patterns: Int8Array, n: number, p: number, activity: number, selfCoupling: boolean, threshold: number | null, binary: boolean): { couplings: Float64Array, theta: number } {
  const b = 2 * activity - 1
  const centred = new Float64Array(p * n)
  for (let k = 0; k < p * n; k++) centred[k] = patterns[k]! - b
  const j = new Float64Array(n * n)
  for (let mu = 0; mu < p; mu++) {
    const base = mu * n
    for (let r = 0; r < n; r++) {
      const cr = centred[base + r]! / n
      const row = r * n
      for (let s = 0; s < n; s++) j[row + s] = j[row + s]! + cr * centred[base + s]!
    }
  }
  if (!selfCoupling) for (let r = 0; r < n; r++) j[r * n + r] = 0
  const theta = (threshold ?? (binary ? -b / 2 : -b)) * (1 - b * b)
  return { couplings: j, theta }
}
