/**
 * Figures of threshold searches (a spec with `analysis`): the crossing of each search with its
 * interval against another varied parameter, one series per combination of the rest
 * (`analysis=crossings`); and finite-size scaling fits, the crossings against N with the fitted
 * curve x_∞ + a·N^(−b), the extrapolated x_∞ with its interval as a band, and the published
 * reference values as horizontal lines (`analysis=scaling`). Laid out by draw.ts like any figure.
 */
import type { ResultRow, SweepResult } from '../results/index.js'
import type { AxisValue, ScalingRow, SearchRow, VariedPath } from '../spec/index.js'
import { FigureOptionsError } from './errors.js'
import { figureFrame } from './frame.js'
import { formatValue, legendEntry, parameterAxisTitle, parameterShortName, parameterSymbol, plainText } from './labels.js'
import type { FigureOptions } from './options.js'
import type { FigurePlan } from './plan.js'
import type { PlotSeries } from './series.js'
import type { TheoryOverlay } from './theory.js'

const REFERENCE_LABELS: Record<string, string> = {
  'rs-theory': 'Replica-symmetric theory',
  'finite-size-simulations': 'Published finite-size simulations'
}

/** Samples of a fitted curve. */
const FIT_SAMPLES = 120

export function planAnalysisFigure (results: readonly SweepResult[], options: FigureOptions): FigurePlan {
  if (results.length !== 1) {
    throw new FigureOptionsError([{ path: '', message: 'a threshold search is drawn on its own: overlays take grid sweeps only' }])
  }
  const result = results[0]!
  const analysis = result.spec.analysis!
  const searches = result.searches ?? []
  const view = options.analysis ?? (result.scaling !== undefined && result.scaling.length > 0 ? 'scaling' : 'crossings')
  const parameter = analysis.parameter as VariedPath
  const levelWords = `${analysis.measure === 'success' ? 'success rate' : 'overlap'} = ${formatValue(analysis.level)}`
  const frame = figureFrame(options)
  const yTitle = `${plainText(parameterAxisTitle(parameter, [result.spec]))} at the crossing (${levelWords})`
  const conditionsNote = `Crossings with their ${Math.round(analysis.confidence * 100)}\u00a0% intervals. Spec ${result.specHash.slice(0, 12)}, engine ${result.provenance.engineVersion}.`
  const base = {
    options: { ...options, xScale: view === 'scaling' && options.xScale === 'linear' && options.x === undefined ? 'log' as const : options.xScale, errorBars: 'ci' as const },
    results,
    frame,
    conditions: '',
    subtitle: options.subtitle ?? '',
    sweepLabels: [result.spec.label ?? `sweep ${result.specHash.slice(0, 8)}`],
    yFollowsData: true
  }
  const title = options.title ?? result.spec.label ?? `${parameterShortName(parameter)} at the crossing`
  if (view === 'scaling') {
    const rows = result.scaling ?? []
    if (rows.length === 0) throw new FigureOptionsError([{ path: 'analysis', message: 'this threshold search has no scaling fit (the spec needs analysis.scaling and several network sizes)' }])
    const series = rows.map((row, i) => scalingSeries(row, i, searches))
    const theory = rows.flatMap((row, i) => scalingOverlays(row, i, series[i]!, rows.length > 1, parameterSymbol(parameter)))
    const note = options.footnote ?? `${conditionsNote} Fit: x_c(N) = x_∞ + a·N⁻ᵇ; band: the ${Math.round((rows.find((r) => r.fit !== null)?.fit?.limitInterval.confidence ?? 0.95) * 100)}\u00a0% interval of x_∞.`
    const xTitle = 'Network size N (neurons)'
    return {
      ...base,
      x: 'neurons',
      seriesBy: null,
      series,
      theory: theory.map((t) => ({ ...t, label: t.label })),
      title,
      xTitle,
      yTitle,
      note,
      description: describe(series, theory, xTitle, yTitle, note),
      dodge: series.map(() => 0)
    }
  }
  const axes = Object.keys(searches[0]?.values ?? {}) as VariedPath[]
  const x = options.x ?? [...axes].sort((a, b) => distinct(searches, b) - distinct(searches, a))[0]
  if (x === undefined || !axes.includes(x)) {
    throw new FigureOptionsError([{ path: 'x', message: axes.length === 0 ? 'the search varies no other parameter to draw its crossings against' : `the search's other varied parameters are ${axes.map((a) => `'${a}'`).join(', ')}` }])
  }
  const series = crossingSeries(searches, x)
  const xTitle = parameterAxisTitle(x, [result.spec])
  const note = options.footnote ?? conditionsNote
  return {
    ...base,
    x,
    seriesBy: null,
    series,
    theory: [],
    title,
    xTitle,
    yTitle,
    note,
    description: describe(series, [], xTitle, yTitle, note),
    dodge: series.map(() => 0)
  }
}

function distinct (searches: readonly SearchRow[], path: string): number {
  return new Set(searches.map((s) => s.values[path])).size
}

/** Rows standing for the searches, so the drawing finds each point's x where it finds a grid row's. */
function pseudoRow (point: number, x: string, value: number): ResultRow {
  return { point, values: { [x]: value } } as unknown as ResultRow
}

function crossingSeries (searches: readonly SearchRow[], x: VariedPath): PlotSeries[] {
  const groups = new Map<string, SearchRow[]>()
  for (const s of searches) {
    const key = JSON.stringify(Object.entries(s.values).filter(([path]) => path !== x))
    groups.set(key, [...(groups.get(key) ?? []), s])
  }
  return [...groups.values()].map((group, index) => {
    const sorted = [...group].sort((a, b) => (a.values[x] as number) - (b.values[x] as number))
    const others = Object.entries(sorted[0]!.values).filter(([path]) => path !== x && distinct(searches, path) > 1)
    const label = others.length === 0 ? 'Crossing' : others.map(([path, v]) => legendEntry(path as VariedPath, v)).join(', ')
    const points = sorted.filter((s) => s.estimate !== null).map((s) => ({ x: s.values[x] as number, y: s.estimate!, low: s.low, high: s.high, n: s.trialsUsed, point: s.search }))
    return analysisSeries(index, label, others, sorted.map((s) => pseudoRow(s.search, x, s.values[x] as number)), points, sorted.length - points.length)
  })
}

function scalingSeries (row: ScalingRow, index: number, searches: readonly SearchRow[]): PlotSeries {
  const others = Object.entries(row.values)
  const label = others.length === 0 ? 'Crossing at each N' : others.map(([path, v]) => legendEntry(path as VariedPath, v)).join(', ')
  const sizes = [...row.sizes].sort((a, b) => a.neurons - b.neurons)
  const points = sizes.map((s) => {
    const search = searches[s.search]
    return { x: s.neurons, y: s.estimate, low: search?.low ?? null, high: search?.high ?? null, n: search?.trialsUsed ?? 0, point: s.search }
  })
  return analysisSeries(index, label, others, sizes.map((s) => pseudoRow(s.search, 'neurons', s.neurons)), points, row.excluded.length)
}

/** A series of an analysis figure: one sweep, its own look and colour, nothing below a log axis. */
function analysisSeries (index: number, label: string, fixed: Array<[string, AxisValue]>, rows: PlotSeries['rows'], points: PlotSeries['points'], missing: number): PlotSeries {
  return { index, sweep: 0, label, look: index, colour: index, fixed: Object.fromEntries(fixed), rows, points, missing, belowLogAxis: 0 }
}

function scalingOverlays (row: ScalingRow, index: number, series: PlotSeries, several: boolean, symbol: string): TheoryOverlay[] {
  const fit = row.fit
  if (fit === null || series.points.length === 0) return []
  const ns = series.points.map((p) => p.x)
  const [lo, hi] = [Math.min(...ns), Math.max(...ns)]
  const curve: Array<readonly [number, number]> = []
  for (let i = 0; i <= FIT_SAMPLES; i++) {
    const n = Math.exp(Math.log(lo) + (Math.log(hi) - Math.log(lo)) * (i / FIT_SAMPLES))
    curve.push([n, fit.limit.value + fit.amplitude.value * n ** -fit.exponent.value])
  }
  const tag = several ? `, ${series.label}` : ''
  const limit = fit.limit.value
  const overlays: TheoryOverlay[] = [
    { key: 'scalingFit', kind: 'curve', label: `Fit ${symbol}_{∞} + a·N⁻ᵇ, b = ${formatValue(Number(fit.exponent.value.toPrecision(3)))}${tag}`, series: [index], segments: [curve], at: null },
    {
      key: 'scalingLimit',
      kind: 'per-point',
      label: `${symbol}_{∞} = ${formatValue(Number(limit.toPrecision(3)))} [${formatValue(Number(fit.limitInterval.low.toPrecision(3)))}, ${formatValue(Number(fit.limitInterval.high.toPrecision(3)))}]${tag}`,
      series: [index],
      segments: [[[lo, limit], [hi, limit]]],
      at: null,
      band: { low: fit.limitInterval.low, high: fit.limitInterval.high }
    }
  ]
  for (const ref of row.references) {
    overlays.push({
      key: `reference-${ref.name}`,
      kind: 'reference',
      label: `${REFERENCE_LABELS[ref.name] ?? ref.name}: ${formatValue(Number(ref.value.toPrecision(4)))}`,
      series: [index],
      segments: [[[lo, ref.value], [hi, ref.value]]],
      at: null,
      horizontal: true
    })
  }
  return overlays
}

function describe (series: readonly PlotSeries[], theory: readonly TheoryOverlay[], xTitle: string, yTitle: string, note: string): string {
  const parts = series.map((s) => `${plainText(s.label)}: ${s.points.map((p) => `${formatValue(p.x)} → ${formatValue(Number(p.y.toPrecision(4)))}`).join(', ')}`)
  const lines = theory.length === 0 ? '' : ` Lines: ${theory.map((t) => plainText(t.label)).join('; ')}.`
  return `${plainText(yTitle)} against ${plainText(xTitle)}. ${parts.join('. ')}.${lines} ${note}`
}
