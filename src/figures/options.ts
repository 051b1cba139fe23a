/**
 * What a figure shows, as a zod schema. Values may arrive as strings (an HTTP query, CLI
 * flags) or as numbers and booleans (code), so the same schema serves the API's query, the
 * CLI and direct calls.
 */
import { z } from 'zod'
import { END_STATES } from '../engine/index.js'
import { AXIS_ORDER, VARIED_PARAMETERS, type AxisPath, type VariedPath } from '../spec/index.js'

// VARIABLES //

/** Plottable measures of a result row (see measures.ts for what each one reads). */
export const FIGURE_MEASURES = [
  'success', 'overlap', 'sweeps', 'maxOtherOverlap', 'energy', 'endState', 'unstableFraction', 'fixedPatternFraction',
  'patternOverlapMeanAbs', 'patternOverlapMaxAbs'
] as const

export type FigureMeasure = typeof FIGURE_MEASURES[number]

const VARIED_PATHS = VARIED_PARAMETERS.map((p) => p.path) as [VariedPath, ...VariedPath[]]
const AXIS_PATHS = [...AXIS_ORDER] as [AxisPath, ...AxisPath[]]

export const FIGURE_SIZE = { minWidth: 240, maxWidth: 4000, minHeight: 180, maxHeight: 3000, width: 640, height: 440 } as const

/**
 * Print sizes: journal column widths in mm, with the height each gets by default. A figure
 * sized in mm is laid out in points (1/72 in), its type in pt.
 */
export const FIGURE_COLUMNS = {
  single: { widthMm: 85, heightMm: 64 },
  double: { widthMm: 180, heightMm: 112 }
} as const

export const FIGURE_MM = { min: 30, max: 500 } as const
export const FIGURE_FONT = { min: 5, max: 32, screen: 12, print: 7.5 } as const
/** Most names one list of series or sweep names holds. */
const MAX_NAMES = 32

// MAIN //

const flag = z.union([
  z.boolean(),
  z.enum(['true', 'false', '1', '0']).transform((s) => s === 'true' || s === '1')
])

const scale = z.enum(['linear', 'log'])

/**
 * Names, one per series (or sweep) in order, in one string separated by `|` (as a query
 * parameter or a flag carries them). An empty name keeps the generated one.
 */
const names = z.string().max(MAX_NAMES * 121).transform((s) => s.split('|'))
  .pipe(z.array(z.string().max(120, 'each name has at most 120 characters')).max(MAX_NAMES, `at most ${MAX_NAMES} names`))

export const FigureOptionsSchema = z.strictObject({
  measure: z.enum(FIGURE_MEASURES).default('success').describe(
    'What the y axis shows: success (recall success rate), overlap (mean final target overlap), sweeps (mean sweeps run), ' +
    'maxOtherOverlap (mean largest |overlap| with another pattern), energy (mean energy per neuron), endState (fraction of ' +
    'trials ending in the class chosen by `endState`), unstableFraction and fixedPatternFraction (one-step stability of the ' +
    'stored patterns; needs measures.stability in the spec), patternOverlapMeanAbs and patternOverlapMaxAbs (mean and largest |overlap| ' +
    'between the stored patterns of a network, mean over networks; needs measures.patternOverlaps in the spec). Default: success.'),
  endState: z.enum(END_STATES).default('target').describe('With measure=endState: the class of final state counted. Default: target.'),
  x: z.enum(VARIED_PATHS).optional().describe('Varied parameter on the x axis. Default: the varied parameter with the most values (the later one in canonical order on a tie).'),
  series: z.enum(AXIS_PATHS).optional().describe(
    'Varied parameter that names the series (one per value) and orders the legend, numeric or categorical (rule, rule.selfCoupling). ' +
    'Any other varied parameter still splits series, so no line ever joins points that differ in more than x. Default: every varied parameter but x.'),
  xScale: scale.default('linear').describe('x axis scale; log needs positive x values. Default: linear.'),
  yScale: scale.default('linear').describe('y axis scale; on log, values ≤ 0 are left out (and counted in the description). Default: linear.'),
  errorBars: z.enum(['ci', 'se', 'sd', 'none']).default('ci').describe(
    'ci: 95 % confidence intervals (Wilson score for rates, Student t for means); se: ± one standard error; sd: ± one ' +
    'standard deviation of single trials (rates: √(p(1−p))); none. Rates stay within [0, 1]. Default: ci.'),
  analysis: z.enum(['crossings', 'scaling']).optional().describe(
    'Threshold searches only: crossings (each crossing with its interval against another varied parameter) or scaling (crossings against N with the fitted curve and the extrapolated value with its interval). Default: scaling when the search has a scaling fit.'),
  theory: flag.default(true).describe('Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true.'),
  width: z.coerce.number().int().min(FIGURE_SIZE.minWidth).max(FIGURE_SIZE.maxWidth).optional()
    .describe(`Width in px (screen figures). Default: ${FIGURE_SIZE.width}, unless the size is given in mm.`),
  height: z.coerce.number().int().min(FIGURE_SIZE.minHeight).max(FIGURE_SIZE.maxHeight).optional()
    .describe(`Height in px (screen figures). Default: ${FIGURE_SIZE.height}.`),
  column: z.enum(['single', 'double']).optional().describe(
    `Print size of a journal column: single (${FIGURE_COLUMNS.single.widthMm} × ${FIGURE_COLUMNS.single.heightMm} mm) or double ` +
    `(${FIGURE_COLUMNS.double.widthMm} × ${FIGURE_COLUMNS.double.heightMm} mm). widthMm and heightMm override either side. The figure is laid out in points and its type sized in pt.`),
  widthMm: z.coerce.number().min(FIGURE_MM.min).max(FIGURE_MM.max).optional().describe('Width in mm (print figures; not with width or height in px).'),
  heightMm: z.coerce.number().min(FIGURE_MM.min).max(FIGURE_MM.max).optional().describe('Height in mm (print figures). Default: three quarters of the width, or the column\'s height.'),
  fontSize: z.coerce.number().min(FIGURE_FONT.min).max(FIGURE_FONT.max).optional().describe(
    `Size of the body type (tick labels, legend) in px, or in pt for a size in mm; titles and notes scale with it. Default: ${FIGURE_FONT.screen} px, ${FIGURE_FONT.print} pt.`),
  title: z.string().max(300).optional().describe('Title. Default: the sweep label, or the measure against x.'),
  showTitle: flag.default(true).describe('Draw the title. Default: true.'),
  subtitle: z.string().max(300).optional().describe('Line under the title. Default: the model conditions every sweep shares (rule, cue, dynamics, trials).'),
  showSubtitle: flag.default(true).describe('Draw the subtitle. Default: true.'),
  footnote: z.string().max(600).optional().describe('Note under the plot. Default: what the error bars are, what was left out, and the spec hash and engine.'),
  showFootnote: flag.default(true).describe('Draw the footnote. Default: true.'),
  seriesNames: names.optional().describe('Names of the series in the order drawn, separated by | (an empty name keeps the generated one).'),
  sweepNames: names.optional().describe(
    'Overlays: a short name per sweep, in the order of the sweeps, separated by |; each series is named by it and its parameter values. Default: the sweep label, shortened.')
})

/** Options as a caller may write them (every field optional). */
export type FigureOptionsInput = z.input<typeof FigureOptionsSchema>
/** Options with every default filled in. */
export type FigureOptions = z.output<typeof FigureOptionsSchema>
