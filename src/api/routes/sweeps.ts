/** Submitting, validating, listing, reading and canceling sweeps. */
import { z } from 'zod'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { ServiceError } from '../../errors.js'
import { ActiveSweepCapError, ANY_OWNER, TERMINAL_STATUSES, type SweepRecord } from '../../backends/port.js'
import { SweepSpecSchema, checkLimits, estimateWork, extendSpec, MAX_AXIS_VALUES, normaliseSpec, specHash, WorkLimitError } from '../../spec/index.js'
import { requireAction, requireAdmin } from '../plugins/auth.js'
import { ifNoneMatchHits, presentSweep, sweepPath, sweepStateTag } from '../presenters.js'
import { problemResponses } from '../schemas/problem.js'
import { sweepDetailSchema, sweepIdSchema, sweepListSchema, sweepStatusEnum, workEstimateSchema, type SweepDetailBody } from '../schemas/sweep.js'
import { OWNER_NAME, type Principal } from '../tokens.js'
import { specBodyValidator, visibleSweep, type RouteContext } from './context.js'

const idParams = z.object({ id: sweepIdSchema })

/** Idempotency-Key is a structured-field string (draft-ietf-httpapi-idempotency-key-header); bare tokens are accepted too. */
const idempotencyHeaders = z.object({
  'idempotency-key': z.string().min(1).max(258)
    .transform((raw) => raw.trim().replace(/^"(.*)"$/, '$1'))
    .pipe(z.string().regex(/^[\x21\x23-\x7e]{1,255}$/, 'must be 1-255 visible ASCII characters'))
    .optional()
    .describe('Makes a retried submission safe: the same key with the same spec returns the first sweep; with a different spec, 422. Kept 24 h.')
})

const submitQuery = z.object({
  reuse: z.enum(['true', 'false']).optional()
    .describe('true: if you already have a succeeded sweep with the same spec hash, the new sweep reuses its results at once instead of running again. Default: false (a fresh run).'),
  reusePoints: z.enum(['true', 'false']).optional()
    .describe('true (default): grid points whose trials your earlier sweeps already computed (same model parameters, seed and trial range: exactly the records a fresh run computes) are taken from them instead of computed; the status says how many (`reused`). false: compute everything.'),
  callbackUrl: z.string().min(1).max(2048).optional()
    .describe('An http(s) URL that gets a signed POST (a small JSON event: sweep id, status, links, finishedAt) each time the sweep ends: succeeded, failed or canceled. Retried with backoff; delivery shows in the status (`callback`). Private, loopback and link-local targets are refused (422) unless the operator allows them. See docs/callbacks.md for the signature.')
})

/** A tag: short, plain, to filter a list by. */
const tagSchema = z.string().regex(/^[A-Za-z0-9][A-Za-z0-9 ._:-]{0,39}$/, 'tags are 1-40 letters, digits, spaces and . _ : -, starting with a letter or digit')
const tagsSchema = z.array(tagSchema).max(20).refine((tags) => new Set(tags).size === tags.length, 'tags must be distinct')
const notesSchema = z.string().max(4000)

const annotationBody = z.strictObject({
  label: z.string().max(200).nullable().optional().describe('New label; null clears it.'),
  tags: tagsSchema.optional().describe('The sweep\'s tags (replaces the list).'),
  notes: notesSchema.nullable().optional().describe('Free notes; null clears them.')
}).refine((patch) => patch.label !== undefined || patch.tags !== undefined || patch.notes !== undefined, 'give at least one of label, tags and notes')
  .meta({ id: 'SweepAnnotation' })

const extendBody = z.strictObject({
  trials: z.int().min(1).optional().describe('Trials per point of the extension (at least the parent\'s).'),
  add: z.record(z.string(), z.array(z.number()).min(1).max(MAX_AXIS_VALUES)).optional()
    .describe('Values to add, by varied parameter path (e.g. {"load": [0.13, 0.15]}); a parameter held constant becomes an axis of it and the new values.'),
  label: z.string().max(200).nullable().optional().describe('Label of the new sweep. Default: the parent\'s.'),
  tags: tagsSchema.optional(),
  notes: notesSchema.nullable().optional()
}).refine((body) => body.trials !== undefined || body.add !== undefined, 'give trials, add, or both')
  .meta({ id: 'SweepExtension' })

const deleteQuery = z.object({
  purge: z.enum(['true', 'false']).optional()
    .describe('true, on a finished sweep: remove the sweep, its stored chunks and its results for good (its owner only; irreversible). Without it, DELETE cancels an active sweep.')
})

/** `owner=*` in a listing: every owner's sweeps. */
const EVERY_OWNER = '*'

const listQuery = z.object({
  tag: tagSchema.optional().describe('Only sweeps with this tag.'),
  q: z.string().min(1).max(200).optional().describe('Only sweeps whose label or notes contain this text (case-insensitive).'),
  replicatesOf: sweepIdSchema.optional().describe('Only replicates of this sweep: the same spec but for its seed and label (re-runs with new seeds), itself included.'),
  owner: z.string().regex(new RegExp(`^(\\*|${OWNER_NAME.source.slice(1, -1)})$`), 'an owner name, or * for every owner').optional()
    .describe('Whose sweeps: `*` for every owner\'s, or an owner\'s name. Default: your own. Only an admin token may name another owner or `*` (others get 403); on a server without tokens the single user is the admin.'),
  status: sweepStatusEnum.optional().describe('Only sweeps in this state.'),
  limit: z.coerce.number().int().min(1).max(100).default(20).describe('Page size, 1-100. Default: 20.'),
  cursor: z.string().min(1).max(200).optional().describe('Opaque position from a previous page (nextCursor, or the Link rel="next" URL).')
})

const normalisedSpecSchema = z.record(z.string(), z.unknown())
  .describe('The normalised spec: every default filled in, every axis expanded to { values }. It is itself a valid spec.')

const validationSchema = z.object({
  specHash: z.string(),
  spec: normalisedSpecSchema,
  work: workEstimateSchema,
  limits: z.object({
    maxNeurons: z.number(),
    maxPoints: z.number(),
    maxTrials: z.number(),
    maxBytes: z.number(),
    maxCpuSeconds: z.number().nullable(),
    maxStoredBytes: z.number()
  }).describe('This server\'s work limits.'),
  exceeded: z.object({ name: z.string(), value: z.number(), max: z.number() }).nullable()
    .describe('The first limit this sweep exceeds (submitting it would get 422), or null.')
}).meta({ id: 'SpecValidation' })

function ownerLabel (principal: Principal): string {
  return principal.owner === null ? 'This server' : `Owner '${principal.owner}'`
}

/** The active cap's refusal as a 429 problem; anything else unchanged. */
function capProblem (error: unknown, principal: Principal): unknown {
  if (!(error instanceof ActiveSweepCapError)) return error
  return new ServiceError('MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS', { owner: ownerLabel(principal), active: error.active, max: error.max }, { headers: { 'retry-after': '30' }, extensions: { retryAfter: 30 } })
}

function detail (record: SweepRecord): SweepDetailBody {
  return { ...presentSweep(record), spec: record.spec as unknown as Record<string, unknown> }
}

export const sweepRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  const { queue } = ctx

  app.post('/v1/sweeps', {
    validatorCompiler: specBodyValidator,
    schema: {
      operationId: 'submitSweep',
      summary: 'Submit a sweep',
      description: 'Validates the spec, checks it against the work limits before anything is allocated, and queues it. Answers 202 with the status, a Location header and Retry-After; follow progress at /events or by polling the status. When the answer is a sweep that has already finished (a repeated Idempotency-Key of a finished sweep, or ?reuse=true finding identical results), it is 200 with that sweep\'s final status instead: no waiting needed.',
      tags: ['sweeps'],
      body: SweepSpecSchema,
      querystring: submitQuery,
      headers: idempotencyHeaders,
      response: {
        200: sweepDetailSchema.describe('The sweep has already finished (an Idempotency-Key repeated after it ended, or reused results): its final status. Location names it; no Retry-After.'),
        202: sweepDetailSchema.describe('Accepted, not finished yet: the sweep\'s status (Location names it; Retry-After suggests when to look again).'),
        ...problemResponses(400, 401, 403, 413, 415, 422, 429)
      }
    }
  }, async (request, reply) => {
    const principal = request.principal
    requireAction(principal, 'submit')
    const spec = normaliseSpec(request.body)
    checkLimits(spec, ctx.limits)
    const idempotencyKey = request.headers['idempotency-key']
    const callbackUrl = request.query.callbackUrl === undefined ? undefined : await ctx.callbacks.accept(request.query.callbackUrl, principal.owner)
    let record
    try {
      // The backend checks the cap atomically with storing the sweep (across API instances too).
      record = await queue.submit({
        spec,
        owner: principal.owner,
        ...(callbackUrl === undefined ? {} : { callbackUrl }),
        reuse: request.query.reuse === 'true',
        reusePoints: request.query.reusePoints !== 'false',
        maxActive: ctx.maxActiveSweepsPerOwner,
        ...(idempotencyKey === undefined ? {} : { idempotencyKey })
      })
    } catch (error) {
      throw capProblem(error, principal)
    }
    request.log.info({ sweepId: record.id, specHash: record.specHash, reusedFrom: record.reusedFrom, status: record.status }, 'sweep submitted')
    reply.header('location', sweepPath(record.id))
    if (TERMINAL_STATUSES.has(record.status)) {
      // Nothing to wait for: the answer is the sweep's final state.
      reply.code(200).header('content-location', sweepPath(record.id))
    } else {
      reply.code(202).header('retry-after', '2')
    }
    return reply.send({ ...presentSweep(record), spec: record.spec as unknown as Record<string, unknown> })
  })

  app.post('/v1/sweeps/validate', {
    validatorCompiler: specBodyValidator,
    schema: {
      operationId: 'validateSweep',
      summary: 'Check a spec without running it',
      description: 'Returns the normalised spec, its hash, the number of points and trials, and estimates of peak memory and CPU time, plus the first work limit it would exceed. Nothing is queued.',
      tags: ['sweeps'],
      body: SweepSpecSchema,
      response: { 200: validationSchema.describe('The normalised spec, its hash and the work estimate.'), ...problemResponses(400, 401, 413, 415, 422, 429) }
    }
  }, async (request) => {
    const spec = normaliseSpec(request.body)
    let exceeded: { name: string, value: number, max: number } | null = null
    try {
      checkLimits(spec, ctx.limits)
    } catch (error) {
      if (!(error instanceof WorkLimitError)) throw error
      exceeded = { name: error.limit, value: error.value, max: error.max }
    }
    const work = estimateWork(spec)
    return {
      specHash: specHash(spec),
      spec: spec as unknown as Record<string, unknown>,
      work,
      limits: { ...ctx.limits, maxCpuSeconds: ctx.limits.maxCpuSeconds ?? null },
      exceeded
    }
  })

  app.get('/v1/sweeps', {
    schema: {
      operationId: 'listSweeps',
      summary: 'List your sweeps (an admin: any owner\'s), newest first',
      description: 'Cursor pagination: follow `nextCursor` (or the Link header\'s rel="next" URL, which keeps the filters) until it is null. An admin lists every owner\'s sweeps with `owner=*`, or one owner\'s with `owner=<name>`.',
      tags: ['sweeps'],
      querystring: listQuery,
      response: { 200: sweepListSchema.describe('One page of sweeps, newest first.'), ...problemResponses(400, 401, 403, 429) }
    }
  }, async (request, reply) => {
    const { owner: asked, status, limit, cursor, tag, q, replicatesOf } = request.query
    const principal = request.principal
    if (asked !== undefined && asked !== principal.owner) requireAdmin(principal, 'list other owners\' sweeps')
    const owner = asked === undefined ? principal.owner : asked === EVERY_OWNER ? ANY_OWNER : asked
    const replicateKey = replicatesOf === undefined ? undefined : (await visibleSweep(queue, principal, replicatesOf)).replicateKey
    const page = await queue.list({
      owner,
      limit,
      ...(status === undefined ? {} : { status }),
      ...(cursor === undefined ? {} : { cursor }),
      ...(tag === undefined ? {} : { tag }),
      ...(q === undefined ? {} : { text: q }),
      ...(replicateKey === undefined ? {} : { replicateKey })
    })
    if (page.nextCursor !== null) {
      const next = new URLSearchParams({ limit: String(limit), cursor: page.nextCursor })
      if (asked !== undefined) next.set('owner', asked)
      if (status !== undefined) next.set('status', status)
      if (tag !== undefined) next.set('tag', tag)
      if (q !== undefined) next.set('q', q)
      if (replicatesOf !== undefined) next.set('replicatesOf', replicatesOf)
      reply.header('link', `</v1/sweeps?${next.toString()}>; rel="next"`)
    }
    const now = Date.now()
    return { items: page.items.map((record) => presentSweep(record, now)), nextCursor: page.nextCursor }
  })

  app.get('/v1/sweeps/:id', {
    schema: {
      operationId: 'getSweep',
      summary: 'Status and progress of one sweep',
      description: 'Carries a weak ETag that changes only when the sweep does: poll with If-None-Match to get 304 until something happens.',
      tags: ['sweeps'],
      params: idParams,
      response: {
        200: sweepDetailSchema.describe('The sweep\'s status, progress and normalised spec.'),
        304: z.undefined().describe('Not modified since the ETag given in If-None-Match.'),
        ...problemResponses(400, 401, 404, 429)
      }
    }
  }, async (request, reply) => {
    const record = await visibleSweep(queue, request.principal, request.params.id)
    const tag = sweepStateTag(record)
    reply.header('etag', tag).header('cache-control', 'no-cache')
    if (ifNoneMatchHits(request.headers['if-none-match'], tag)) return reply.code(304).send()
    return { ...presentSweep(record), spec: record.spec as unknown as Record<string, unknown> }
  })

  app.delete('/v1/sweeps/:id', {
    schema: {
      operationId: 'cancelSweep',
      summary: 'Cancel a sweep, or remove a finished one',
      description: 'Stops a queued or running sweep (running trials stop within about a second) and answers 202 with its record; what it stored stays (partial results, resume). A sweep that has already ended cannot be canceled: 409 MEMSWEEP_SWEEP_FINISHED, and nothing changes. With ?purge=true a finished sweep is removed for good, with its stored chunks and results (204; its owner only; irreversible); an active one is not (409 MEMSWEEP_SWEEP_ACTIVE: cancel it first). The request needs no body; one that is sent is read like any (JSON, within the body limit) and ignored.',
      tags: ['sweeps'],
      params: idParams,
      querystring: deleteQuery,
      response: {
        202: sweepDetailSchema.describe('Cancel requested: the sweep\'s record after the change.'),
        204: z.undefined().describe('Purged: the sweep and everything stored for it are gone.'),
        ...problemResponses(400, 401, 403, 404, 409, 413, 415, 429)
      }
    }
  }, async (request, reply) => {
    const principal = request.principal
    const { id } = request.params
    const before = await visibleSweep(queue, principal, id)
    requireAction(principal, 'cancel')
    if (request.query.purge === 'true') {
      if (before.owner !== principal.owner) throw new ServiceError('MEMSWEEP_OWNER_ONLY', { id, action: 'remove it' })
      if (!TERMINAL_STATUSES.has(before.status)) throw new ServiceError('MEMSWEEP_SWEEP_ACTIVE', { id, status: before.status }, { extensions: { sweepId: id } })
      if (!await queue.purge(id)) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
      request.log.info({ sweepId: id }, 'sweep purged')
      return reply.code(204).send()
    }
    const finished = (status: string): ServiceError => new ServiceError('MEMSWEEP_SWEEP_FINISHED', { id, status }, { extensions: { sweepId: id } })
    if (TERMINAL_STATUSES.has(before.status)) throw finished(before.status)
    const record = await queue.cancel(id)
    if (record === null) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
    // It may have ended on its own between the read and the cancel.
    if (record.status === 'succeeded' || record.status === 'failed') throw finished(record.status)
    request.log.info({ sweepId: record.id, status: record.status }, 'sweep cancel requested')
    return reply.code(202).send({ ...presentSweep(record), spec: record.spec as unknown as Record<string, unknown> })
  })

  app.patch('/v1/sweeps/:id', {
    schema: {
      operationId: 'annotateSweep',
      summary: 'Change a sweep\'s label, tags or notes',
      description: 'Describes a sweep for finding it again (?tag=, ?q= on the list); the work and results do not change. Owner (or admin) with a submit role.',
      tags: ['sweeps'],
      params: idParams,
      body: annotationBody,
      response: { 200: sweepDetailSchema.describe('The sweep after the change.'), ...problemResponses(400, 401, 403, 404, 413, 415, 422, 429) }
    }
  }, async (request) => {
    const principal = request.principal
    const { id } = request.params
    await visibleSweep(queue, principal, id)
    requireAction(principal, 'submit')
    const { label, tags, notes } = request.body
    const record = await queue.annotate(id, { ...(label === undefined ? {} : { label }), ...(tags === undefined ? {} : { tags }), ...(notes === undefined ? {} : { notes }) })
    if (record === null) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
    return detail(record)
  })

  app.post('/v1/sweeps/:id/extend', {
    schema: {
      operationId: 'extendSweep',
      summary: 'Extend a sweep: more trials, more values on any axis',
      description: 'Creates a new sweep (its `extends` names this one) whose spec is this sweep\'s with more trials per point and/or more values on any varied parameter. Every trial this sweep stored (even if it was canceled) is taken, not computed again; only what is missing runs. Its rows equal, byte for byte, those of a fresh run of the extended spec, because every trial draws from a stream keyed by the seed, the point\'s parameters and the trial\'s index. Answers like a submission (202, or 200 when nothing is left to compute).',
      tags: ['sweeps'],
      params: idParams,
      body: extendBody,
      response: {
        200: sweepDetailSchema.describe('The extension, already finished (everything was taken from earlier sweeps).'),
        202: sweepDetailSchema.describe('The extension, queued.'),
        ...problemResponses(400, 401, 403, 404, 413, 415, 422, 429)
      }
    }
  }, async (request, reply) => {
    const principal = request.principal
    const parent = await visibleSweep(queue, principal, request.params.id)
    requireAction(principal, 'submit')
    if (parent.owner !== principal.owner) throw new ServiceError('MEMSWEEP_OWNER_ONLY', { id: parent.id, action: 'extend it' })
    const { trials, add, label, tags, notes } = request.body
    const spec = extendSpec(parent.spec, { ...(trials === undefined ? {} : { trials }), ...(add === undefined ? {} : { add }), ...(label === undefined ? {} : { label }) })
    checkLimits(spec, ctx.limits)
    let record
    try {
      record = await queue.submit({
        spec,
        owner: principal.owner,
        extends: parent.id,
        maxActive: ctx.maxActiveSweepsPerOwner,
        tags: tags ?? parent.tags,
        ...(notes === undefined ? {} : { notes })
      })
    } catch (error) {
      throw capProblem(error, principal)
    }
    request.log.info({ sweepId: record.id, extends: parent.id, reused: record.reused }, 'sweep extended')
    reply.header('location', sweepPath(record.id))
    if (TERMINAL_STATUSES.has(record.status)) reply.code(200).header('content-location', sweepPath(record.id))
    else reply.code(202).header('retry-after', '2')
    return reply.send(detail(record))
  })

  app.post('/v1/sweeps/:id/resume', {
    schema: {
      operationId: 'resumeSweep',
      summary: 'Resume a canceled or failed sweep',
      description: 'Lets a canceled or failed sweep run on under the same id: every chunk it stored is kept, only the rest is computed. 409 MEMSWEEP_NOT_RESUMABLE for a sweep in any other state.',
      tags: ['sweeps'],
      params: idParams,
      response: { 202: sweepDetailSchema.describe('Resumed: the sweep is queued again.'), ...problemResponses(400, 401, 403, 404, 409, 413, 415, 429) }
    }
  }, async (request, reply) => {
    const principal = request.principal
    const { id } = request.params
    const before = await visibleSweep(queue, principal, id)
    requireAction(principal, 'submit')
    if (before.owner !== principal.owner) throw new ServiceError('MEMSWEEP_OWNER_ONLY', { id, action: 'resume it' })
    if (before.status !== 'canceled' && before.status !== 'failed') throw new ServiceError('MEMSWEEP_NOT_RESUMABLE', { id, status: before.status }, { extensions: { sweepId: id } })
    let record
    try {
      record = await queue.resume(id, { maxActive: ctx.maxActiveSweepsPerOwner })
    } catch (error) {
      throw capProblem(error, principal)
    }
    if (record === null) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
    if (record.status !== 'queued' && record.status !== 'running') throw new ServiceError('MEMSWEEP_NOT_RESUMABLE', { id, status: record.status }, { extensions: { sweepId: id } })
    request.log.info({ sweepId: id }, 'sweep resumed')
    return reply.code(202).header('location', sweepPath(id)).header('retry-after', '2').send(detail(record))
  })
}
