/**
 * The optional `analysis` member of a sweep spec. Absent, the spec is a grid sweep as
 * before. `{ kind: "threshold", … }` turns it into a threshold search: for every point of
 * the grid formed by the other varied parameters, find where a measure crosses a level as
 * one parameter moves across a range, with a confidence interval.
 */
import { z } from 'zod'
import type { NumericDomain } from '../axis.js'

/**
 * Parameters a search may move: every continuous varied parameter except the success
 * threshold (which defines the measure rather than the network). Integer parameters would
 * turn bisection into a search over a lattice, and N is the size a scaling fit is taken over.
 * A function of the varied-parameter table (passed in, so this module never imports the
 * spec schema that imports it).
 */
export function searchableParameters<P extends string> (varied: ReadonlyArray<{ path: P, domain: NumericDomain }>): [P, ...P[]] {
  return varied.filter((p) => !p.domain.integer && p.path !== 'successThreshold').map((p) => p.path) as [P, ...P[]]
}

export const ANALYSIS_DEFAULTS = {
  measure: 'success',
  level: 0.5,
  direction: 'decreasing',
  maxSteps: 12,
  confidence: 0.95,
  /** The default tolerance is the range divided by this: the two ends and five halvings reach it. */
  toleranceDivisor: 32
} as const

export const ANALYSIS_CEILINGS = { maxSteps: 64 } as const

const scaling = z.discriminatedUnion('form', [
  z.strictObject({
    form: z.literal('power'),
    exponent: z.number().gt(0).max(4).nullable().default(null)
      .describe('b in x_c(N) = x_∞ + a·N^(−b): a fixed positive number, or null to fit it (needs ≥ 4 sizes). Default: null.')
  }).describe('x_c(N) = x_∞ + a·N^(−b).'),
  z.strictObject({ form: z.literal('linear-inverse') }).describe('x_c(N) = x_∞ + a/N.')
]).nullable().default(null)
  .describe('Finite-size scaling of the crossing over `neurons` (which must be an axis of at least 3 sizes, 4 with a fitted exponent): a weighted least-squares fit and its extrapolation to N → ∞. Default: null (no fit).')

/**
 * The analysis member's schema, for the varied-parameter table of the spec schema. One kind
 * so far; a second will make this a discriminated union on `kind` (a one-member union would
 * put a one-schema oneOf in the OpenAPI document).
 */
export function analysisSchema<P extends string> (varied: ReadonlyArray<{ path: P, domain: NumericDomain }>) {
  return thresholdAnalysisSchema(varied)
}

function thresholdAnalysisSchema<P extends string> (varied: ReadonlyArray<{ path: P, domain: NumericDomain }>) {
  return z.strictObject({
    kind: z.literal('threshold'),
    parameter: z.enum(searchableParameters(varied))
      .describe('The parameter moved by the search, by path. Its own field in the spec is ignored (the search sets it at every step) and may not be an axis; for `load`, give neither `patterns` nor `load`.'),
    measure: z.enum(['success', 'overlap']).default(ANALYSIS_DEFAULTS.measure)
      .describe('success: the fraction of trials whose final overlap reaches `successThreshold`; overlap: the mean final overlap. Default: success.'),
    level: z.number().gt(-1).lt(1).default(ANALYSIS_DEFAULTS.level)
      .describe('The level whose crossing is sought: a rate in (0, 1) for success, an overlap in (−1, 1) for overlap. Default: 0.5.'),
    from: z.number().describe('Low end of the searched range. Required.'),
    to: z.number().describe('High end of the searched range (greater than `from`). Required.'),
    direction: z.enum(['decreasing', 'increasing']).default(ANALYSIS_DEFAULTS.direction)
      .describe('How the measure moves as the parameter grows: decreasing (success falls with load, cue noise, temperature) or increasing. Default: decreasing.'),
    maxSteps: z.int().min(3).max(ANALYSIS_CEILINGS.maxSteps).default(ANALYSIS_DEFAULTS.maxSteps)
      .describe(`Most parameter values evaluated per search, both ends included; each runs \`trials\` trials. Default: ${ANALYSIS_DEFAULTS.maxSteps}.`),
    tolerance: z.number().positive().optional()
      .describe(`Stop once the bracket around the crossing is at most this wide (units of the parameter). Default: (to − from)/${ANALYSIS_DEFAULTS.toleranceDivisor}.`),
    confidence: z.number().gt(0).lt(1).default(ANALYSIS_DEFAULTS.confidence)
      .describe('Confidence level of the step intervals that steer the search and of the reported interval. Default: 0.95.'),
    scaling
  }).describe('Turns the sweep into an analysis (omit for a plain grid sweep). Threshold search: for every point of the grid of the other varied parameters, the value of `parameter` at which `measure` crosses `level`, with a confidence interval.')
}
