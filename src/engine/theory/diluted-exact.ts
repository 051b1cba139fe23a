import binomialPmf from '@stdlib/stats-base-dists-binomial-pmf'
import hypergeometricPmf from '@stdlib/stats-base-dists-hypergeometric-pmf'
import { walkSign } from './binomial-walk.js'
import { checkCount, checkOverlap } from './check-input.js'

/**
 * Exact overlap after the first parallel T = 0 step of the fixed in-degree Hebbian network
 * (every neuron has exactly K inputs, distinct other neurons chosen uniformly at random,
 * J_ij = (1/K) Σ_μ ξ_i^μ ξ_j^μ on them), N neurons, P unbiased random ±1 patterns, started
 * from pattern 1 with exactly n_f = round(N(1 − m₀)/2) bits flipped at random.
 *
 * ## Method (derived here; checked against simulation in test/engine/theory)
 * For neuron i, K ξ_i^1 h_i = S + B: the signal S = Σ_{j∈in(i)} ξ_j^1 s_j = K − 2F, where the
 * number F of flipped inputs is hypergeometric (K draws from the N − 1 others, of which n_f,
 * or n_f − 1 when i is flipped itself, are flipped), and the crosstalk
 * B = Σ_{j∈in(i)} Σ_{μ≥2} ξ_i^1 ξ_i^μ ξ_j^μ s_j is a sum of K(P − 1) independent fair ±1
 * terms (each ξ_j^μ is a fresh coin given the cue and ξ^1), independent of S. So
 * E[ξ_i s_i'] = Σ_F P(F)·(P[S + B > 0] − P[S + B < 0] + tie value·P[S + B = 0]), with tie
 * value ξ_i s_i (±1) when a zero field keeps the state and 0 when ties are broken at random.
 * Exact at every N and K (no K ≪ N assumption); the K → ∞ limit is erf(m₀/√(2P/K)).
 *
 * @throws {EngineInputError} on non-integer or too small counts, K ≥ N, or m₀ ∉ [−1, 1].
 *
 * @example
 * dilutedFirstStepExact(2000, 20, 6, 0.5, 'keep')
 */
export function dilutedFirstStepExact (neurons: number, inDegree: number, patterns: number, m0: number, ties: 'keep' | 'random'): number {
  checkCount('neurons', neurons, 2)
  checkCount('inDegree', inDegree, 1)
  checkCount('patterns', patterns, 1)
  checkOverlap('m0', m0)
  if (inDegree > neurons - 1) checkCount('inDegree', inDegree, neurons)
  const flipped = Math.round(neurons * (1 - m0) / 2)
  const steps = inDegree * (patterns - 1)
  const alignment = (flippedOthers: number, tieValue: number): number => {
    let sum = 0
    for (const [f, weight] of hypergeometricTerms(neurons - 1, flippedOthers, inDegree)) {
      const signal = inDegree - 2 * f
      const { below, tie } = walkSign(signal, steps)
      sum += weight * (walkSign(-signal, steps).below - below + tieValue * tie)
    }
    return sum
  }
  const keep = ties === 'keep'
  const agreeing = flipped < neurons ? alignment(flipped, keep ? 1 : 0) : 0
  const disagreeing = flipped > 0 ? alignment(flipped - 1, keep ? -1 : 0) : 0
  return ((neurons - flipped) * agreeing + flipped * disagreeing) / neurons
}

/**
 * The overlap map of the fixed in-degree network at finite K, exact as N → ∞ (tree-like
 * inputs, K fixed) with ties broken at random: m_{t+1} = F_K(m_t),
 *
 *   F_K(m) = Σ_F Bin(F; K, (1 − m)/2) (P[S + B > 0] − P[S + B < 0]),   S = K − 2F,
 *
 * B a sum of K(P − 1) fair ±1 terms. Derived here: on a tree the inputs' states are
 * independent, each agrees with the pattern with probability (1 + m_t)/2, and a global sign
 * flip of pattern μ ≥ 2 within an input's subtree (a symmetry of the disorder) makes the
 * products ξ_j^μ s_j(t) fair coins independent of the signal, at every t. A zero field
 * broken at random contributes 0 and carries no memory; a tie that keeps the state would
 * correlate a neuron's next state with its past, so the map holds for the engine's rule only
 * when K·P is odd (S + B is then never 0). The K → ∞ limit is erf(m/√(2P/K)) (Derrida,
 * Gardner & Zippelius 1987).
 */
export function dilutedMapExact (inDegree: number, patterns: number): (m: number) => number {
  checkCount('inDegree', inDegree, 1)
  checkCount('patterns', patterns, 1)
  const steps = inDegree * (patterns - 1)
  const drift = new Float64Array(inDegree + 1)
  for (let f = 0; f <= inDegree; f++) {
    const signal = inDegree - 2 * f
    drift[f] = walkSign(-signal, steps).below - walkSign(signal, steps).below
  }
  return (m: number) => {
    checkOverlap('m', m)
    const p = (1 - m) / 2
    let sum = 0
    for (let f = 0; f <= inDegree; f++) sum += binomialPmf(f, inDegree, p) * drift[f]!
    return sum
  }
}

/**
 * The overlap the parallel T = 0 dynamics settle at from m₀ under the exact finite-K map
 * (ties broken at random; N → ∞): the limit of F_K iterated from m₀. F_K is increasing, so
 * the iterates move monotonically to the nearest fixed point in their direction. Null when
 * 3000 iterations do not bring two successive iterates within 1e-14 (a marginal fixed point).
 *
 * @example
 * dilutedFixedPointExact(21, 5, 0.6)
 */
export function dilutedFixedPointExact (inDegree: number, patterns: number, m0: number): number | null {
  checkOverlap('m0', m0)
  const map = dilutedMapExact(inDegree, patterns)
  let m = m0
  for (let step = 0; step < 3000; step++) {
    const next = map(m)
    if (Math.abs(next - m) <= 1e-14) return next
    m = next
  }
  return null
}

/** (F, P(F)) for F ~ Hypergeometric(population, successes, draws), skipping terms below 1e-300 of the total. */
function * hypergeometricTerms (population: number, successes: number, draws: number): Generator<[number, number]> {
  const lo = Math.max(0, draws - (population - successes))
  const hi = Math.min(draws, successes)
  const mean = draws * successes / population
  const sd = Math.sqrt(Math.max(0, draws * (successes / population) * (1 - successes / population) * (population - draws) / Math.max(1, population - 1)))
  // Beyond 40 standard deviations (and at least 40 terms) the weights are below 1e-300.
  const from = Math.max(lo, Math.floor(mean - 40 * sd - 40))
  const to = Math.min(hi, Math.ceil(mean + 40 * sd + 40))
  for (let f = from; f <= to; f++) {
    const weight = hypergeometricPmf(f, population, successes, draws)
    if (weight > 0) yield [f, weight]
  }
}
