/**
 * Clipped Hebbian couplings (Sompolinsky, Phys. Rev. A 34, 2571 (1986)), raw units:
 *
 *   J_ij = (√P / N) · sign(T_ij),   T_ij = Σ_μ ξ_i^μ ξ_j^μ,   sign(0) = 0,
 *
 * returned as the integers sign(T_ij) ∈ {−1, 0, +1} with `fieldScale` = √P/N. The scale is
 * Sompolinsky's normalisation J = (√P/N) φ(T/√P) for φ = sign: the couplings have the same
 * r.m.s. size √P/N as the Hebbian ones, so temperatures compare directly. At T = 0 the scale
 * does not matter. A tie T_ij = 0 (possible only for even P) gives a zero coupling. The
 * diagonal sign(T_ii) = sign(P) = 1 is kept only on request.
 *
 * ## Why the capacity drops
 * On a stored pattern each term ξ_i ξ_j sign(T_ij) = sign(1 + Z_j), Z_j a sum of P − 1 fair
 * ±1 terms, has mean ≈ √(2/(πP)) and variance ≈ 1: clipping keeps the noise and multiplies
 * the signal-to-noise ratio by √(2/π) (theory/clipped-crosstalk.ts gives the exact law).
 */
export function clippedCouplings (patterns: Int8Array, n: number, p: number, selfCoupling: boolean): { couplings: Float64Array, fieldScale: number } {
  const j = new Float64Array(n * n)
  const row = new Int32Array(n)
  for (let a = 0; a < n; a++) {
    row.fill(0)
    for (let mu = 0; mu < p; mu++) {
      const base = mu * n
      const xa = patterns[base + a]!
      for (let b = 0; b < n; b++) row[b] = row[b]! + xa * patterns[base + b]!
    }
    const out = a * n
    for (let b = 0; b < n; b++) j[out + b] = clip(row[b]!)
    if (!selfCoupling) j[out + a] = 0
  }
  return { couplings: j, fieldScale: Math.sqrt(p) / n }
}

/** sign(T) for one Hebbian sum, the clipping shared with the sparse representation. */
export function clip (sum: number): number {
  return sum > 0 ? 1 : sum < 0 ? -1 : 0
}
