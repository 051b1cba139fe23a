import type { PointParams } from './params.js'
import { END_STATES, ENDINGS, type Ending, type EndState, type PointSummary, type StabilityRecord, type TrialRecord } from './results.js'
import { meanWithError, wilsonInterval } from './stats/index.js'

/**
 * Sums one point's trials, in the order given (callers pass trial order, so the floating
 * point sums, and hence the bytes of the result, never depend on completion order).
 */
export function aggregatePoint (p: PointParams, trials: readonly TrialRecord[]): PointSummary {
  const n = trials.length
  const overlaps = new Float64Array(n)
  const sweeps = new Float64Array(n)
  const others = new Float64Array(n)
  const energies = new Float64Array(n)
  const endings = Object.fromEntries(ENDINGS.map((e) => [e, 0])) as Record<Ending, number>
  const endStates = Object.fromEntries(END_STATES.map((e) => [e, 0])) as Record<EndState, number>
  let successes = 0
  const stability: StabilityRecord[] = []
  for (let k = 0; k < n; k++) {
    const t = trials[k]!
    overlaps[k] = t.overlap
    sweeps[k] = t.sweeps
    others[k] = t.maxOtherOverlap
    energies[k] = t.energy
    endings[t.ending]++
    endStates[t.endState]++
    if (t.overlap >= p.successThreshold) successes++
    if (t.stability !== undefined) stability.push(t.stability)
  }
  const interval = wilsonInterval(successes, n)
  return {
    trials: n,
    overlap: meanWithError(overlaps),
    success: { count: successes, rate: n > 0 ? successes / n : 0, low: interval.low, high: interval.high },
    sweeps: meanWithError(sweeps),
    maxOtherOverlap: meanWithError(others),
    energy: meanWithError(energies),
    endings,
    endStates,
    stability: stability.length === 0 ? null : averageStability(stability)
  }
}

function averageStability (records: readonly StabilityRecord[]): StabilityRecord & { networks: number } {
  let unstable = 0
  let ties = 0
  let fixed = 0
  for (const r of records) {
    unstable += r.unstableFraction
    ties += r.tieFraction
    fixed += r.fixedPatternFraction
  }
  const k = records.length
  return { networks: k, unstableFraction: unstable / k, tieFraction: ties / k, fixedPatternFraction: fixed / k }
}
