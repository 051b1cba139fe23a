/**
 * From results to series: which rows form a series, in which order, under which label, and
 * the value each row contributes. A series holds rows that differ only in x, so a line
 * never joins points that differ in anything else.
 */
import type { TrialRecord } from '../engine/index.js'
import { gridAxes, numericAxes, type AxisPath, type AxisValue, type VariedPath } from '../spec/index.js'
import { type ResultRow, type SweepResult } from '../results/index.js'
import { FigureOptionsError } from './errors.js'
import { legendEntry } from './labels.js'
import { measureRow } from './measures.js'
import type { FigureOptions } from './options.js'

/** Most series one figure draws: beyond this no legend or marker set stays readable. */
export const MAX_SERIES = 24
/** Most points one figure draws, so an SVG stays a document a viewer opens at once. */
export const MAX_POINTS = 10_000

export interface PlotPoint {
  x: number
  y: number
  low: number | null
  high: number | null
  /** Trials (stability measures: networks) behind the value. */
  n: number
  /** The row's grid point index in its result. */
  point: number
}

export interface PlotSeries {
  index: number
  /** Index of the result (sweep) the series comes from. */
  sweep: number
  /** Legend label (may hold `_{…}` subscripts). */
  label: string
  /** Marker and dash of the series (seriesStyle's `look`). */
  look: number
  /** Colour of the series: its sweep's in an overlay, else the same as `look`. */
  colour: number
  /** The varied parameters other than x, fixed along the series. */
  fixed: Record<string, AxisValue>
  /** Rows of the series, in increasing x. */
  rows: ResultRow[]
  /** Plotted points, in increasing x. */
  points: PlotPoint[]
  /** Rows without a value for the measure (non-finite, or not measured). */
  missing: number
  /** Rows left out because their value is ≤ 0 on a log y axis. */
  belowLogAxis: number
}

export interface SeriesPlan {
  x: VariedPath
  /** The parameter named first in labels, when the caller chose one. */
  seriesBy: AxisPath | null
  series: PlotSeries[]
  sweepLabels: string[]
}

// MAIN //

export function planSeries (results: readonly SweepResult[], options: FigureOptions): SeriesPlan {
  if (results.length === 0) throw new FigureOptionsError([{ path: '', message: 'there is no result to draw' }])
  const axesOf = results.map((r) => gridAxes(r.spec))
  const x = options.x ?? defaultX(numericAxes(results[0]!.spec))
  if (x === null) {
    throw new FigureOptionsError([{ path: 'x', message: `${describeSweep(results, 0)} varies no parameter, so there is nothing to put on the x axis` }])
  }
  axesOf.forEach((axes, s) => {
    if (!axes.some((a) => a.path === x)) {
      throw new FigureOptionsError([{ path: 'x', message: `${describeSweep(results, s)} does not vary '${x}'; it varies ${listAxes(axes)}` }])
    }
  })
  const seriesBy = options.series ?? null
  if (seriesBy !== null) {
    if (seriesBy === x) throw new FigureOptionsError([{ path: 'series', message: `'${seriesBy}' is already on the x axis` }])
    axesOf.forEach((axes, s) => {
      if (!axes.some((a) => a.path === seriesBy)) {
        throw new FigureOptionsError([{ path: 'series', message: `${describeSweep(results, s)} does not vary '${seriesBy}'; it varies ${listAxes(axes)}` }])
      }
    })
  }
  checkMeasureAvailable(results, options)

  const overlay = results.length > 1
  const sweepNames = options.sweepNames ?? []
  if (sweepNames.length > results.length) {
    throw new FigureOptionsError([{ path: 'sweepNames', message: `${sweepNames.length} names for ${results.length} sweep(s)` }])
  }
  const sweepLabels = uniqueLabels(results.map((r, s) => {
    const given = sweepNames[s]
    if (given !== undefined && given.trim() !== '') return given.trim()
    const label = r.spec.label ?? `sweep ${s + 1} (${r.specHash.slice(0, 8)})`
    return overlay ? shortenLabel(label) : label
  }))
  const series: PlotSeries[] = []
  // In an overlay the colour says the sweep and the marker the parameter values, the same values the same marker in every sweep.
  const looks = new Map<string, number>()
  results.forEach((result, s) => {
    const axes = axesOf[s]!
    const splitBy = axes.filter((a) => a.path !== x)
    if (seriesBy !== null) splitBy.sort((a, b) => (a.path === seriesBy ? -1 : b.path === seriesBy ? 1 : 0))
    const groups = new Map<string, ResultRow[]>()
    for (const row of result.rows) {
      const key = splitBy.map((a) => (a.values as readonly AxisValue[]).indexOf(row.values[a.path]!)).join(',')
      const group = groups.get(key)
      if (group === undefined) groups.set(key, [row])
      else group.push(row)
    }
    // Series follow the axis values in the order the spec lists them.
    const keys = [...groups.keys()].sort((a, b) => compareIndexLists(a, b))
    for (const key of keys) {
      const rows = groups.get(key)!.sort((a, b) => (a.values[x] as number) - (b.values[x] as number))
      const fixed = Object.fromEntries(splitBy.map((a) => [a.path, rows[0]!.values[a.path]!]))
      const parts = splitBy.filter((a) => a.values.length > 1).map((a) => legendEntry(a.path, fixed[a.path]!))
      const label = overlay
        ? [sweepLabels[s]!, ...parts].join(' · ')
        : parts.length > 0 ? parts.join(', ') : 'Simulation'
      const partsKey = parts.join(', ')
      if (!looks.has(partsKey)) looks.set(partsKey, looks.size)
      const style = overlay ? { look: looks.get(partsKey)!, colour: s } : { look: series.length, colour: series.length }
      series.push(buildSeries(series.length, s, label, style, fixed, rows, x, result.trials, options))
    }
  })
  if (overlay && looks.size === 1) {
    // Every sweep draws one kind of series: the marker follows the sweep too, so print in grey still tells them apart.
    for (const one of series) one.look = one.sweep
  }
  const seriesNames = options.seriesNames ?? []
  if (seriesNames.length > series.length) {
    throw new FigureOptionsError([{ path: 'seriesNames', message: `${seriesNames.length} names for ${series.length} series` }])
  }
  seriesNames.forEach((name, i) => { if (name.trim() !== '') series[i]!.label = name.trim() })
  if (series.length > MAX_SERIES) {
    throw new FigureOptionsError([{
      path: options.series === undefined ? 'x' : 'series',
      message: `the figure would have ${series.length} series (at most ${MAX_SERIES} stay readable); choose an x or series parameter with fewer combinations left over, or draw a subset of the sweeps`
    }])
  }
  const points = series.reduce((sum, s) => sum + s.points.length, 0)
  if (points > MAX_POINTS) {
    throw new FigureOptionsError([{ path: '', message: `the figure would have ${points} points; at most ${MAX_POINTS} are drawn in one figure` }])
  }
  return { x, seriesBy, series, sweepLabels }
}

function buildSeries (
  index: number,
  sweep: number,
  label: string,
  style: { look: number, colour: number },
  fixed: Record<string, AxisValue>,
  rows: ResultRow[],
  x: VariedPath,
  trials: readonly TrialRecord[][] | undefined,
  options: FigureOptions
): PlotSeries {
  const points: PlotPoint[] = []
  let missing = 0
  let belowLogAxis = 0
  for (const row of rows) {
    const value = measureRow(row, trials?.[row.point], options.measure, options.errorBars, options.endState)
    if (value === null) { missing++; continue }
    if (options.yScale === 'log' && !(value.y > 0)) { belowLogAxis++; continue }
    points.push({ x: row.values[x] as number, ...value, point: row.point })
  }
  return { index, sweep, label, ...style, fixed, rows, points, missing, belowLogAxis }
}

/** The numeric axis with the most values; on a tie the later one in canonical order (it varies faster in the grid). */
function defaultX (axes: ReturnType<typeof numericAxes>): VariedPath | null {
  let best: VariedPath | null = null
  let most = 0
  for (const axis of axes) {
    if (axis.values.length >= most) { best = axis.path; most = axis.values.length }
  }
  return best
}

function checkMeasureAvailable (results: readonly SweepResult[], options: FigureOptions): void {
  if (options.measure === 'patternOverlapMeanAbs' || options.measure === 'patternOverlapMaxAbs') {
    results.forEach((r, s) => {
      if (!r.rows.some((row) => row.summary.patternOverlaps !== undefined)) {
        throw new FigureOptionsError([{ path: 'measure', message: `${describeSweep(results, s)} did not measure the overlaps between its stored patterns (the spec needs measures.patternOverlaps: true)` }])
      }
    })
    return
  }
  if (options.measure !== 'unstableFraction' && options.measure !== 'fixedPatternFraction') return
  results.forEach((r, s) => {
    if (!r.rows.some((row) => row.summary.stability !== null && row.summary.stability !== undefined)) {
      throw new FigureOptionsError([{ path: 'measure', message: `${describeSweep(results, s)} did not measure stability (the spec needs measures.stability: true)` }])
    }
  })
}

function describeSweep (results: readonly SweepResult[], s: number): string {
  const label = results[s]!.spec.label
  const name = label === null ? `sweep ${results[s]!.specHash.slice(0, 8)}` : `sweep '${label}'`
  return results.length > 1 ? `${name} (result ${s + 1})` : `the ${name}`
}

function listAxes (axes: ReturnType<typeof gridAxes>): string {
  return axes.length === 0 ? 'nothing' : axes.map((a) => `'${a.path}'`).join(', ')
}

function compareIndexLists (a: string, b: string): number {
  const left = a === '' ? [] : a.split(',').map(Number)
  const right = b === '' ? [] : b.split(',').map(Number)
  for (let i = 0; i < Math.min(left.length, right.length); i++) {
    if (left[i] !== right[i]) return left[i]! - right[i]!
  }
  return left.length - right.length
}

/** Sweep labels in overlay series names are cut to this many characters, at a word boundary. */
export const SHORT_LABEL = 28

/** A sweep label short enough to share a legend line with parameter values. */
export function shortenLabel (label: string): string {
  const chars = [...label.trim()]
  if (chars.length <= SHORT_LABEL) return label.trim()
  const head = chars.slice(0, SHORT_LABEL - 1).join('')
  const space = head.lastIndexOf(' ')
  const cut = space >= SHORT_LABEL / 2 ? head.slice(0, space) : head
  return `${cut.replace(/[\s,;:·–-]+$/, '')}…`
}

function uniqueLabels (labels: string[]): string[] {
  const seen = new Map<string, number>()
  return labels.map((label) => {
    const count = (seen.get(label) ?? 0) + 1
    seen.set(label, count)
    return count === 1 ? label : `${label} (${count})`
  })
}
