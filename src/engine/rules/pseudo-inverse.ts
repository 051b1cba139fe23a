import { EngineInputError } from '../errors.js'

/**
 * Pseudo-inverse (projection) couplings J = (1/N) Ξᵀ C⁻¹ Ξ with C_μν = ξ^μ·ξ^ν / N
 * (Personnaz, Guyon & Dreyfus 1985; Kanter & Sompolinsky 1987).
 *
 * ## Method
 * C is symmetric positive definite when the patterns are linearly independent, so it is
 * factorised by Cholesky (C = L Lᵀ) and A = C⁻¹ Ξ solved column by column; then
 * J_ij = (1/N) Σ_μ ξ_i^μ A_μj. Cost O(N P² + P³ + N² P). Returned couplings are physical
 * (scale 1). With the diagonal kept every stored pattern satisfies ξ_i h_i = 1 exactly.
 *
 * @throws {EngineInputError} when the patterns are linearly dependent (C singular).
 */
export function pseudoInverseCouplings (patterns: Int8Array, n: number, p: number, selfCoupling: boolean): Float64Array {
  const c = new Float64Array(p * p)
  for (let a = 0; a < p; a++) {
    for (let b = a; b < p; b++) {
      let dot = 0
      for (let i = 0; i < n; i++) dot += patterns[a * n + i]! * patterns[b * n + i]!
      c[a * p + b] = dot / n
      c[b * p + a] = dot / n
    }
  }
  const l = cholesky(c, p)
  if (l === null) throw new EngineInputError('patterns', p, 'the pseudo-inverse rule needs linearly independent patterns (fewer patterns than neurons, no duplicates).')
  // A = C⁻¹ Ξ, one column (neuron) at a time: solve L y = ξ_·i, then Lᵀ a = y.
  const a = new Float64Array(p * n)
  const y = new Float64Array(p)
  for (let i = 0; i < n; i++) {
    for (let r = 0; r < p; r++) {
      let sum = patterns[r * n + i]!
      for (let k = 0; k < r; k++) sum -= l[r * p + k]! * y[k]!
      y[r] = sum / l[r * p + r]!
    }
    for (let r = p - 1; r >= 0; r--) {
      let sum = y[r]!
      for (let k = r + 1; k < p; k++) sum -= l[k * p + r]! * a[k * n + i]!
      a[r * n + i] = sum / l[r * p + r]!
    }
  }
  const j = new Float64Array(n * n)
  for (let mu = 0; mu < p; mu++) {
    const xiBase = mu * n
    for (let r = 0; r < n; r++) {
      const xr = patterns[xiBase + r]! / n
      const row = r * n
      for (let s = 0; s < n; s++) j[row + s] = j[row + s]! + xr * a[xiBase + s]!
    }
  }
  // Symmetrise: J is symmetric in exact arithmetic; rounding must not break energy descent.
  for (let r = 0; r < n; r++) {
    for (let s = r + 1; s < n; s++) {
      const mean = 0.5 * (j[r * n + s]! + j[s * n + r]!)
      j[r * n + s] = mean
      j[s * n + r] = mean
    }
    if (!selfCoupling) j[r * n + r] = 0
  }
  return j
}

/** Lower-triangular Cholesky factor of an SPD matrix, or null when it is not (numerically) positive definite. */
function cholesky (c: Float64Array, p: number): Float64Array | null {
  const l = new Float64Array(p * p)
  for (let r = 0; r < p; r++) {
    for (let k = 0; k <= r; k++) {
      let sum = c[r * p + k]!
      for (let t = 0; t < k; t++) sum -= l[r * p + t]! * l[k * p + t]!
      if (r === k) {
        if (!(sum > 1e-10)) return null
        l[r * p + r] = Math.sqrt(sum)
      } else {
        l[r * p + k] = sum / l[k * p + k]!
      }
    }
  }
  return l
}
