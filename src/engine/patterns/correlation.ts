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
