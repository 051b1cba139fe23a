/**
 * What a pattern family implies for the overlaps C_μν = (1/N) ξ^μ·ξ^ν between its stored
 * patterns, beside which measured values are shown (PatternOverlapSummary.expected).
 */
import binomialCdf from '@stdlib/stats-base-dists-binomial-cdf'
import type { PointParams } from '../params.js'

export interface PatternOverlapExpectation {
  /** Expected mean of C over the pairs. */
  mean: number | null
  /** √(expected mean of C²). */
  rms: number | null
  /** Expected mean |C| (unbiased independent patterns only). */
  meanAbs: number | null
  /** Median of the largest |C| over the pairs (unbiased independent patterns only). */
  maxAbs: number | null
}

const NONE: PatternOverlapExpectation = { mean: null, rms: null, meanAbs: null, maxAbs: null }

// MAIN //

/**
 * Expectations for the point's family over all P(P − 1)/2 pairs.
 *
 * - Independent entries with activity a (mean b = 2a − 1): E C = b², E C² = b⁴ + (1 − b⁴)/N
 *   (each product ξ_i^μ ξ_i^ν has mean b² and variance 1 − b⁴); unbiased, E C² = 1/N and
 *   N(1 + C)/2 is binomial (CHECK_VALUES §12), so E|C| and the largest |C| follow exactly.
 * - Correlated children of K parents with parent overlap q: two children of one parent
 *   agree on an entry with mean q² (both copied it, probability q²; otherwise the entries are
 *   independent and unbiased), children of different parents are independent; so a
 *   same-parent pair has E C = q², E C² = q⁴ + (1 − q⁴)/N, and any other pair E C = 0,
 *   E C² = 1/N (elementary, from the family's definition).
 * - Supplied patterns: nothing is implied.
 */
export function patternOverlapExpectation (p: PointParams): PatternOverlapExpectation {
  const n = p.neurons
  const pairs = p.patterns * (p.patterns - 1) / 2
  if (pairs === 0) return NONE
  const f = p.family
  if (f.kind === 'random') {
    const b2 = (2 * f.activity - 1) ** 2
    const rms = Math.sqrt(b2 * b2 + (1 - b2 * b2) / n)
    if (b2 !== 0) return { mean: b2, rms, meanAbs: null, maxAbs: null }
    return { mean: 0, rms, meanAbs: meanAbsUnbiased(n), maxAbs: medianLargestAbs(n, pairs) }
  }
  if (f.kind === 'correlated') {
    const same = sameParentPairs(p.patterns, f.parents)
    const q2 = f.parentOverlap * f.parentOverlap
    const meanSquare = (same * (q2 * q2 + (1 - q2 * q2) / n) + (pairs - same) / n) / pairs
    return { mean: same * q2 / pairs, rms: Math.sqrt(meanSquare), meanAbs: null, maxAbs: null }
  }
  return NONE
}

/** Pairs μ < ν of P patterns with μ ≡ ν (mod K): children of the same parent. */
export function sameParentPairs (patterns: number, parents: number): number {
  let same = 0
  for (let c = 0; c < Math.min(parents, patterns); c++) {
    const size = Math.floor((patterns - 1 - c) / parents) + 1
    same += size * (size - 1) / 2
  }
  return same
}

const meanAbsCache = new Map<number, number>()

/**
 * E|C| for two independent unbiased ±1 patterns of length N: E|2D − N|/N with D binomial
 * (N, ½), which is C(N − 1, ⌊(N − 1)/2⌋)/2^{N−1} (de Moivre's mean absolute deviation of the
 * binomial; the closed form recalled from memory and checked by enumeration in the tests);
 * ≈ √(2/(πN)) for large N.
 *
 * ## Method
 * With m = N − 1 and j = ⌊m/2⌋: C(2j, j)/4^j = Π_{k=1}^{j} (2k − 1)/(2k), and for odd
 * m = 2j + 1, C(m, j)/2^m is that times (2j + 1)/(2j + 2). No overflow or underflow for any N.
 */
export function meanAbsUnbiased (n: number): number {
  const cached = meanAbsCache.get(n)
  if (cached !== undefined) return cached
  const m = n - 1
  const j = Math.floor(m / 2)
  let ratio = 1
  for (let k = 1; k <= j; k++) ratio *= (2 * k - 1) / (2 * k)
  if (m % 2 === 1) ratio *= (2 * j + 1) / (2 * j + 2)
  if (meanAbsCache.size > 64) meanAbsCache.clear()
  meanAbsCache.set(n, ratio)
  return ratio
}

/**
 * The median of the largest |C| over `pairs` pairs of independent unbiased patterns of length
 * N: the smallest attainable c with P(|C| ≤ c)^pairs ≥ ½. The pairs of one pattern set are
 * pairwise independent (C_12 and C_13 are independent given ξ¹) but not jointly, so this is
 * the independent-pairs approximation (common practice for extreme values).
 *
 * ## Method
 * |C|·N = |2D − N| takes the values k ≡ N (mod 2); bisection on k with the exact binomial
 * tail P(|2D − N| > k) = 2·P(D ≤ (N − k)/2 − 1) and the condition pairs·ln(1 − tail) ≥ −ln 2.
 */
export function medianLargestAbs (n: number, pairs: number): number {
  const holds = (k: number): boolean => {
    const below = Math.ceil((n - k) / 2) - 1
    const tail = below < 0 ? 0 : Math.min(1, 2 * binomialCdf(below, n, 0.5))
    return pairs * Math.log1p(-tail) >= -Math.LN2
  }
  let lo = n % 2
  let hi = n
  if (holds(lo)) return lo / n
  while (hi - lo > 2) {
    let mid = Math.floor((lo + hi) / 2)
    if ((mid - n) % 2 !== 0) mid -= 1
    if (mid <= lo) break
    if (holds(mid)) hi = mid
    else lo = mid
  }
  return hi / n
}
