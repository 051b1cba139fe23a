import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf'
import binomialPmf from '@stdlib/stats-base-dists-binomial-pmf'
import erfc from '@stdlib/math-base-special-erfc'
import type { SignProbabilities } from './binomial-walk.js'
import { checkCount, checkLoad } from './check-input.js'

/**
 * One-step instability of a stored bit with clipped synapses J_ij ∝ sign(Σ_μ ξ_i^μ ξ_j^μ)
 * (Sompolinsky, PRA 34, 2571 (1986)) in the large-N Gaussian approximation, J_ii = 0:
 *
 *   P_error(α) = ½ erfc(√(1/(πα))) = ½ erfc(√(2/π) / √(2α)).
 *
 * ## Derivation
 * On pattern 1, ξ_i h_i ∝ Σ_{j≠i} sign(1 + Z_j) with Z_j a sum of P − 1 fair ±1 terms (see
 * `clippedCrosstalkErrorExact`): each term has mean ≈ √(2/(πP)) and variance ≈ 1, so the
 * signal-to-noise ratio is √(2/π)·√(N/P), that of the Hebbian rule (½ erfc(1/√(2α)),
 * Hertz, Krogh & Palmer 1991, ch. 2) times √(2/π): clipping acts like multiplying the load
 * by π/2 in the one-step error.
 *
 * @throws {EngineInputError} when α is negative, NaN or infinite.
 *
 * @example
 * clippedCrosstalkErrorGaussian(0.1)
 * // returns ~5.8e-3 (Hebbian: ~7.8e-4)
 */
export function clippedCrosstalkErrorGaussian (alpha: number): number {
  checkLoad('alpha', alpha)
  if (alpha === 0) return 0
  return 0.5 * erfc(Math.sqrt(1 / (Math.PI * alpha)))
}

/**
 * Exact finite-N probability that a stored bit is unstable (`below`: ξ_i h_i < 0) or has a
 * zero field (`tie`) with clipped synapses J_ij = (√P/N) sign(T_ij), T_ij = Σ_μ ξ_i^μ ξ_j^μ,
 * sign(0) = 0, for unbiased random ±1 patterns, the network on a stored pattern.
 *
 * ## Method (derived here; checked against simulation in test/engine/models)
 * With the network on pattern 1, ξ_i^1 h_i ∝ S + c, c = 1 when J_ii is kept, and
 * S = Σ_{j≠i} s_j, s_j = ξ_i^1 ξ_j^1 sign(T_ij) = sign(1 + Z_j), Z_j = Σ_{μ≥2} u_j^μ with
 * u_j^μ = ξ_i^1 ξ_i^μ ξ_j^1 ξ_j^μ. Given row i, the u_j^μ (j ≠ i, μ ≥ 2) are independent fair
 * coins, so the s_j are i.i.d.: +1 when Z_j ≥ 0, 0 when Z_j = −1 (P even only), −1 when
 * Z_j ≤ −2, with Z_j = 2B − (P − 1), B ~ Binomial(P − 1, ½). S is then a sum of N − 1 i.i.d.
 * three-valued terms: conditioning on the number z of zero terms leaves a binomial walk.
 * Terms of z with negligible weight (beyond 12 standard deviations) are skipped.
 *
 * @throws {EngineInputError} when neurons < 1 or patterns < 1 (or not integers).
 *
 * @example
 * clippedCrosstalkErrorExact(500, 51)
 * // returns { below: ~5.91e-3, tie: 0 }
 */
export function clippedCrosstalkErrorExact (neurons: number, patterns: number, options: { selfCoupling?: boolean } = {}): SignProbabilities {
  checkCount('neurons', neurons, 1)
  checkCount('patterns', patterns, 1)
  const steps = patterns - 1
  const plus = steps === 0 ? 1 : 1 - binomialCdf(Math.ceil(steps / 2) - 1, steps, 0.5)
  const zero = steps % 2 === 1 ? binomialPmf((steps - 1) / 2, steps, 0.5) : 0
  const minus = 1 - plus - zero
  const offset = options.selfCoupling === true ? 1 : 0
  const terms = neurons - 1
  if (zero === 0) return walk(offset, terms, plus)
  const sd = Math.sqrt(terms * zero * (1 - zero))
  const lo = Math.max(0, Math.floor(terms * zero - 12 * sd - 1))
  const hi = Math.min(terms, Math.ceil(terms * zero + 12 * sd + 1))
  let below = 0
  let tie = 0
  for (let z = lo; z <= hi; z++) {
    const weight = binomialPmf(z, terms, zero)
    if (weight === 0) continue
    const part = walk(offset, terms - z, plus / (plus + minus))
    below += weight * part.below
    tie += weight * part.tie
  }
  return { below, tie }
}

/** Sign of offset + 2U − m, U ~ Binomial(m, p). */
function walk (offset: number, m: number, p: number): SignProbabilities {
  if (m === 0) return { below: offset < 0 ? 1 : 0, tie: offset === 0 ? 1 : 0 }
  const t = (m - offset) / 2
  if (Number.isInteger(t)) return { below: t >= 1 ? binomialCdf(t - 1, m, p) : 0, tie: binomialPmf(t, m, p) }
  return { below: binomialCdf(Math.floor(t), m, p), tie: 0 }
}
