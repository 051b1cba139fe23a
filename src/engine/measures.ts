import type { Network } from './network/network.js'
import type { StabilityRecord } from './results.js'

/**
 * Normalised overlaps m_μ = Σ_i (ξ_i^μ − b) s_i / Σ_i (ξ_i^μ − b) ξ_i^μ of the current state
 * with every stored pattern, into out. With b = 0 (unbiased) this is the usual (1/N) ξ^μ·s;
 * for biased patterns (b = 2a − 1) centring removes the trivial overlap of any sparse state
 * and the pattern's own norm makes m = 1 exactly on the pattern.
 */
export function normalisedOverlaps (net: Network, centre: number, out: Float64Array): void {
  net.rawOverlaps(out)
  if (centre === 0) {
    for (let mu = 0; mu < net.patternCount; mu++) out[mu] = out[mu]! / net.neurons
    return
  }
  const n = net.neurons
  let total = 0
  for (let i = 0; i < n; i++) total += net.state[i]!
  for (let mu = 0; mu < net.patternCount; mu++) out[mu] = (out[mu]! - centre * total) / patternNorm(net, mu, centre)
}

export function targetOverlapOf (net: Network, target: number, centre: number): number {
  const n = net.neurons
  if (centre === 0 && net.rawOverlapWith !== undefined) return net.rawOverlapWith(target) / n
  const base = target * n
  let raw = 0
  let total = 0
  for (let i = 0; i < n; i++) {
    raw += net.patterns[base + i]! * net.state[i]!
    total += net.state[i]!
  }
  return centre === 0 ? raw / n : (raw - centre * total) / patternNorm(net, target, centre)
}

/** Σ_i (ξ_i^μ − b) ξ_i^μ = N − b Σ_i ξ_i^μ. */
function patternNorm (net: Network, mu: number, centre: number): number {
  const n = net.neurons
  let sum = 0
  for (let i = 0; i < n; i++) sum += net.patterns[mu * n + i]!
  return n - centre * sum
}

export function maxOtherOverlap (overlaps: Float64Array, count: number, target: number): number {
  let best = 0
  for (let mu = 0; mu < count; mu++) {
    if (mu !== target && Math.abs(overlaps[mu]!) > best) best = Math.abs(overlaps[mu]!)
  }
  return best
}

/**
 * One-step stability of every stored pattern: put the network on ξ^μ and count neurons
 * with ξ_i h_i < 0 (would flip) and h_i = 0 (kept by the tie rule). The signal-to-noise
 * theory predicts the first fraction (Hertz, Krogh & Palmer 1991, ch. 2).
 */
export function measureStability (net: Network, buffer: Int8Array): StabilityRecord {
  const n = net.neurons
  const p = net.patternCount
  let unstable = 0
  let ties = 0
  let fixed = 0
  for (let mu = 0; mu < p; mu++) {
    for (let i = 0; i < n; i++) buffer[i] = net.patterns[mu * n + i]!
    net.load(buffer)
    let flips = 0
    for (let i = 0; i < n; i++) {
      const aligned = buffer[i]! * net.field(i)
      if (aligned < 0) flips++
      else if (aligned === 0) ties++
    }
    unstable += flips
    if (flips === 0) fixed++
  }
  const bits = n * p
  return { unstableFraction: unstable / bits, tieFraction: ties / bits, fixedPatternFraction: fixed / p }
}
