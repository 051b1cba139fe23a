import erf from '@stdlib/math-base-special-erf'
import { bisect } from './bisect.js'
import { checkLoad } from './check-input.js'
import type { CriticalLoad } from './rs-critical-load.js'

/** Static synaptic noise of clipping, relative to the load: ⟨φ²⟩/⟨φ'⟩² − 1 = π/2 − 1 for φ = sign. */
export const CLIPPED_STATIC_NOISE = Math.PI / 2 - 1

/**
 * The load α at which the T = 0 retrieval equations of the clipped network have the
 * solution y, i.e. α as a function of y on the retrieval branch.
 *
 * ## Method
 * Sompolinsky (PRA 34, 2571 (1986); equations recalled from memory) shows that couplings
 * (√P/N) φ(T_ij/√P) act like Hebbian couplings of strength ⟨φ'⟩ plus static Gaussian
 * noise of variance Δ² = α(⟨φ²⟩/⟨φ'⟩² − 1) in those units (z standard normal). The
 * replica-symmetric T = 0 equations of Amit, Gutfreund & Sompolinsky then read
 *
 *   m = erf(y),  y = m/√(2v),  v = αr + Δ²,  C = √(2/(πv)) e^{−y²},  r = (1 − C)^{−2},
 *
 * and eliminating v = m²/(2y²) and C = 2y e^{−y²}/(√π m) gives α explicitly:
 *
 *   α(y) = [erf(y)²/(2y²)] / [(1 − C)^{−2} + s],  s = Δ²/α = π/2 − 1 for clipping.
 *
 * s = 0 is the Hebbian network (√(2α) = erf(y)/y − (2/√π)e^{−y²}).
 */
export function clippedLoadEquation (y: number, staticNoise = CLIPPED_STATIC_NOISE): number {
  const m = erf(y)
  const c = 2 * y * Math.exp(-y * y) / (Math.sqrt(Math.PI) * m)
  if (c >= 1) return 0
  return (m * m / (2 * y * y)) / (1 / ((1 - c) * (1 - c)) + staticNoise)
}

/**
 * Storage capacity of the clipped network at T = 0 from the equations above: the largest
 * α with a retrieval solution, ≈ 0.1018 (Sompolinsky 1986 quotes α_c ≈ 0.10 for clipped
 * synapses; value recalled from memory), against 0.1379 for Hebbian couplings.
 *
 * ## Method
 * α(y) has a single maximum on the retrieval side; golden-section search on [0.5, 4] to
 * the last bits (deterministic). `staticNoise` = 0 reproduces the Hebbian α_c.
 *
 * @example
 * clippedCriticalLoad()
 * // returns { alphaC: ~0.101839, overlapAtCritical: ~0.94795, yC: ~1.37373 }
 */
export function clippedCriticalLoad (staticNoise = CLIPPED_STATIC_NOISE): CriticalLoad {
  const ratio = (Math.sqrt(5) - 1) / 2
  let a = 0.5
  let b = 4
  for (let step = 0; step < 200 && b - a > 1e-15; step++) {
    const x1 = b - ratio * (b - a)
    const x2 = a + ratio * (b - a)
    if (clippedLoadEquation(x1, staticNoise) < clippedLoadEquation(x2, staticNoise)) a = x1
    else b = x2
  }
  const yC = (a + b) / 2
  return { alphaC: clippedLoadEquation(yC, staticNoise), overlapAtCritical: erf(yC), yC }
}

/**
 * Overlap of the retrieval state of the clipped network at T = 0 (the larger root y of
 * α(y) = α, m = erf(y)); 0 above the critical load.
 *
 * @throws {EngineInputError} when α is negative, NaN or infinite.
 */
export function clippedRetrievalOverlap (alpha: number, staticNoise = CLIPPED_STATIC_NOISE): number {
  checkLoad('alpha', alpha)
  if (alpha === 0) return 1
  const { alphaC, yC, overlapAtCritical } = clippedCriticalLoad(staticNoise)
  if (alpha > alphaC) return 0
  if (alpha === alphaC) return overlapAtCritical
  // α(y) ≤ erf(y)²/(2y²) ≤ 1/(2y²), so it is at most α/4 at y = 2/√(2α): a sign change no
  // rounding can erase (at y = 1/√(2α) the two agree to the last bit when staticNoise = 0).
  return erf(bisect((y) => clippedLoadEquation(y, staticNoise) - alpha, yC, Math.max(yC, 2 / Math.sqrt(2 * alpha))))
}
