/**
 * Covariance rule for biased patterns (Tsodyks & Feigel'man 1988), written for ±1 spins:
 *   J_ij = (1/N) Σ_μ (ξ_i^μ − b)(ξ_j^μ − b),   b = 2a − 1 the nominal mean of the entries,
 * with a uniform threshold θ so that h_i = Σ_j J_ij s_j − θ. On a stored pattern the
 * field of an active unit is ≈ (1 − b)(1 − b²) and of a silent one ≈ −(1 + b)(1 − b²);
 * the default θ = −b(1 − b²) sits midway. `threshold` is θ / (1 − b²).
 * Returns physical couplings (scale 1) and the bias −θ.
 */
export function covarianceCouplings (patterns: Int8Array, n: number, p: number, activity: number, selfCoupling: boolean, threshold: number | null): { couplings: Float64Array, bias: number } {
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
  const theta = (threshold ?? -b) * (1 - b * b)
  return { couplings: j, bias: -theta }
}
