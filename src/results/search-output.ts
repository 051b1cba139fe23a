/**
 * Search results as CSV: one row per search, or (perTrial) one row per evaluated step,
 * since a search keeps per-step summaries rather than per-trial records. Scaling fits are
 * in the JSON only: a fit is not a row of the same table.
 */
import type { SweepResult } from './types.js'
import { toCsv, type CsvCell } from './csv.js'
import { gridAxes } from '../spec/grid.js'
import { summaryCells, summaryHeader } from './summary-cells.js'
import { measureCells, measureHeader, measureLayout } from './measure-columns.js'
import type { SearchRow } from '../spec/analysis/types.js'

// MAIN //

/**
 * Per search: `search`, the outer varied parameters, `neurons` (unless varied), `parameter`,
 * `measure`, `level`, `estimate`, `low`, `high`, `confidence`, `stoppedBy`, `bracket.low`,
 * `bracket.high`, `steps`, `trials`, `fit.method`, `fit.slope`, `fit.dispersion`,
 * `fit.separated`, `note`.
 * Per step: `search`, the outer varied parameters, `step`, the searched parameter (by its
 * path), `neurons`, `patterns`, `alpha` (each unless already a column), `side` (of the level),
 * then the step's summary columns as in a grid sweep's point rows.
 */
export function searchCsv (result: SweepResult, searches: readonly SearchRow[], perStep: boolean): string {
  const analysis = result.spec.analysis!
  const outer = gridAxes(result.spec).map((axis) => axis.path as string)
  if (perStep) {
    const params = (['neurons', 'patterns', 'alpha'] as const).filter((name) => !outer.includes(name) && name !== analysis.parameter)
    const stability = result.spec.measures.stability
    const layout = measureLayout(result, searches.flatMap((row) => row.steps.map((step) => step.summary)))
    const header = ['search', ...outer, 'step', analysis.parameter, ...params, 'side', ...summaryHeader(stability), ...measureHeader(layout)]
    const rows: CsvCell[][] = []
    for (const row of searches) {
      for (const step of row.steps) {
        rows.push([row.search, ...outer.map((path) => row.values[path]), step.step, step.value, ...params.map((name) => step.params[name]), step.side, ...summaryCells(step.summary, stability), ...measureCells(step.summary, layout)])
      }
    }
    return toCsv(header, rows)
  }
  const neurons = outer.includes('neurons') ? [] : ['neurons']
  const header = [
    'search', ...outer, ...neurons, 'parameter', 'measure', 'level', 'estimate', 'low', 'high', 'confidence', 'stoppedBy',
    'bracket.low', 'bracket.high', 'steps', 'trials', 'fit.method', 'fit.slope', 'fit.dispersion', 'fit.separated', 'note'
  ]
  const rows = searches.map((row): CsvCell[] => [
    row.search, ...outer.map((path) => row.values[path]), ...(neurons.length > 0 ? [row.neurons] : []),
    analysis.parameter, analysis.measure, analysis.level, row.estimate, row.low, row.high, analysis.confidence, row.stoppedBy,
    row.bracket?.low, row.bracket?.high, row.stepsUsed, row.trialsUsed,
    row.fit?.method, row.fit?.slope, row.fit?.dispersion, row.fit?.separated, row.note
  ])
  return toCsv(header, rows)
}
