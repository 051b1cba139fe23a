/**
 * The CSV columns of one aggregated point (a grid point, or a step of a search): means with
 * their spread, success count and Wilson interval, endings, end states, stability.
 */
import { END_STATES, ENDINGS, type MeanWithError, type PointSummary } from '../engine/index.js'
import type { CsvCell } from './csv.js'

const MEAN_FIELDS = ['overlap', 'sweeps', 'maxOtherOverlap', 'energy'] as const

export function summaryHeader (stability: boolean): string[] {
  return [
    'trials',
    ...MEAN_FIELDS.flatMap((f) => [`${f}.mean`, `${f}.sd`, `${f}.se`]),
    'success.count', 'success.rate', 'success.low', 'success.high',
    ...ENDINGS.map((e) => `ending.${e}`),
    ...END_STATES.map((s) => `endStates.${s}`),
    ...(stability ? ['stability.networks', 'stability.unstableFraction', 'stability.tieFraction', 'stability.fixedPatternFraction'] : [])
  ]
}

export function summaryCells (s: PointSummary, stability: boolean): CsvCell[] {
  const st = s.stability
  return [
    s.trials,
    ...MEAN_FIELDS.flatMap((f) => meanCells(s[f])),
    s.success.count, s.success.rate, s.success.low, s.success.high,
    ...ENDINGS.map((e) => s.endings[e]),
    ...END_STATES.map((e) => s.endStates[e]),
    ...(stability ? [st?.networks, st?.unstableFraction, st?.tieFraction, st?.fixedPatternFraction] : [])
  ]
}

function meanCells (m: MeanWithError): CsvCell[] {
  return [m.mean, m.sd, m.se]
}
