import type { PatternOverlapRecord } from '../results.js'

/**
 * Summary of the pattern–pattern overlap matrix C_μν = (1/N) ξ^μ·ξ^ν over μ < ν:
 * mean, standard deviation and largest |C|. Independent unbiased patterns give mean 0 and
 * variance 1/N (an elementary binomial fact).
 */
export interface OverlapSummary {
  pairs: number
  mean: number
  sd: number
  maxAbs: number
}

export function summarizePatternOverlaps (patterns: Int8Array, neurons: number, count: number): OverlapSummary {
  let sum = 0
  let sumSq = 0
  let maxAbs = 0
  let pairs = 0
  for (let a = 0; a < count; a++) {
    for (let b = a + 1; b < count; b++) {
      let dot = 0
      for (let i = 0; i < neurons; i++) dot += patterns[a * neurons + i]! * patterns[b * neurons + i]!
      const c = dot / neurons
      sum += c
      sumSq += c * c
      if (Math.abs(c) > maxAbs) maxAbs = Math.abs(c)
      pairs++
    }
  }
  if (pairs === 0) return { pairs, mean: 0, sd: 0, maxAbs: 0 }
  const mean = sum / pairs
  const variance = pairs > 1 ? Math.max(0, (sumSq - pairs * mean * mean) / (pairs - 1)) : 0
  return { pairs, mean, sd: Math.sqrt(variance), maxAbs }
}

/**
 * The overlaps C_μν = (1/N) ξ^μ·ξ^ν of one network's stored patterns over all pairs μ < ν:
 * their mean, mean |C|, root mean square and largest |C|. Sums run in pair order, so the
 * result is bit-reproducible. O(N·P²/2); no pairs (P = 1) gives zeros.
 */
export function measurePatternOverlaps (patterns: Int8Array, neurons: number, count: number): PatternOverlapRecord {
  let sum = 0
  let sumAbs = 0
  let sumSq = 0
  let maxAbs = 0
  let pairs = 0
  for (let a = 0; a < count; a++) {
    const rowA = a * neurons
    for (let b = a + 1; b < count; b++) {
      const rowB = b * neurons
      let dot = 0
      for (let i = 0; i < neurons; i++) dot += patterns[rowA + i]! * patterns[rowB + i]!
      const c = dot / neurons
      const abs = Math.abs(c)
      sum += c
      sumAbs += abs
      sumSq += c * c
      if (abs > maxAbs) maxAbs = abs
      pairs++
    }
  }
  if (pairs === 0) return { pairs, mean: 0, meanAbs: 0, rms: 0, maxAbs: 0 }
  return { pairs, mean: sum / pairs, meanAbs: sumAbs / pairs, rms: Math.sqrt(sumSq / pairs), maxAbs }
}
