/** Submitting, validating, listing, reading and canceling sweeps. */
import { z } from 'zod'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { ServiceError } from '../../errors.js'
import { ActiveSweepCapError, ANY_OWNER, TERMINAL_STATUSES } from '../../backends/port.js'
import { SweepSpecSchema, checkLimits, estimateWork, normaliseSpec, specHash, WorkLimitError } from '../../spec/index.js'
import { requireAction, requireAdmin } from '../plugins/auth.js'
import { ifNoneMatchHits, presentSweep, sweepPath, sweepStateTag } from '../presenters.js'
import { problemResponses } from '../schemas/problem.js'
import { sweepDetailSchema, sweepIdSchema, sweepListSchema, sweepStatusEnum, workEstimateSchema } from '../schemas/sweep.js'
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
    .describe('true: if you already have a succeeded sweep with the same spec hash, the new sweep reuses its results at once instead of running again. Default: false (a fresh run).')
})

/** `owner=*` in a listing: every owner's sweeps. */
const EVERY_OWNER = '*'

const listQuery = z.object({
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
    let record
    try {
      // The backend checks the cap atomically with storing the sweep (across API instances too).
      record = await queue.submit({
        spec,
        owner: principal.owner,
        reuse: request.query.reuse === 'true',
        maxActive: ctx.maxActiveSweepsPerOwner,
        ...(idempotencyKey === undefined ? {} : { idempotencyKey })
      })
    } catch (error) {
      if (!(error instanceof ActiveSweepCapError)) throw error
      throw new ServiceError('MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS', { owner: ownerLabel(principal), active: error.active, max: error.max }, { headers: { 'retry-after': '30' }, extensions: { retryAfter: 30 } })
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
    const { owner: asked, status, limit, cursor } = request.query
    const principal = request.principal
    if (asked !== undefined && asked !== principal.owner) requireAdmin(principal, 'list other owners\' sweeps')
    const owner = asked === undefined ? principal.owner : asked === EVERY_OWNER ? ANY_OWNER : asked
    const page = await queue.list({ owner, limit, ...(status === undefined ? {} : { status }), ...(cursor === undefined ? {} : { cursor }) })
    if (page.nextCursor !== null) {
      const next = new URLSearchParams({ limit: String(limit), cursor: page.nextCursor })
      if (asked !== undefined) next.set('owner', asked)
      if (status !== undefined) next.set('status', status)
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
      summary: 'Cancel a sweep',
      description: 'Stops a queued or running sweep (running trials stop within about a second) and answers 202 with its record. A sweep that has already ended (succeeded, failed or canceled) cannot be canceled: 409 MEMSWEEP_SWEEP_FINISHED, and nothing changes. The request needs no body; one that is sent is read like any (JSON, within the body limit) and ignored.',
      tags: ['sweeps'],
      params: idParams,
      response: { 202: sweepDetailSchema.describe('Cancel requested: the sweep\'s record after the change.'), ...problemResponses(400, 401, 403, 404, 409, 413, 415, 429) }
    }
  }, async (request, reply) => {
    const principal = request.principal
    const { id } = request.params
    const before = await visibleSweep(queue, principal, id)
    requireAction(principal, 'cancel')
    const finished = (status: string): ServiceError => new ServiceError('MEMSWEEP_SWEEP_FINISHED', { id, status }, { extensions: { sweepId: id } })
    if (TERMINAL_STATUSES.has(before.status)) throw finished(before.status)
    const record = await queue.cancel(id)
    if (record === null) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
    // It may have ended on its own between the read and the cancel.
    if (record.status === 'succeeded' || record.status === 'failed') throw finished(record.status)
    request.log.info({ sweepId: record.id, status: record.status }, 'sweep cancel requested')
    return reply.code(202).send({ ...presentSweep(record), spec: record.spec as unknown as Record<string, unknown> })
  })
}
