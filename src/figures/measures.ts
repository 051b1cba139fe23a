/**
 * One plotted value per result row: the measure's estimate and, when asked for and known,
 * the ends of its error bar. Everything is read from the row (and, for the stability
 * measures, from the per-trial records when the result carries them); nothing is re-simulated.
 */
import tQuantile from '@stdlib/stats-base-dists-t-quantile'
import { wilsonInterval, type EndState, type MeanWithError, type TrialRecord } from '../engine/index.js'
import type { ResultRow } from '../results/index.js'
import type { FigureMeasure, FigureOptions } from './options.js'

export interface MeasuredValue {
  y: number
  /** Error bar ends; null when no error bar is drawn or none can be estimated. */
  low: number | null
  high: number | null
  /** Trials (stability measures: networks) behind the estimate. */
  n: number
}

/** Confidence of the `ci` error bars. */
export const CONFIDENCE = 0.95

type ErrorBars = FigureOptions['errorBars']

const isNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v)

/** Measures bounded to [0, 1] by definition. */
export function isRate (measure: FigureMeasure): boolean {
  return measure === 'success' || measure === 'endState' || measure === 'unstableFraction' || measure === 'fixedPatternFraction'
}

/**
 * The value of `measure` at one row, or null when the row holds none (a non-finite number
 * written as null in JSON, or a stability measure the sweep did not record).
 */
export function measureRow (
  row: ResultRow,
  trials: readonly TrialRecord[] | undefined,
  measure: FigureMeasure,
  errorBars: ErrorBars,
  endState: EndState
): MeasuredValue | null {
  const s = row.summary
  switch (measure) {
    case 'success':
      if (!isNumber(s.success.rate)) return null
      return rateValue(s.success.count, s.trials, errorBars, { low: s.success.low, high: s.success.high })
    case 'endState': {
      const count = s.endStates[endState]
      if (!isNumber(count) || !(s.trials > 0)) return null
      return rateValue(count, s.trials, errorBars)
    }
    case 'overlap':
    case 'sweeps':
    case 'maxOtherOverlap':
    case 'energy':
      return meanValue(s[measure], s.trials, errorBars, false)
    case 'unstableFraction':
    case 'fixedPatternFraction':
      return stabilityValue(row, trials, measure, errorBars)
    case 'patternOverlapMeanAbs':
    case 'patternOverlapMaxAbs': {
      const po = s.patternOverlaps
      if (po === undefined) return null
      return meanValue(measure === 'patternOverlapMeanAbs' ? po.meanAbs : po.maxAbs, po.networks, errorBars, true)
    }
  }
}

function rateValue (count: number, n: number, errorBars: ErrorBars, wilson?: { low: unknown, high: unknown }): MeasuredValue {
  const y = count / n
  if (errorBars === 'none') return { y, low: null, high: null, n }
  if (errorBars === 'ci') {
    // The row's own interval is used when present, so the figure shows exactly what the result says.
    const interval = wilson !== undefined && isNumber(wilson.low) && isNumber(wilson.high)
      ? { low: wilson.low, high: wilson.high }
      : wilsonInterval(count, n, CONFIDENCE)
    return { y, ...interval, n }
  }
  const sd = Math.sqrt(y * (1 - y))
  const half = errorBars === 'sd' ? sd : sd / Math.sqrt(n)
  return { y, low: Math.max(0, y - half), high: Math.min(1, y + half), n }
}

function meanValue (stat: MeanWithError, n: number, errorBars: ErrorBars, bounded: boolean): MeasuredValue | null {
  if (!isNumber(stat.mean)) return null
  const y = stat.mean
  let half: number | null = null
  if (errorBars === 'sd' && isNumber(stat.sd)) half = stat.sd
  else if (errorBars === 'se' && isNumber(stat.se)) half = stat.se
  else if (errorBars === 'ci' && isNumber(stat.se) && n >= 2) half = tQuantile(1 - (1 - CONFIDENCE) / 2, n - 1) * stat.se
  if (half === null) return { y, low: null, high: null, n }
  const low = y - half
  const high = y + half
  return bounded ? { y, low: Math.max(0, low), high: Math.min(1, high), n } : { y, low, high, n }
}

/**
 * Stability is measured once per network. The row keeps the mean over networks with its sd
 * and se; rows of results made before they did have the spread from the per-trial records
 * when the result includes them, and no error bar otherwise.
 */
function stabilityValue (
  row: ResultRow,
  trials: readonly TrialRecord[] | undefined,
  measure: 'unstableFraction' | 'fixedPatternFraction',
  errorBars: ErrorBars
): MeasuredValue | null {
  const stability = row.summary.stability
  if (stability === null || stability === undefined || !isNumber(stability[measure])) return null
  const y = stability[measure]
  const rowSd = stability.sd?.[measure]
  const rowSe = stability.se?.[measure]
  if (isNumber(rowSd) && isNumber(rowSe) && stability.networks >= 2) {
    return errorBars === 'none' ? { y, low: null, high: null, n: stability.networks } : meanValue({ mean: y, sd: rowSd, se: rowSe }, stability.networks, errorBars, true)
  }
  const perNetwork = (trials ?? []).flatMap((t) => (t.stability === undefined ? [] : [t.stability[measure]]))
  if (errorBars === 'none' || perNetwork.length !== stability.networks || perNetwork.length < 2 || !perNetwork.every(isNumber)) {
    return { y, low: null, high: null, n: stability.networks }
  }
  const n = perNetwork.length
  let sum = 0
  for (const v of perNetwork) sum += v
  const mean = sum / n
  let squares = 0
  for (const v of perNetwork) squares += (v - mean) * (v - mean)
  const sd = Math.sqrt(squares / (n - 1))
  const spread = meanValue({ mean: y, sd, se: sd / Math.sqrt(n) }, n, errorBars, true)
  return spread
}
