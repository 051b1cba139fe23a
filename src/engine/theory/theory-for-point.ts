import type { PointParams } from '../params.js'
import { crosstalkErrorExact } from './crosstalk-error-exact.js'
import { crosstalkErrorGaussian } from './crosstalk-error-gaussian.js'
import { curieWeissOverlap } from './curie-weiss-overlap.js'
import { firstParallelStep } from './first-parallel-step.js'
import { firstParallelStepExact } from './first-parallel-step-exact.js'
import { mixtureOverlap } from './mixture-overlap.js'
import { modelTheoryForPoint } from './model-theory.js'
import { rsCriticalLoad } from './rs-critical-load.js'
import { rsRetrievalOverlap } from './rs-retrieval-overlap.js'
import { spinGlassTemperature } from './spin-glass-temperature.js'

/** Below this load, finite-P (Curie–Weiss, mixture) results are used as the α → 0 limit. */
export const VANISHING_LOAD = 0.01

/**
 * The theory values that apply to one grid point, keyed by stable names, for plotting
 * beside the simulated curves. {} when no theory covers the point.
 *
 * Hebbian rule, ±1 coding, unbiased random patterns (activity ½), no dilution:
 * - always: `loadAlpha` (P/N), `crosstalkErrorGaussian`, `crosstalkErrorExact`,
 *   `crosstalkTieExact`: one-step instability of a stored bit (compare with the
 *   stability measure's unstable and tie fractions); with J_ii kept, for that diagonal.
 * - J_ii = 0: `criticalLoad` = α_c of the RS theory (≈ 0.1379).
 * - T = 0, asynchronous updates, J_ii = 0: `retrievalOverlapRS`, the final overlap of
 *   the retrieval state (0 above α_c). Meaningful only when the cue lies in the pattern's
 *   basin; at finite N compare only for α ≤ 0.12.
 * - T = 0, synchronous updates, flip cue: `firstStepOverlap` (N → ∞) and
 *   `firstStepOverlapExact` (finite N, ties keep the old state as in the engine), the
 *   overlap after the first parallel step, from m₀ = 1 − 2·round(fraction·N)/N.
 * - T = 0, α ≤ 0.01, mixture cue of odd n ≥ 3 components: `mixtureOverlap`, the overlap
 *   of the symmetric mixture state with the target.
 * - T > 0: `spinGlassTemperature` (1 + √α); with α ≤ 0.01 also `curieWeissOverlap`, the
 *   time-averaged overlap at vanishing load.
 *
 * Pseudo-inverse rule, ±1 coding, no dilution: `loadAlpha` and `criticalLoad` = 1
 * (Kanter & Sompolinsky, PRA 35, 380 (1987)).
 *
 * 0/1 coding is left out: with 0/1 neurons the Hebbian field is not the ±1 field these
 * results describe.
 *
 * Clipped synapses, the fixed in-degree dilution, dense memories and the modern softmax
 * network: see `modelTheoryForPoint`.
 */
export function theoryForPoint (p: PointParams): Record<string, number> {
  const model = modelTheoryForPoint(p)
  if (model !== null) return model
  if (p.coding !== 'pm1' || !isUndiluted(p)) return {}
  const alpha = p.patterns / p.neurons
  if (p.rule.kind === 'pseudo-inverse') return { loadAlpha: alpha, criticalLoad: 1 }
  if (p.rule.kind !== 'hebbian' || p.family.kind !== 'random' || p.family.activity !== 0.5) return {}

  const selfCoupling = p.rule.selfCoupling
  const exact = crosstalkErrorExact(p.neurons, p.patterns, { selfCoupling })
  const out: Record<string, number> = {
    loadAlpha: alpha,
    crosstalkErrorGaussian: crosstalkErrorGaussian(alpha, { selfCoupling }),
    crosstalkErrorExact: exact.below,
    crosstalkTieExact: exact.tie
  }
  if (!selfCoupling) out.criticalLoad = rsCriticalLoad().alphaC

  const { temperature, update } = p.dynamics
  if (temperature === 0) {
    if (update !== 'sync' && !selfCoupling) out.retrievalOverlapRS = rsRetrievalOverlap(alpha)
    if (update === 'sync' && p.cue.kind === 'flip') {
      const m0 = 1 - 2 * Math.round(p.cue.fraction * p.neurons) / p.neurons
      out.firstStepOverlap = firstParallelStep(m0, alpha, { selfCoupling })
      out.firstStepOverlapExact = firstParallelStepExact(p.neurons, p.patterns, m0, { selfCoupling, ties: 'keep' })
    }
    const n = p.cue.kind === 'mixture' ? p.cue.components : 0
    if (n >= 3 && n % 2 === 1 && alpha <= VANISHING_LOAD) out.mixtureOverlap = mixtureOverlap(n)
  } else {
    out.spinGlassTemperature = spinGlassTemperature(alpha)
    if (alpha <= VANISHING_LOAD) out.curieWeissOverlap = curieWeissOverlap(temperature)
  }
  return out
}

function isUndiluted (p: PointParams): boolean {
  return p.dilution === null || (p.dilution.kind !== 'fixed-in-degree' && p.dilution.keep === 1)
}
