/**
 * End states: where a trial's state sits among the stored patterns. The rules, their
 * thresholds and their published basis are documented in docs/end-states.md; the names
 * here are the single list every output (JSON, CSV, figures, glossary) takes them from.
 */
import { patternLevelOf, type PointParams } from './params.js'
import { mixtureOverlap, mixtureOverlapAt } from './theory/mixture-overlap.js'

// VARIABLES //

/**
 * The end-state classes, in the order outputs list them. Every state falls in exactly one
 * (the first rule that applies, in this order).
 */
export const END_STATES = ['target', 'reversed', 'otherPattern', 'symmetricMixture', 'partialTarget', 'spurious', 'spinGlass'] as const

export type EndState = typeof END_STATES[number]

/** One sentence per class, for the docs, the glossary and the API description. */
export const END_STATE_DEFINITIONS: Readonly<Record<EndState, string>> = {
  target: 'overlap with the target m_t ≥ q (q: the pattern level, the success threshold in spec format 2)',
  reversed: 'overlap with the target m_t ≤ −|q|: the reversed pattern −ξ^t',
  otherPattern: 'some other pattern ν has |m_ν| ≥ |q|: another stored pattern (or its reverse)',
  symmetricMixture: 'an odd number k ≥ 3 of macroscopic overlaps, each |m_ν| within δ_k of the symmetric k-mixture value m_k(T) (Amit, Gutfreund & Sompolinsky 1985)',
  partialTarget: 'the target is the only macroscopic overlap, |m_t| < |q|: a retrieval state below the pattern level (finite temperature) or a remanent overlap past capacity',
  spurious: 'macroscopic overlaps that fit none of the above: asymmetric mixtures, a lone partial overlap with another pattern',
  spinGlass: 'no macroscopic overlap with any stored pattern (every |m_ν| below the state\'s macroscopic level): spin-glass-like'
}

/**
 * The pattern level q of format-1 specs, whatever their success threshold (the classification
 * of engine versions before 0.2.0).
 */
export const FORMAT_1_PATTERN_LEVEL = 0.9

/** Floor of the macroscopic level ℓ = max(0.15, 4·√(r/N)). */
export const MACROSCOPIC_FLOOR = 0.15

/** Standard deviations of the state's own overlap noise an overlap must exceed to be macroscopic. */
export const MACROSCOPIC_SDS = 4

/** Fewest non-macroscopic overlaps from which the state's noise r is estimated (fewer: r = 1). */
export const NOISE_ESTIMATE_MIN_PATTERNS = 10

/** Standard deviations of finite-N noise allowed around a mixture value. */
export const MIXTURE_NOISE_SDS = 4

/** Allowance for the shift of mixture overlaps at a finite load and for time averaging (our choice, not a published value). */
export const MIXTURE_LOAD_ALLOWANCE = 0.05

// MAIN //

/**
 * ℓ = max(0.15, 4·√(r/N)): an overlap at least this large is macroscopic. The overlaps of a
 * state with the patterns it is not condensed on have mean square r/N, r being the order
 * parameter of Amit, Gutfreund & Sompolinsky (1985, 1987), r = (1/α) Σ_ν m_ν² over those
 * patterns: r = 1 for a state unrelated to independent patterns (variance 1/N, CHECK_VALUES
 * §12), r ≈ 1 in retrieval states, r ≫ 1 in the spin-glass states past capacity, whose many
 * overlaps of a few times 1/√N are noise, not condensation. 4√(r/N) is a 4σ level of that
 * noise; the floor keeps ℓ meaningful for large N (our choice). `noise` = r (default 1).
 */
export function macroscopicLevel (neurons: number, noise = 1): number {
  return Math.max(MACROSCOPIC_FLOOR, MACROSCOPIC_SDS * Math.sqrt(noise / neurons))
}

/** The symmetric k-mixture band: its centre m_k(T) and half-width δ_k. */
export interface MixtureBand {
  components: number
  centre: number
  halfWidth: number
}

/**
 * Half-width δ_k = 0.05 + 4·√((1 − m_k²)/N): a component overlap of the mixture state has
 * standard deviation √((1 − m_k²)/N) at finite N (for k = 3, √(0.75/N): CHECK_VALUES §4),
 * and the allowance covers load and time averaging.
 */
export function mixtureHalfWidth (centre: number, neurons: number): number {
  return MIXTURE_LOAD_ALLOWANCE + MIXTURE_NOISE_SDS * Math.sqrt(Math.max(0, 1 - centre * centre) / neurons)
}

/** What the classifier needs to know about a grid point. */
export interface EndStateSettings {
  neurons: number
  patterns: number
  /** Pattern level q. */
  patternLevel: number
  temperature: number
}

export function endStateSettings (p: PointParams): EndStateSettings {
  return { neurons: p.neurons, patterns: p.patterns, patternLevel: patternLevelOf(p), temperature: p.dynamics.temperature }
}

/**
 * Classifies states of one grid point. The mixture bands depend only on N, P and T, so they
 * are computed once: every odd k ≥ 3 up to P whose band lies above the macroscopic level
 * (larger mixtures have components indistinguishable from noise).
 */
export class EndStateClassifier {
  /** The macroscopic level of a state with r = 1. */
  readonly level: number
  readonly patternLevel: number
  #bands: readonly MixtureBand[] | null = null

  constructor (private readonly settings: EndStateSettings) {
    this.level = macroscopicLevel(settings.neurons)
    this.patternLevel = settings.patternLevel
  }

  /**
   * The symmetric mixture bands, computed when first needed: most states are classified
   * before the mixture rule, and the mean-field mixture overlaps at T > 0 take a
   * root-finding each.
   */
  get bands (): readonly MixtureBand[] {
    if (this.#bands === null) {
      const { patterns, temperature, neurons } = this.settings
      const bands: MixtureBand[] = []
      for (let k = 3; k <= patterns; k += 2) {
        const centre = temperature > 0 ? mixtureOverlapAt(k, temperature) : mixtureOverlap(k)
        const halfWidth = mixtureHalfWidth(centre, neurons)
        if (!(centre - halfWidth > this.level)) break
        bands.push({ components: k, centre, halfWidth })
      }
      this.#bands = bands
    }
    return this.#bands
  }

  /** The class of a state with overlaps `overlaps[0..count)` (normalised) when pattern `target` was cued. */
  classify (overlaps: ArrayLike<number>, count: number, target: number): EndState {
    const q = this.patternLevel
    const qAbs = Math.abs(q)
    const mt = overlaps[target]!
    if (mt >= q) return 'target'
    if (mt <= -qAbs) return 'reversed'
    for (let mu = 0; mu < count; mu++) {
      if (mu !== target && Math.abs(overlaps[mu]!) >= qAbs) return 'otherPattern'
    }
    const level = this.stateLevel(overlaps, count)
    let macroscopic = 0
    for (let mu = 0; mu < count; mu++) if (Math.abs(overlaps[mu]!) >= level) macroscopic++
    if (macroscopic === 0) return 'spinGlass'
    if (macroscopic === 1 && Math.abs(mt) >= level) return 'partialTarget'
    const band = this.bands.find((b) => b.components === macroscopic)
    if (band !== undefined && insideBand(overlaps, count, level, band)) return 'symmetricMixture'
    return 'spurious'
  }

  /**
   * The macroscopic level of this state: r estimated from the overlaps below the current level
   * (never below 1, the noise of independent patterns), the level recomputed from it, until
   * the set of macroscopic overlaps stops changing (a few rounds).
   */
  stateLevel (overlaps: ArrayLike<number>, count: number): number {
    let level = this.level
    let previous = -1
    for (let round = 0; round < 8; round++) {
      let rest = 0
      let squares = 0
      for (let mu = 0; mu < count; mu++) {
        const m = overlaps[mu]!
        if (Math.abs(m) < level) { rest++; squares += m * m }
      }
      if (rest === previous || rest < NOISE_ESTIMATE_MIN_PATTERNS) break
      previous = rest
      level = macroscopicLevel(this.settings.neurons, Math.max(1, this.settings.neurons * squares / rest))
    }
    return level
  }
}

function insideBand (overlaps: ArrayLike<number>, count: number, level: number, band: MixtureBand): boolean {
  for (let mu = 0; mu < count; mu++) {
    const a = Math.abs(overlaps[mu]!)
    if (a >= level && Math.abs(a - band.centre) > band.halfWidth) return false
  }
  return true
}

/** A record with a count per class, all zero. */
export function emptyEndStateCounts (): Record<EndState, number> {
  return { target: 0, reversed: 0, otherPattern: 0, symmetricMixture: 0, partialTarget: 0, spurious: 0, spinGlass: 0 }
}
