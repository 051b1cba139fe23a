import type { PointParams } from './params.js'
import { emptyEndStateCounts, END_STATES } from './end-states.js'
import { ENDINGS, type Ending, type MeanWithError, type PatternOverlapRecord, type PatternOverlapSummary, type PointSummary, type StabilityRecord, type StabilitySummary, type TrajectorySummary, type TrialRecord } from './results.js'
import { patternOverlapExpectation } from './patterns/overlap-expectation.js'
import { meanWithError, wilsonInterval } from './stats/index.js'

/**
 * Sums one point's trials, in the order given (callers pass trial order, so the floating
 * point sums, and hence the bytes of the result, never depend on completion order).
 * Members that do not apply to the point (T > 0 time averages, mixture components,
 * trajectories, pattern overlaps) are left out.
 */
export function aggregatePoint (p: PointParams, trials: readonly TrialRecord[]): PointSummary {
  const n = trials.length
  const overlaps = new Float64Array(n)
  const sweeps = new Float64Array(n)
  const others = new Float64Array(n)
  const energies = new Float64Array(n)
  const endings = Object.fromEntries(ENDINGS.map((e) => [e, 0])) as Record<Ending, number>
  const endStates = emptyEndStateCounts()
  let successes = 0
  const stability: StabilityRecord[] = []
  const patternOverlaps: PatternOverlapRecord[] = []
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
    if (t.patternOverlaps !== undefined) patternOverlaps.push(t.patternOverlaps)
  }
  const interval = wilsonInterval(successes, n)
  const summary: PointSummary = {
    trials: n,
    overlap: meanWithError(overlaps),
    success: { count: successes, rate: n > 0 ? successes / n : 0, low: interval.low, high: interval.high },
    sweeps: meanWithError(sweeps),
    maxOtherOverlap: meanWithError(others),
    energy: meanWithError(energies),
    endings,
    endStates,
    stability: stability.length === 0 ? null : summariseStability(stability)
  }
  if (n > 0 && p.dynamics.temperature > 0) Object.assign(summary, thermalSummary(trials))
  const components = componentSummary(trials)
  if (components !== null) summary.componentOverlaps = components
  const overlapTrajectory = trajectorySummary(trials, (t) => t.overlapTrajectory === undefined ? undefined : [t.initialOverlap, ...t.overlapTrajectory], 0)
  if (overlapTrajectory !== null) summary.overlapTrajectory = overlapTrajectory
  const energyTrajectory = trajectorySummary(trials, (t) => t.energyTrajectory, 1)
  if (energyTrajectory !== null) summary.energyTrajectory = energyTrajectory
  if (patternOverlaps.length > 0) summary.patternOverlaps = summarisePatternOverlaps(p, patternOverlaps)
  return summary
}

const STABILITY_FIELDS = ['unstableFraction', 'tieFraction', 'fixedPatternFraction'] as const

/** Means over networks, with the sample sd and the standard error of each mean (networks are independent). */
function summariseStability (records: readonly StabilityRecord[]): StabilitySummary {
  const stats = STABILITY_FIELDS.map((field) => meanWithError(records.map((r) => r[field])))
  const pick = (key: keyof MeanWithError): StabilityRecord => ({ unstableFraction: stats[0]![key], tieFraction: stats[1]![key], fixedPatternFraction: stats[2]![key] })
  return { networks: records.length, ...pick('mean'), sd: pick('sd'), se: pick('se') }
}

/** T > 0: shares of measured sweeps per class (mean over trials), and the final snapshots. */
function thermalSummary (trials: readonly TrialRecord[]): Pick<PointSummary, 'endStateShares' | 'finalEndStates' | 'finalMaxOtherOverlap' | 'finalEnergy'> {
  const shares = emptyEndStateCounts()
  const finals = emptyEndStateCounts()
  for (const t of trials) {
    for (const state of END_STATES) shares[state] += t.endStateShares?.[state] ?? 0
    finals[t.finalEndState ?? t.endState]++
  }
  for (const state of END_STATES) shares[state] /= trials.length
  return {
    endStateShares: shares,
    finalEndStates: finals,
    finalMaxOtherOverlap: meanWithError(trials.map((t) => t.finalMaxOtherOverlap ?? t.maxOtherOverlap)),
    finalEnergy: meanWithError(trials.map((t) => t.finalEnergy ?? t.energy))
  }
}

/** Mixture cues: mean overlap with each component, over the trials that recorded it. */
function componentSummary (trials: readonly TrialRecord[]): MeanWithError[] | null {
  let width = 0
  for (const t of trials) width = Math.max(width, t.componentOverlaps?.length ?? 0)
  if (width === 0) return null
  const out: MeanWithError[] = []
  for (let k = 0; k < width; k++) {
    const values: number[] = []
    for (const t of trials) if (t.componentOverlaps !== undefined && k < t.componentOverlaps.length) values.push(t.componentOverlaps[k]!)
    out.push(meanWithError(values))
  }
  return out
}

/**
 * The mean trajectory over the trials that recorded one. Trajectories end when the dynamics
 * stop (a fixed point or 2-cycle); each is held at its last value up to the longest one, and
 * `running` counts the trials whose own trajectory still reached that sweep.
 */
function trajectorySummary (trials: readonly TrialRecord[], read: (t: TrialRecord) => readonly number[] | undefined, firstSweep: number): TrajectorySummary | null {
  const series: Array<readonly number[]> = []
  let length = 0
  for (const t of trials) {
    const values = read(t)
    if (values === undefined || values.length === 0) continue
    series.push(values)
    length = Math.max(length, values.length)
  }
  if (series.length === 0) return null
  const out: TrajectorySummary = { firstSweep, mean: [], sd: [], se: [], running: [] }
  const column = new Float64Array(series.length)
  for (let k = 0; k < length; k++) {
    let running = 0
    series.forEach((values, j) => {
      if (k < values.length) running++
      column[j] = values[Math.min(k, values.length - 1)]!
    })
    const stat = meanWithError(column)
    out.mean.push(stat.mean)
    out.sd.push(stat.sd)
    out.se.push(stat.se)
    out.running.push(running)
  }
  return out
}

function summarisePatternOverlaps (p: PointParams, records: readonly PatternOverlapRecord[]): PatternOverlapSummary {
  const of = (field: 'mean' | 'meanAbs' | 'rms' | 'maxAbs'): MeanWithError => meanWithError(records.map((r) => r[field]))
  return {
    networks: records.length,
    pairs: records[0]!.pairs,
    mean: of('mean'),
    meanAbs: of('meanAbs'),
    rms: of('rms'),
    maxAbs: of('maxAbs'),
    expected: patternOverlapExpectation(p)
  }
}
