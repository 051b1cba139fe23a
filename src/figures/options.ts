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

export const FIGURE_SIZE = { minWidth: 320, maxWidth: 4000, minHeight: 240, maxHeight: 3000, width: 640, height: 440 } as const

// MAIN //

const flag = z.union([
  z.boolean(),
  z.enum(['true', 'false', '1', '0']).transform((s) => s === 'true' || s === '1')
])

const scale = z.enum(['linear', 'log'])

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
  theory: flag.default(true).describe('Overlay theory where it applies to the measure, x and model (curves, per-point values or reference lines). Default: true.'),
  width: z.coerce.number().int().min(FIGURE_SIZE.minWidth).max(FIGURE_SIZE.maxWidth).default(FIGURE_SIZE.width)
    .describe(`Width in px. Default: ${FIGURE_SIZE.width}.`),
  height: z.coerce.number().int().min(FIGURE_SIZE.minHeight).max(FIGURE_SIZE.maxHeight).default(FIGURE_SIZE.height)
    .describe(`Height in px. Default: ${FIGURE_SIZE.height}.`),
  title: z.string().max(300).optional().describe('Title. Default: the sweep label, or the measure against x.')
})

/** Options as a caller may write them (every field optional). */
export type FigureOptionsInput = z.input<typeof FigureOptionsSchema>
/** Options with every default filled in. */
export type FigureOptions = z.output<typeof FigureOptionsSchema>
