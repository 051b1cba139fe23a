/**
 * Figures of sweep results as standalone SVG: a measure against one varied parameter, one
 * series per value of another (or per sweep when several are overlaid), error bars, theory
 * where it applies. Pure functions of their arguments; no I/O.
 */
import type { SweepResult } from '../results/index.js'
import { planAnalysisFigure } from './analysis.js'
import { drawFigure } from './draw.js'
import { FigureOptionsError } from './errors.js'
import type { FigureOptions, FigureOptionsInput } from './options.js'
import { parseFigureOptions, planFigure } from './plan.js'

export { FigureOptionsSchema, FIGURE_MEASURES, FIGURE_SIZE, type FigureMeasure, type FigureOptions, type FigureOptionsInput } from './options.js'
export { FigureOptionsError, type FigureIssue } from './errors.js'
export { parseFigureOptions, planFigure, type FigurePlan } from './plan.js'
export { MAX_POINTS, MAX_SERIES, type PlotPoint, type PlotSeries } from './series.js'
export type { TheoryOverlay } from './theory.js'
export { MARKER_SHAPES, SERIES_DASHES } from './styles.js'

/**
 * Renders one result, or several overlaid (one series per sweep, labelled by its label), as
 * an SVG document.
 *
 * @throws {FigureOptionsError} when the options are invalid or do not fit the results.
 */
export function renderFigure (results: SweepResult | readonly SweepResult[], options: FigureOptionsInput = {}): string {
  return renderParsedFigure(results, parseFigureOptions(options))
}

/** renderFigure for options already validated (FigureOptionsSchema's output, as a route's query arrives). */
export function renderParsedFigure (results: SweepResult | readonly SweepResult[], options: FigureOptions): string {
  const list: readonly SweepResult[] = Array.isArray(results) ? results : [results as SweepResult]
  const searches = list.filter((r) => r.spec.analysis !== undefined)
  if (searches.length > 0) return drawFigure(planAnalysisFigure(list, options))
  if (options.analysis !== undefined) throw new FigureOptionsError([{ path: 'analysis', message: 'only a threshold search (a spec with analysis) has crossings or a scaling fit to draw' }])
  return drawFigure(planFigure(list, options))
}
