/**
 * Raw Hebbian couplings J_ij = Σ_μ ξ_i^μ ξ_j^μ (physical J = raw / N; Hopfield 1982).
 * The diagonal J_ii = P is kept only on request. Exact integers in doubles.
 */
export function hebbianCouplings (patterns: Int8Array, n: number, p: number, selfCoupling: boolean): Float64Array {
  const j = new Float64Array(n * n)
  const row = new Int32Array(n)
  for (let a = 0; a < n; a++) {
    row.fill(0)
    for (let mu = 0; mu < p; mu++) {
      const xa = patterns[mu * n + a]!
      const base = mu * n
      for (let b = 0; b < n; b++) row[b] = row[b]! + xa * patterns[base + b]!
    }
    for (let b = 0; b < n; b++) j[a * n + b] = row[b]!
    if (!selfCoupling) j[a * n + a] = 0
  }
  return j
}
