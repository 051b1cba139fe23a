import normalQuantile from '@stdlib/stats-base-dists-normal-quantile'
import { wilsonInterval } from '../stats/index.js'
import { localLinearCrossing } from './linear-crossing.js'
import { logisticCrossing } from './logistic-crossing.js'
import type { CrossingEstimate, Direction, SearchMeasure } from './types.js'

export interface ThresholdSearchSettings {
  /** Ends of the searched range, from < to. */
  from: number
  to: number
  direction: Direction
  measure: SearchMeasure
  /** Success rate in (0, 1), or mean overlap in (−1, 1), to cross. */
  level: number
  /** Most parameter values evaluated, the two ends included (≥ 3). */
  maxSteps: number
  /** Stop once the bracket around the crossing is at most this wide (units of the parameter). */
  tolerance: number
  /** Of the step intervals that steer the search and of the final interval, in (0, 1). */
  confidence: number
  /**
   * The value actually run when x is asked for, e.g. a load rounded to a whole number of
   * patterns; non-decreasing in x. @defaultValue the identity
   */
  realise?: (x: number) => number
}

/** What one evaluated value of the parameter gave. */
export interface StepObservation {
  trials: number
  successes: number
  /** Mean final overlap over the trials and its standard error. */
  overlapMean: number
  overlapSe: number
}

export interface SearchStep {
  /** 0-based position in evaluation order. */
  step: number
  value: number
  observation: StepObservation
  /** Whether the step's measure lies at or above the level. */
  side: 'above' | 'below'
}

/**
 * Why the search stopped: `tolerance` the bracket is narrower than the tolerance; `noise`
 * the level lies inside the interval of the latest step and the bracket is within
 * NOISE_BRACKET_FACTOR tolerances; `resolution` the parameter cannot be split finer (e.g.
 * consecutive pattern counts); `max-steps` the budget ran out; `no-crossing` the two ends of
 * the range do not straddle the level.
 */
export type StopReason = 'tolerance' | 'noise' | 'resolution' | 'max-steps' | 'no-crossing'

export interface ThresholdSearchResult {
  stoppedBy: StopReason
  /** The fitted crossing and its interval, or null (no crossing in range, or no fit). */
  estimate: number | null
  low: number | null
  high: number | null
  /** The last bracket: adjacent evaluated values whose measures lie on either side of the level. */
  bracket: { low: number, high: number } | null
  fit: CrossingEstimate | null
  steps: SearchStep[]
  /** Plain-language remark for the reader when something needs one, else null. */
  note: string | null
}

/** The noise rule may stop the search once the bracket is within this many tolerances. */
export const NOISE_BRACKET_FACTOR = 4

// MAIN //

/**
 * Finds where a monotone measure crosses a level, adaptively, by evaluating the measure at
 * a sequence of parameter values chosen from what earlier steps showed.
 *
 * ## Design
 * 1. Evaluate both ends of [from, to]. If they do not straddle the level (a rate on the
 *    wrong side whose interval also excludes the level), stop: `no-crossing`, with a note
 *    saying which way the range should move.
 * 2. Bisection: evaluate the midpoint of the current bracket and keep the half whose ends
 *    straddle the level (by the observed measure). Stop when the bracket is at most
 *    `tolerance` wide; or when the level lies inside the latest step's interval (Wilson
 *    for a rate, mean ± z·se for an overlap) with the bracket already within
 *    NOISE_BRACKET_FACTOR tolerances, since that step is then a statistically acceptable
 *    crossing and further halvings would be steered by noise; or when the midpoint cannot
 *    be realised strictly inside the bracket; or after `maxSteps` evaluations.
 * 3. The estimate and its interval come from a fit over every step, not from the bracket
 *    (a noisy bisection decision can leave the crossing just outside the final bracket; the
 *    fit still sees all the data): logistic maximum likelihood with a profile-likelihood
 *    interval for the success rate (see logisticCrossing), a local weighted line with
 *    Fieller's interval for the mean overlap (see localLinearCrossing).
 *
 * Deterministic: the sequence of values depends only on the settings and on what
 * `evaluate` returns. `evaluate` may throw (e.g. to cancel); the error propagates.
 *
 * @param evaluate - runs the trials at `value` for step number `step` and reports them.
 *
 * @example
 * runThresholdSearch({ from: 0, to: 1, direction: 'decreasing', measure: 'success', level: 0.5, maxSteps: 12, tolerance: 0.01, confidence: 0.95 },
 *   (x) => ({ trials: 1000, successes: Math.round(1000 / (1 + Math.exp((x - 0.3) / 0.02))), overlapMean: 0, overlapSe: 0 }))
 * // returns { stoppedBy: 'tolerance', estimate: ~0.3, … }
 */
export function runThresholdSearch (settings: ThresholdSearchSettings, evaluate: (value: number, step: number) => StepObservation): ThresholdSearchResult {
  const { from, to, direction, measure, level, tolerance, confidence } = settings
  const realise = settings.realise ?? ((x: number) => x)
  const z = normalQuantile(1 - (1 - confidence) / 2, 0, 1)
  const steps: SearchStep[] = []
  const run = (x: number): SearchStep => {
    const observation = evaluate(x, steps.length)
    const step: SearchStep = { step: steps.length, value: x, observation, side: measureOf(observation, measure) >= level ? 'above' : 'below' }
    steps.push(step)
    return step
  }
  const levelInside = (o: StepObservation): boolean => {
    if (measure === 'overlap') return Math.abs(o.overlapMean - level) <= z * o.overlapSe
    const interval = wilsonInterval(o.successes, o.trials, confidence)
    return interval.low <= level && level <= interval.high
  }
  // Falling curve: above the level at the low end of the range.
  const sideAtLow: SearchStep['side'] = direction === 'decreasing' ? 'above' : 'below'

  let lo = realise(from)
  let hi = realise(to)
  const first = run(lo)
  const last = run(hi)
  const fits = (s: SearchStep, expected: SearchStep['side']) => s.side === expected || levelInside(s.observation)
  if (!fits(first, sideAtLow) || !fits(last, sideAtLow === 'above' ? 'below' : 'above')) {
    return { stoppedBy: 'no-crossing', estimate: null, low: null, high: null, bracket: null, fit: null, steps, note: noCrossingNote(first, last, sideAtLow, measure) }
  }

  let stoppedBy: StopReason
  for (;;) {
    if (hi - lo <= tolerance) { stoppedBy = 'tolerance'; break }
    if (steps.length >= settings.maxSteps) { stoppedBy = 'max-steps'; break }
    const mid = realise(lo + (hi - lo) / 2)
    if (!(mid > lo && mid < hi)) { stoppedBy = 'resolution'; break }
    const step = run(mid)
    if (step.side === sideAtLow) lo = mid
    else hi = mid
    if (levelInside(step.observation) && hi - lo <= NOISE_BRACKET_FACTOR * tolerance) { stoppedBy = 'noise'; break }
  }

  const width = to - from
  const fit = measure === 'success'
    ? logisticCrossing(steps.map((s) => ({ x: s.value, trials: s.observation.trials, successes: s.observation.successes })), level, direction, confidence, { low: from - width, high: to + width })
    : localLinearCrossing(steps.map((s) => ({ x: s.value, mean: s.observation.overlapMean, se: s.observation.overlapSe, trials: s.observation.trials })), level, direction, confidence)
  return {
    stoppedBy,
    estimate: fit?.estimate ?? null,
    low: fit?.low ?? null,
    high: fit?.high ?? null,
    bracket: { low: lo, high: hi },
    fit,
    steps,
    note: fit === null
      ? 'No crossing could be fitted: the steps show no trend in the expected direction. The bracket is the only location information.'
      : (fit.low === null || fit.high === null ? 'The data bound the crossing on one side only; more trials per step would close the interval.' : null)
  }
}

function measureOf (o: StepObservation, measure: SearchMeasure): number {
  return measure === 'success' ? o.successes / o.trials : o.overlapMean
}

function noCrossingNote (first: SearchStep, last: SearchStep, sideAtLow: SearchStep['side'], measure: SearchMeasure): string {
  const what = measure === 'success' ? 'success rate' : 'mean overlap'
  if (first.side === last.side) {
    const atLow = first.side === sideAtLow
    return `The ${what} is ${first.side} the level at both ends of the range: the crossing lies ${atLow ? 'above `to`' : 'below `from`'}; move the range.`
  }
  return `The ${what} moves the other way than \`direction\` says: it is ${first.side} the level at \`from\` and ${last.side} it at \`to\`.`
}
