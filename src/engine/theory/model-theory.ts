import type { PointParams } from '../params.js'
import { clippedCrosstalkErrorExact, clippedCrosstalkErrorGaussian } from './clipped-crosstalk.js'
import { clippedCriticalLoad, clippedRetrievalOverlap } from './clipped-retrieval.js'
import { denseCapacity, denseCrosstalkErrorGaussian, exponentialCapacityExponent } from './dense-memory.js'
import { DILUTED_CRITICAL_LOAD, dilutedOverlapMap, dilutedRetrievalOverlap } from './diluted-overlap-map.js'
import { softmaxSeparationThreshold } from './softmax-bound.js'

/**
 * Theory values for the model families beyond the fully connected coupling-matrix rules,
 * or null when the point is not one of them (theoryForPoint then applies). Every value
 * assumes unbiased random ±1 patterns; {} when the patterns are anything else.
 *
 * - clipped rule, fully connected: `loadAlpha`, `clippedCrosstalkErrorGaussian`,
 *   `clippedCrosstalkErrorExact`, `clippedCrosstalkTieExact` (one-step instability of a
 *   stored bit; compare with the stability measure); J_ii = 0 also `clippedCriticalLoad`
 *   (≈ 0.1018) and, at T = 0 with asynchronous updates, `clippedRetrievalOverlap`.
 * - fixed in-degree K (hebbian rule): `dilutedLoad` = P/K, `dilutedCriticalLoad` = 2/π; at
 *   T = 0 `dilutedRetrievalOverlap` (the fixed point of the overlap map, any update order),
 *   and with synchronous updates and a flip cue `dilutedFirstStepOverlap` = erf(m₀/√(2α)).
 * - dense-polynomial: `denseCrosstalkErrorGaussian`, `denseCapacity` (a pattern count).
 * - dense-exponential: `exponentialLoad` = ln(P)/N and `exponentialCapacityExponent`, the
 *   bound on it for the cue's fraction ρ of wrong bits (flip cues; ρ = 0 otherwise).
 * - modern-softmax: `softmaxSeparationThreshold`, the separation Δ a pattern needs for
 *   one-update retrieval (P ≥ 2).
 */
export function modelTheoryForPoint (p: PointParams): Record<string, number> | null {
  const rule = p.rule
  const inDegree = p.dilution?.kind === 'fixed-in-degree' ? p.dilution.inDegree : null
  const family = rule.kind === 'clipped' || inDegree !== null || rule.kind === 'dense-polynomial' || rule.kind === 'dense-exponential' || rule.kind === 'modern-softmax'
  if (!family) return null
  if (p.coding !== 'pm1' || p.family.kind !== 'random' || p.family.activity !== 0.5) return {}
  const n = p.neurons
  const count = p.patterns
  const zeroT = p.dynamics.temperature === 0
  const flipStart = p.cue.kind === 'flip' ? 1 - 2 * Math.round(p.cue.fraction * n) / n : null
  if (inDegree !== null) {
    if (rule.kind !== 'hebbian') return {}
    const alpha = count / inDegree
    const out: Record<string, number> = { dilutedLoad: alpha, dilutedCriticalLoad: DILUTED_CRITICAL_LOAD }
    if (zeroT) out.dilutedRetrievalOverlap = dilutedRetrievalOverlap(alpha)
    if (zeroT && p.dynamics.update === 'sync' && flipStart !== null) out.dilutedFirstStepOverlap = dilutedOverlapMap(flipStart, alpha)
    return out
  }
  switch (rule.kind) {
    case 'clipped': {
      if (p.dilution !== null && (p.dilution.kind === 'fixed-in-degree' || p.dilution.keep !== 1)) return {}
      const alpha = count / n
      const exact = clippedCrosstalkErrorExact(n, count, { selfCoupling: rule.selfCoupling })
      const out: Record<string, number> = { loadAlpha: alpha, clippedCrosstalkErrorExact: exact.below, clippedCrosstalkTieExact: exact.tie }
      if (rule.selfCoupling) return out
      out.clippedCrosstalkErrorGaussian = clippedCrosstalkErrorGaussian(alpha)
      out.clippedCriticalLoad = clippedCriticalLoad().alphaC
      if (zeroT && p.dynamics.update !== 'sync') out.clippedRetrievalOverlap = clippedRetrievalOverlap(alpha)
      return out
    }
    case 'dense-polynomial':
      return n < 2 ? {} : { denseCrosstalkErrorGaussian: denseCrosstalkErrorGaussian(n, count, rule.degree), denseCapacity: denseCapacity(n, rule.degree) }
    case 'dense-exponential':
      return { exponentialLoad: Math.log(count) / n, exponentialCapacityExponent: exponentialCapacityExponent(Math.min(0.5, flipStart === null ? 0 : (1 - flipStart) / 2)) }
    case 'modern-softmax':
      return count < 2 ? {} : { softmaxSeparationThreshold: softmaxSeparationThreshold(count, rule.beta) }
    default:
      return {}
  }
}
