/** Public shapes of sweeps as the API shows them: status, progress, lists. */
import { z } from 'zod'
import { CALLBACK_STATES, SWEEP_ID_MAX_LENGTH, SWEEP_ID_PATTERN, SWEEP_STATUSES } from '../../backends/port.js'

export const sweepStatusEnum = z.enum(SWEEP_STATUSES).meta({
  id: 'SweepStatus',
  description: 'queued: waiting for a worker; running: trials are being computed; succeeded: results are ready; failed: stopped by an error (see `error.kind`); canceled: stopped on request.'
})

export const SWEEP_ID_RULE = `sweep ids are 1-${SWEEP_ID_MAX_LENGTH} letters, digits, - and _`

/** The one sweep-id schema: every route's path parameter, the overlay's list and the OpenAPI document. */
export const sweepIdSchema = z.string().min(1).max(SWEEP_ID_MAX_LENGTH).regex(SWEEP_ID_PATTERN, SWEEP_ID_RULE)
  .describe(`Sweep id, as returned by POST /v1/sweeps (1-${SWEEP_ID_MAX_LENGTH} letters, digits, - and _; anything else is a 400).`)

export const progressSchema = z.object({
  pointsDone: z.number().int().nonnegative().describe('Grid points whose every trial is done.'),
  pointsTotal: z.number().int().nonnegative(),
  trialsDone: z.number().int().nonnegative(),
  trialsTotal: z.number().int().nonnegative().describe('Trials planned so far: all of them, or with precision targets the blocks given to each point so far (it grows; never shrinks).'),
  chunksDone: z.number().int().nonnegative(),
  chunksTotal: z.number().int().nonnegative(),
  fraction: z.number().min(0).max(1).describe('trialsDone / trialsTotal, 1 once succeeded. With precision targets trialsTotal grows block by block (a point takes another block until it meets its target), so the fraction is of the ceiling, pointsTotal × trials: it never goes back.'),
  elapsedSeconds: z.number().nonnegative().nullable().describe('Seconds since the sweep started running (until it finished); null while queued.'),
  estimatedSecondsLeft: z.number().nonnegative().nullable().describe('Rough estimate from the rate so far while running; 0 once finished; null when not yet known.')
}).meta({ id: 'SweepProgress' })

export const failureSchema = z.object({
  kind: z.enum(['user', 'system']).describe('user: the spec cannot be computed as given (change it); system: the infrastructure failed (retrying may help).'),
  message: z.string()
}).meta({ id: 'SweepFailure' })

export const sweepLinksSchema = z.object({
  self: z.string(),
  events: z.string(),
  results: z.string()
})

const callbackSchema = z.object({
  url: z.string(),
  state: z.enum(CALLBACK_STATES).describe('waiting: the sweep has not ended; pending: the event of its end is due or being retried; delivered: the receiver answered 2xx; failed: every attempt failed.'),
  attempts: z.number().int().nonnegative().describe('Attempts made for the event of the last end.'),
  lastError: z.string().nullable().describe('What went wrong at the last failed attempt (e.g. "the receiver answered 500"); null after a success.')
}).meta({ id: 'SweepCallback' })

export const sweepSchema = z.object({
  id: z.string(),
  status: sweepStatusEnum,
  label: z.string().nullable(),
  owner: z.string().nullable().describe('Owner of the token that submitted the sweep; null on a server without tokens.'),
  specHash: z.string().describe('sha256 of the canonical normalised spec: identical work has an identical hash.'),
  createdAt: z.string().describe('ISO 8601 time of submission.'),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  progress: progressSchema,
  error: failureSchema.nullable().describe('Why the sweep failed; null unless status is failed.'),
  reusedFrom: z.string().nullable().describe('Id of the earlier identical sweep whose results this one reuses, if any.'),
  extends: z.string().nullable().describe('Id of the sweep this one extends (POST /v1/sweeps/{id}/extend), if any.'),
  reused: z.object({
    points: z.number().int().nonnegative().describe('Grid points whose every trial planned at submission was taken from earlier sweeps of the owner instead of computed (with precision targets: the first block).'),
    trials: z.number().int().nonnegative().describe('Trials taken from earlier sweeps of the owner (same model parameters, seed and trial index: exactly the records a fresh run computes), at submission and, with precision targets, in later blocks.')
  }).describe('What this sweep took from the owner\'s earlier sweeps (its parent, for an extension) instead of computing.'),
  tags: z.array(z.string()).describe('Tags to find the sweep by (PATCH to change; list with ?tag=).'),
  notes: z.string().nullable().describe('Free notes (PATCH to change; searched by ?q=).'),
  replicateKey: z.string().describe('sha256 of the spec without its seed and label: sweeps with the same key are replicates (list them with ?replicatesOf=<id>).'),
  callback: callbackSchema.nullable().describe('The completion callback asked for at submission (?callbackUrl=), and how its delivery goes; null without one.'),
  links: sweepLinksSchema
}).meta({ id: 'Sweep' })

export const sweepListSchema = z.object({
  items: z.array(sweepSchema),
  nextCursor: z.string().nullable().describe('Pass as `cursor` for the next page; null on the last page. The same URL is in the Link header (rel="next").')
}).meta({ id: 'SweepList' })

export type SweepBody = z.infer<typeof sweepSchema>

export const sweepDetailSchema = sweepSchema.extend({
  spec: z.record(z.string(), z.unknown())
    .describe('The normalised spec: every default filled in, every axis expanded to { values }. It is itself a valid spec, so it can be resubmitted as is.')
}).meta({ id: 'SweepDetail' })

export type SweepDetailBody = z.infer<typeof sweepDetailSchema>

export const workEstimateSchema = z.object({
  points: z.number().int().describe('Grid points.'),
  trialsPerPoint: z.number().int(),
  trials: z.number().int().describe('points × trialsPerPoint.'),
  neuronUpdates: z.number().describe('Expected neuron visits over the whole sweep.'),
  peakBytes: z.number().describe('Largest memory one worker holds at once: the costliest point\'s network with a chunk of trial records, or one point\'s trial records while its result is assembled.'),
  cpuSeconds: z.number().describe('Estimated CPU time of the whole sweep on one core of a reference machine (per-trial overhead included; measured error: see docs/limits.md).'),
  storedBytes: z.number().describe('Estimated storage of the sweep: every trial record as stored, plus the result rows.')
}).meta({ id: 'WorkEstimate' })
