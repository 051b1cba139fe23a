/**
 * Search results as CSV: one row per search, or (perStep) one row per evaluated step,
 * since a search keeps per-step summaries rather than per-trial records. Scaling fits are
 * in the JSON only: a fit is not a row of the same table.
 */
import type { CsvCell, Table } from './csv.js'
import { summaryCells, summaryHeader } from './summary-cells.js'
import { measureCells, measureHeader, measureLayout } from './measure-columns.js'
import { identityCells, leadingHeader, parameterCells, parameterHeader, type ParameterColumn, type RowSource } from './parameter-columns.js'
import { roundCell } from './precision.js'
import type { SearchRow } from '../spec/analysis/types.js'

// MAIN //

/**
 * Both tables start like every other table of a sweep: sweepId, specHash, seed, then `search`
 * (and per step `step`), every model parameter and alpha, alphaK (parameter-columns.ts). In a
 * row per search the searched parameter is empty (it is what the row estimates) and so are
 * N, P, alpha when the search is over them.
 * Per search, then: `parameter`, `measure`, `level`, `estimate`, `low`, `high`, `confidence`,
 * `stoppedBy`, `bracket.low`, `bracket.high`, `steps`, `trials`, `fit.method`, `fit.slope`,
 * `fit.dispersion`, `fit.separated`, `note`.
 * Per step, then: `side` (of the level) and the step's summary columns as in a grid sweep's
 * point rows. Rows come with their measures at the published precision.
 */
export function searchTable (source: RowSource, searches: readonly SearchRow[], perStep: boolean): Table {
  const spec = source.spec
  const analysis = spec.analysis!
  const searched = analysis.parameter as ParameterColumn
  const lead = (first: CsvCell[], row: SearchRow, override: Partial<Record<ParameterColumn, CsvCell>>): CsvCell[] =>
    [...identityCells(source), ...first, ...parameterCells(spec, row.search, row.values, override).map(roundCell)]
  if (perStep) {
    const stability = spec.measures.stability
    const layout = measureLayout(spec, searches.flatMap((row) => row.steps.map((step) => step.summary)))
    const header = [...leadingHeader(), 'search', 'step', ...parameterHeader(), 'side', ...summaryHeader(stability), ...measureHeader(layout)]
    const rows: CsvCell[][] = []
    for (const row of searches) {
      for (const step of row.steps) {
        const override = { [searched]: step.value, neurons: step.params.neurons, patterns: step.params.patterns }
        rows.push([...lead([row.search, step.step], row, override), step.side, ...summaryCells(step.summary, stability), ...measureCells(step.summary, layout)])
      }
    }
    return { header, rows }
  }
  // What a row per search does not know: the searched parameter, and P when N or the load is searched.
  const unknown: Partial<Record<ParameterColumn, CsvCell>> = ['neurons', 'patterns', 'load', 'inDegreeLoad'].includes(searched) ? { patterns: undefined } : {}
  const header = [
    ...leadingHeader(), 'search', ...parameterHeader(), 'parameter', 'measure', 'level', 'estimate', 'low', 'high', 'confidence', 'stoppedBy',
    'bracket.low', 'bracket.high', 'steps', 'trials', 'fit.method', 'fit.slope', 'fit.dispersion', 'fit.separated', 'note'
  ]
  const rows = searches.map((row): CsvCell[] => [
    ...lead([row.search], row, { neurons: row.neurons, ...unknown, [searched]: undefined }),
    analysis.parameter, analysis.measure, analysis.level, row.estimate, row.low, row.high, analysis.confidence, row.stoppedBy,
    row.bracket?.low, row.bracket?.high, row.stepsUsed, row.trialsUsed,
    row.fit?.method, row.fit?.slope, row.fit?.dispersion, row.fit?.separated, row.note
  ])
  return { header, rows }
}
