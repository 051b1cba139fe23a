/**
 * The JSON result of a sweep as resultToJson writes it (canonical JSON: sorted keys,
 * non-finite numbers as null). Documentation and response validation only: the bytes
 * themselves come from the spec layer unchanged, so their hash is a stable ETag.
 */
import { z } from 'zod'
import { END_STATE_DEFINITIONS, END_STATES, ENDINGS, UNAVAILABLE_REASONS, UNAVAILABLE_REASON_CODES } from '../../engine/index.js'
import { analysisResultSchemas } from './analysis-result.js'

const stat = z.number().nullable()

const meanWithError = z.object({
  mean: stat,
  sd: stat.describe('Sample standard deviation over trials.'),
  se: stat.describe('Standard error of the mean.')
}).meta({ id: 'MeanWithError' })

/** The varied parameters at a point: numbers, a rule axis' labels, a self-coupling axis' flags. */
export const axisValuesSchema = z.record(z.string(), z.union([z.number(), z.string(), z.boolean()]))
  .describe('The varied parameters at this point, by path: numbers; a rule axis gives the rule\'s label (its kind, then its parameters not at their defaults, e.g. `dense-polynomial(degree=3)`), a self-coupling axis true or false.')

const countsOf = (names: readonly string[]) => z.object(Object.fromEntries(names.map((n) => [n, z.number().int()])))

const stabilityFractions = {
  unstableFraction: stat.describe('Fraction of (pattern, neuron) pairs with ξ_i h_i < 0 when the network sits on the pattern.'),
  tieFraction: stat.describe('Fraction with h_i = 0 exactly (kept by the tie rule).'),
  fixedPatternFraction: stat.describe('Fraction of stored patterns that are exact fixed points.')
}

const stabilitySummary = z.object({
  networks: z.number().int(),
  ...stabilityFractions,
  sd: z.object(stabilityFractions).describe('Sample standard deviation of each fraction over networks.'),
  se: z.object(stabilityFractions).describe('Standard error of each mean over networks (sd/√networks).')
}).describe('Means over the networks whose stability was measured.')

/** The end-state classes with their rules (docs/end-states.md). */
const endStateList = END_STATES.map((s) => `\`${s}\`: ${END_STATE_DEFINITIONS[s]}`).join('; ')

const sharesOf = (names: readonly string[]) => z.object(Object.fromEntries(names.map((n) => [n, stat])))

const trajectorySummary = z.object({
  firstSweep: z.number().int().describe('The sweep of index 0 (0 for the overlap, whose sweep 0 is the cue; 1 for the energy).'),
  mean: z.array(stat),
  sd: z.array(stat),
  se: z.array(stat),
  running: z.array(z.number().int()).describe('Trials still running at each sweep.')
}).describe('Mean trajectory over the point\'s trials, index k = sweep firstSweep + k. A trial that stopped before the longest one holds its last value from then on.')
  .meta({ id: 'TrajectorySummary' })

const patternOverlapExpectation = z.object({
  mean: stat.describe('Expected mean C: (2a − 1)² for random patterns of activity a; for correlated families q² over same-parent pairs, 0 over the others, averaged over the pairs.'),
  rms: stat.describe('√(expected mean C²): 1/√N for independent unbiased patterns.'),
  meanAbs: stat.describe('Expected mean |C| (independent unbiased patterns only, exact binomial).'),
  maxAbs: stat.describe('Median of the largest |C| over the pairs (independent unbiased patterns only; pairs treated as independent).')
}).describe('What the pattern family implies; null where it implies nothing (supplied patterns) or no closed form is given.')

const patternOverlapSummary = z.object({
  networks: z.number().int(),
  pairs: z.number().int().describe('Pairs μ < ν per network.'),
  mean: meanWithError.describe('Mean of C_μν = (1/N) ξ^μ·ξ^ν over the pairs, averaged over networks.'),
  meanAbs: meanWithError.describe('Mean |C| over the pairs.'),
  rms: meanWithError.describe('Root mean square of C over the pairs.'),
  maxAbs: meanWithError.describe('Largest |C| over the pairs.'),
  expected: patternOverlapExpectation
}).describe('Overlaps between the stored patterns of each network (measures.patternOverlaps).')

export const pointSummarySchema = z.object({
  trials: z.number().int(),
  overlap: meanWithError.describe('Final overlap with the target pattern.'),
  success: z.object({
    count: z.number().int(),
    rate: stat,
    low: stat.describe('Wilson 95 % interval, lower end.'),
    high: stat.describe('Wilson 95 % interval, upper end.')
  }).describe('Trials whose final overlap reached the success threshold.'),
  sweeps: meanWithError,
  maxOtherOverlap: meanWithError,
  energy: meanWithError.describe('Energy per neuron of the final state.'),
  endings: countsOf(ENDINGS).describe('How the dynamics ended: fixed point, 2-cycle, sweep limit, or sampled (T > 0).'),
  endStates: countsOf(END_STATES).describe(`Trials per end-state class of the final state (T > 0: of the time-averaged overlaps). ${endStateList}.`),
  stability: stabilitySummary.nullable().describe('One-step stability of the stored patterns (when measured).'),
  endStateShares: sharesOf(END_STATES).optional().describe('T > 0 only: the mean over trials of the fraction of measured sweeps (after burn-in) spent in each class.'),
  finalEndStates: countsOf(END_STATES).optional().describe('T > 0 only: trials per class of the state after the last sweep.'),
  finalMaxOtherOverlap: meanWithError.optional().describe('T > 0 only: the largest other overlap of the state after the last sweep (maxOtherOverlap is its time average).'),
  finalEnergy: meanWithError.optional().describe('T > 0 only: the energy of the state after the last sweep (energy is its time average).'),
  componentOverlaps: z.array(meanWithError).optional().describe('Mixture cues only: the overlap with each component, target first (final; T > 0: time-averaged).'),
  overlapTrajectory: trajectorySummary.optional().describe('With measures.overlapTrajectory: the mean target overlap after each sweep, sweep 0 being the cue.'),
  energyTrajectory: trajectorySummary.optional().describe('With measures.energyTrajectory: the mean energy after each sweep, from sweep 1.'),
  patternOverlaps: patternOverlapSummary.optional()
}).meta({ id: 'PointSummary' })

/** Why a theory value is missing at a point: a stable code, each explained in the description. */
export const unavailableReasonSchema = z.enum(UNAVAILABLE_REASON_CODES as [string, ...string[]])
  .describe('Why the value is missing: ' + Object.entries(UNAVAILABLE_REASONS).map(([code, text]) => `\`${code}\`: ${text}`).join(' '))
  .meta({ id: 'TheoryUnavailableReason' })

export const theoryUnavailableSchema = z.record(z.string(), unavailableReasonSchema)
  .describe('The other theory values of the point\'s model, by name, each with the reason it is missing here (it is then an empty cell in CSV). Every value, its domain and its source: docs/theory.md.')

export const resultRowSchema = z.object({
  point: z.number().int(),
  values: axisValuesSchema,
  params: z.object({
    alpha: z.number().describe('Realised load per neuron P/N.'),
    neurons: z.number().int(),
    patterns: z.number().int(),
    inDegreeLoad: z.number().optional().describe('Under a fixed in-degree K only: the realised load per input P/K, the load that matters there.')
  }),
  summary: pointSummarySchema,
  theory: z.record(z.string(), stat).describe('Theory values that hold at this point, by name; {} when none does.'),
  theoryUnavailable: theoryUnavailableSchema,
  precision: z.object({
    measure: z.enum(['success', 'overlap']).describe('The measure whose 95 % interval the target narrows.'),
    target: z.number().describe('The half-width asked for (spec `precision.halfWidth`).'),
    halfWidth: z.number().describe('The half-width this point reached with its trials (`summary.trials`): Wilson\'s interval for success, 1.96·se for the overlap.'),
    met: z.boolean().describe('Whether the point reached the target; false when it stopped at the trial ceiling.')
  }).optional().describe('With precision targets only (docs/workflow.md): how far this point\'s interval narrowed.')
}).meta({ id: 'ResultRow' })

export const trialRecordSchema = z.object({
  trial: z.number().int(),
  target: z.number().int(),
  initialOverlap: stat,
  overlap: stat,
  maxOtherOverlap: stat.describe('Largest |overlap| with another pattern (T > 0: time average over the measured sweeps).'),
  sweeps: z.number().int(),
  ending: z.enum(ENDINGS),
  energy: stat.describe('Energy of the final state (T > 0: time average over the measured sweeps).'),
  endState: z.enum(END_STATES).describe('End-state class of the final overlaps (T > 0: of the time-averaged overlaps).'),
  endStateShares: sharesOf(END_STATES).optional().describe('T > 0 only: fraction of the measured sweeps in each class.'),
  finalEndState: z.enum(END_STATES).optional().describe('T > 0 only: class of the state after the last sweep.'),
  finalMaxOtherOverlap: stat.optional().describe('T > 0 only: largest other overlap after the last sweep.'),
  finalEnergy: stat.optional().describe('T > 0 only: energy after the last sweep.'),
  componentOverlaps: z.array(stat).optional().describe('Mixture cues only: overlap with each component, target first.'),
  stability: z.object({ unstableFraction: stat, tieFraction: stat, fixedPatternFraction: stat }).optional(),
  patternOverlaps: z.object({ pairs: z.number().int(), mean: stat, meanAbs: stat, rms: stat, maxAbs: stat }).optional()
    .describe('First trial of each network, with measures.patternOverlaps: the overlaps between its stored patterns.'),
  overlapTrajectory: z.array(stat).optional(),
  energyTrajectory: z.array(stat).optional()
}).meta({ id: 'TrialRecord' })

export const provenanceSchema = z.looseObject({
  specHash: z.string(),
  engineVersion: z.string(),
  node: z.string(),
  v8: z.string(),
  rng: z.string(),
  pointKeying: z.string().describe('How a grid point\'s random streams are keyed: by a hash of the point\'s model parameters, not its position in the grid, so sweeps that share a point (an extension, a new grid) draw the same trials there.'),
  tieRule: z.enum(['keep']).describe('The T = 0 tie rule of the dynamics: `keep` means a neuron whose local field is exactly zero keeps its state. Exact theory values derived under random tie-breaking say so in their names (…TiesRandom).'),
  wallSeconds: z.number().optional().describe('Only with ?timing=true: wall-clock seconds from the first chunk started to the last one finished.'),
  cpuSeconds: z.number().optional().describe('Only with ?timing=true: CPU seconds summed over all chunks.'),
  workers: z.number().int().optional(),
  fastPath: z.string().optional()
}).describe('Where and how the result was computed: fixed by the spec and the code, so repeated or interrupted runs give the same bytes. The run timing (which differs between runs) appears only with ?timing=true.')
  .meta({ id: 'Provenance' })

const { searchRow: searchRowSchema, scalingRow: scalingRowSchema } = analysisResultSchemas(pointSummarySchema)

/** `?series=trajectory` as JSON: the rows' mean trajectories, one entry per grid point. */
export const trajectorySeriesSchema = z.object({
  specHash: z.string(),
  series: z.literal('trajectory'),
  padding: z.string().describe('How a trial that stopped early is extended, in words.'),
  points: z.array(z.object({
    point: z.number().int(),
    values: axisValuesSchema,
    params: resultRowSchema.shape.params,
    overlap: trajectorySummary.nullable().describe('The mean target overlap after each sweep (sweep 0: the cue); null when not recorded.'),
    energy: trajectorySummary.nullable().describe('The mean energy after each sweep, from sweep 1; null when not recorded.')
  })).describe('One entry per grid point, in grid order.')
}).meta({ id: 'TrajectorySeries' })

export const sweepResultSchema = z.object({
  specHash: z.string(),
  spec: z.record(z.string(), z.unknown()).describe('The normalised spec the result belongs to.'),
  rows: z.array(resultRowSchema).describe('One row per grid point, in grid order (the last axis varies fastest). Empty for an analysis: see `searches`.'),
  trials: z.array(z.array(trialRecordSchema)).optional().describe('trials[point][trial], only with ?trials=true. Empty for an analysis, which keeps per-step summaries (in `searches`) instead.'),
  searches: z.array(searchRowSchema).optional().describe('Analysis specs only: one threshold search per point of the grid of the other varied parameters, in grid order.'),
  scaling: z.array(scalingRowSchema).optional().describe('Analysis specs with `analysis.scaling` only: one finite-size fit per combination of the varied parameters other than `neurons`.'),
  provenance: provenanceSchema,
  partial: z.object({
    pointsDone: z.number().int().nonnegative(),
    pointsTotal: z.number().int().nonnegative()
  }).optional().describe('Only in partial results (?partial=true on a sweep that has not succeeded): the rows are those of the points finished so far.')
}).meta({ id: 'SweepResult' })
