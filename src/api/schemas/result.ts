/**
 * The JSON result of a sweep as resultToJson writes it (canonical JSON: sorted keys,
 * non-finite numbers as null). Documentation and response validation only: the bytes
 * themselves come from the spec layer unchanged, so their hash is a stable ETag.
 */
import { z } from 'zod'
import { END_STATES, ENDINGS, UNAVAILABLE_REASONS, UNAVAILABLE_REASON_CODES } from '../../engine/index.js'
import { analysisResultSchemas } from './analysis-result.js'

const stat = z.number().nullable()

const meanWithError = z.object({
  mean: stat,
  sd: stat.describe('Sample standard deviation over trials.'),
  se: stat.describe('Standard error of the mean.')
}).meta({ id: 'MeanWithError' })

const countsOf = (names: readonly string[]) => z.object(Object.fromEntries(names.map((n) => [n, z.number().int()])))

const stabilitySummary = z.object({
  networks: z.number().int(),
  unstableFraction: stat,
  tieFraction: stat,
  fixedPatternFraction: stat
})

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
  endStates: countsOf(END_STATES).describe('Where the final state sits: target, reversed target, another pattern, a mixture, or elsewhere.'),
  stability: stabilitySummary.nullable().describe('One-step stability of the stored patterns (when measured).')
}).meta({ id: 'PointSummary' })

/** Why a theory value is missing at a point: a stable code, each explained in the description. */
export const unavailableReasonSchema = z.enum(UNAVAILABLE_REASON_CODES as [string, ...string[]])
  .describe('Why the value is missing: ' + Object.entries(UNAVAILABLE_REASONS).map(([code, text]) => `\`${code}\`: ${text}`).join(' '))
  .meta({ id: 'TheoryUnavailableReason' })

export const theoryUnavailableSchema = z.record(z.string(), unavailableReasonSchema)
  .describe('The other theory values of the point\'s model, by name, each with the reason it is missing here (it is then an empty cell in CSV). Every value, its domain and its source: docs/theory.md.')

export const resultRowSchema = z.object({
  point: z.number().int(),
  values: z.record(z.string(), z.number()).describe('The varied parameters at this point, by path.'),
  params: z.object({ alpha: z.number(), neurons: z.number().int(), patterns: z.number().int() }),
  summary: pointSummarySchema,
  theory: z.record(z.string(), stat).describe('Theory values that hold at this point, by name; {} when none does.'),
  theoryUnavailable: theoryUnavailableSchema
}).meta({ id: 'ResultRow' })

export const trialRecordSchema = z.object({
  trial: z.number().int(),
  target: z.number().int(),
  initialOverlap: stat,
  overlap: stat,
  maxOtherOverlap: stat,
  sweeps: z.number().int(),
  ending: z.enum(ENDINGS),
  energy: stat,
  endState: z.enum(END_STATES),
  stability: z.object({ unstableFraction: stat, tieFraction: stat, fixedPatternFraction: stat }).optional(),
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

export const sweepResultSchema = z.object({
  specHash: z.string(),
  spec: z.record(z.string(), z.unknown()).describe('The normalised spec the result belongs to.'),
  rows: z.array(resultRowSchema).describe('One row per grid point, in grid order (the last axis varies fastest). Empty for an analysis: see `searches`.'),
  trials: z.array(z.array(trialRecordSchema)).optional().describe('trials[point][trial], only with ?trials=true. Empty for an analysis, which keeps per-step summaries (in `searches`) instead.'),
  searches: z.array(searchRowSchema).optional().describe('Analysis specs only: one threshold search per point of the grid of the other varied parameters, in grid order.'),
  scaling: z.array(scalingRowSchema).optional().describe('Analysis specs with `analysis.scaling` only: one finite-size fit per combination of the varied parameters other than `neurons`.'),
  provenance: provenanceSchema
}).meta({ id: 'SweepResult' })
