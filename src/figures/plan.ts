/**
 * Everything a figure shows, decided before any pixel: the options (validated), the series
 * and their points, the theory overlays and the words. Drawing (draw.ts) only lays this out.
 */
import type { SweepResult } from '../results/index.js'
import { FigureOptionsError } from './errors.js'
import { figureFrame, type FigureFrame } from './frame.js'
import {
  anyWarm, formatValue, measureAxisTitle, measureShortName, modelConditions, parameterAxisTitle, parameterShortName, plainText
} from './labels.js'
import { CONFIDENCE, isRate } from './measures.js'
import { FigureOptionsSchema, type FigureOptions } from './options.js'
import { planSeries, type SeriesPlan } from './series.js'
import { planTheory, type TheoryOverlay } from './theory.js'

export interface FigurePlan extends SeriesPlan {
  options: FigureOptions
  results: readonly SweepResult[]
  theory: TheoryOverlay[]
  /** The page: size, unit and body type size. */
  frame: FigureFrame
  title: string
  /** Model conditions shared by every sweep ('' when none). */
  conditions: string
  /** The line under the title: the caller's, or the model conditions. */
  subtitle: string
  xTitle: string
  yTitle: string
  /** The footnote: the caller's, or what the error bars are, what was left out, where the data come from. */
  note: string
  /** The text of <desc>: the figure in words, for screen readers and search. */
  description: string
  /** Sideways shift of each series' markers in px, so error bars at a shared x stay apart. */
  dodge: number[]
  /** The y range follows the data (analysis figures), whatever the measure's natural range. */
  yFollowsData?: boolean
}

/** Most sideways shift between neighbouring series, and over all series, in px. */
const DODGE_STEP = 4
const DODGE_SPAN = 14

// MAIN //

/**
 * Validates options written by a caller (strings allowed, as from a query or CLI flags).
 *
 * @throws {FigureOptionsError} naming each offending option.
 */
export function parseFigureOptions (input: unknown): FigureOptions {
  const parsed = FigureOptionsSchema.safeParse(input ?? {})
  if (parsed.success) return parsed.data
  throw new FigureOptionsError(parsed.error.issues.map((issue) => ({
    path: issue.path.map(String).join('.'),
    message: issue.code === 'unrecognized_keys' ? `unknown option(s): ${issue.keys.join(', ')}` : issue.message
  })))
}

/**
 * @throws {FigureOptionsError} when the options do not fit the results (x not varied, log
 *   axis over values ≤ 0, a measure the sweep did not record, too many series or points).
 */
export function planFigure (results: readonly SweepResult[], options: FigureOptions): FigurePlan {
  const frame = figureFrame(options)
  const plan = planSeries(results, options)
  const { x, series } = plan
  if (options.xScale === 'log') {
    const bad = series.flatMap((s) => s.rows.map((row) => row.values[x] as number)).find((v) => !(v > 0))
    if (bad !== undefined) {
      throw new FigureOptionsError([{ path: 'xScale', message: `a log axis needs positive values, and '${x}' takes the value ${bad}` }])
    }
  }
  const theory = planTheory(series, results, x, options)
  const specs = results.map((r) => r.spec)
  const measureWords = measureShortName(options.measure, options.endState)
  const title = options.title ?? (results.length === 1 && specs[0]!.label !== null
    ? specs[0]!.label
    : `${measureWords} vs ${parameterShortName(x)}`)
  const shown = new Set<string>([x, ...series.flatMap((s) => Object.keys(s.fixed))])
  // A non-breaking space keeps each separator at the end of a line when the line wraps.
  const conditions = commonItems(specs.map((spec) => modelConditions(spec, shown))).map((item) => item.replaceAll(' ', '\u00a0')).join('\u00a0· ')
  const xTitle = parameterAxisTitle(x, specs)
  const yTitle = measureAxisTitle(options.measure, specs, options.endState)
  const dodge = dodgeOffsets(plan, options)
  const generatedNote = describeNote(plan, results, options, dodge)
  const note = options.footnote ?? generatedNote
  return {
    ...plan,
    options,
    results,
    theory,
    frame,
    title,
    conditions,
    subtitle: options.subtitle ?? conditions,
    xTitle,
    yTitle,
    note,
    description: describeFigure(plan, theory, options, xTitle, yTitle, generatedNote),
    dodge
  }
}

/** Shifts only when error bars are drawn and two series have a point at the same x. */
function dodgeOffsets (plan: SeriesPlan, options: FigureOptions): number[] {
  const k = plan.series.length
  const none = plan.series.map(() => 0)
  if (k < 2 || options.errorBars === 'none') return none
  const owner = new Map<number, number>()
  let shared = false
  for (const s of plan.series) {
    for (const p of s.points) {
      const first = owner.get(p.x)
      if (first === undefined) owner.set(p.x, s.index)
      else if (first !== s.index) shared = true
    }
  }
  if (!shared) return none
  const step = Math.min(DODGE_STEP, DODGE_SPAN / (k - 1))
  return plan.series.map((_, i) => (i - (k - 1) / 2) * step)
}

/** Phrases every sweep shares, in the order of the first. */
function commonItems (lists: readonly string[][]): string[] {
  const [first, ...rest] = lists
  if (first === undefined) return []
  return first.filter((item) => rest.every((list) => list.includes(item)))
}

export function errorBarWords (options: FigureOptions, plan: SeriesPlan): string | null {
  if (options.errorBars === 'none') return null
  const anyBar = plan.series.some((s) => s.points.some((p) => p.low !== null))
  const stability = options.measure === 'unstableFraction' || options.measure === 'fixedPatternFraction'
  if (!anyBar) return stability ? 'No error bars: the result holds no per-network stability records (download it with per-trial rows)' : null
  const confidence = `${Math.round(CONFIDENCE * 100)}\u00a0%`
  if (stability) {
    return {
      ci: `Error bars: ${confidence} Student t intervals of the mean over networks`,
      se: 'Error bars: ± one standard error over networks',
      sd: 'Error bars: ± one standard deviation over networks'
    }[options.errorBars]
  }
  if (isRate(options.measure)) {
    return {
      ci: `Error bars: ${confidence} Wilson score intervals`,
      se: 'Error bars: ± one binomial standard error',
      sd: 'Error bars: ± √(p(1 − p)), the spread of single trials'
    }[options.errorBars]
  }
  return {
    ci: `Error bars: ${confidence} Student t intervals of the mean`,
    se: 'Error bars: ± one standard error of the mean',
    sd: 'Error bars: ± one standard deviation of single trials'
  }[options.errorBars]
}

function describeNote (plan: SeriesPlan, results: readonly SweepResult[], options: FigureOptions, dodge: readonly number[]): string {
  const parts: string[] = []
  const bars = errorBarWords(options, plan)
  if (bars !== null) parts.push(bars)
  const shift = Math.max(...dodge.map(Math.abs))
  if (shift > 0) parts.push(`Series offset sideways by up to ±${formatValue(Number(shift.toFixed(1)))} px for legibility`)
  if (options.measure === 'overlap' && anyWarm(results.map((r) => r.spec))) parts.push('At T > 0, m is the time average over the sweeps after burn-in')
  const missing = plan.series.reduce((n, s) => n + s.missing, 0)
  if (missing > 0) parts.push(`${missing} point(s) without a value left out`)
  const belowLog = plan.series.reduce((n, s) => n + s.belowLogAxis, 0)
  if (belowLog > 0) parts.push(`${belowLog} value(s) ≤ 0 not shown on the log axis`)
  if (results.length === 1) {
    const r = results[0]!
    parts.push(`Spec ${r.specHash.slice(0, 12)}, engine ${r.provenance.engineVersion}`)
  } else {
    parts.push(`Specs ${results.map((r) => r.specHash.slice(0, 8)).join(', ')}`)
  }
  return parts.join('. ') + '.'
}

function describeFigure (plan: SeriesPlan, theory: readonly TheoryOverlay[], options: FigureOptions, xTitle: string, yTitle: string, note: string): string {
  const points = plan.series.reduce((n, s) => n + s.points.length, 0)
  const scale = (kind: 'linear' | 'log'): string => (kind === 'log' ? ' (log scale)' : '')
  const seriesWords = plan.series.length === 1
    ? `one series of ${points} point(s)`
    : `${plan.series.length} series (${plan.series.map((s) => plainText(s.label)).join('; ')}), ${points} points in all`
  const sentences = [`${plainText(yTitle)}${scale(options.yScale)} against ${plainText(xTitle)}${scale(options.xScale)}: ${seriesWords}.`]
  const ranges = plan.series.filter((s) => s.points.length > 0).map((s) => {
    const ys = s.points.map((p) => p.y)
    return `${plainText(s.label)} from ${formatValue(round4(ys[0]!))} to ${formatValue(round4(ys[ys.length - 1]!))}`
  })
  if (ranges.length > 0 && ranges.length <= 8) sentences.push(`Along x the values go ${ranges.join('; ')}.`)
  if (theory.length > 0) {
    sentences.push(`Theory: ${theory.map((t) => plainText(t.label) + (t.kind === 'reference' ? ` (vertical line at ${formatValue(round4(t.at!))})` : '')).join('; ')}.`)
  }
  sentences.push(note)
  return sentences.join(' ')
}

function round4 (v: number): number {
  return Number(v.toPrecision(4))
}
