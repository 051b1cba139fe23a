/** Results of a succeeded sweep as JSON or CSV, with strong ETags (a result never changes). */
import { z } from 'zod'
import type { FastifyReply } from 'fastify'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { ServiceError } from '../../errors.js'
import { RESULT_SERIES, TRAJECTORY_PADDING, trajectoryUnavailable } from '../../results/index.js'
import { negotiate } from '../negotiate.js'
import { fieldIssue, listedIssues } from '../problem-reply.js'
import { ifNoneMatchHits } from '../presenters.js'
import { problemResponses } from '../schemas/problem.js'
import { sweepResultSchema, trajectorySeriesSchema } from '../schemas/result.js'
import { sweepIdSchema } from '../schemas/sweep.js'
import { requireSucceeded, visibleSweep, type RouteContext } from './context.js'

const MEDIA = { json: 'application/json', csv: 'text/csv', arrow: 'application/vnd.apache.arrow.file' } as const

/**
 * Most per-trial rows one download may hold. A result is rendered as one string, and about
 * 250 bytes a trial in JSON would pass V8's string-length ceiling (~512 MiB) near 2 million.
 */
export const MAX_TRIAL_ROWS = 1_000_000
type Format = keyof typeof MEDIA

const resultsQuery = z.object({
  format: z.enum(['json', 'csv', 'arrow']).optional().describe('Overrides the Accept header. arrow: an Apache Arrow IPC file (application/vnd.apache.arrow.file) with the CSV\'s columns, typed (int64 counts, float64 measures, utf8 names, bool flags; empty cells are nulls).'),
  trials: z.enum(['true', 'false']).optional().describe('true: one record per trial (JSON: a `trials` member; CSV and Arrow: one row per trial). Default: false (one row per grid point).'),
  timing: z.enum(['true', 'false']).optional().describe('JSON only. true: include the run timing (wallSeconds, cpuSeconds, workers) in the provenance. Default false, so the bytes depend on the spec and the code only.'),
  partial: z.enum(['true', 'false']).optional().describe('true: for a sweep that has not succeeded (running, canceled, failed), the rows of the points finished so far, marked as partial (JSON: a `partial` member; CSV: the header `Memsweep-Partial: <points done>/<points>` and a file name ending in -partial). A succeeded sweep answers its full result. Not with trials=true.'),
  series: z.enum(RESULT_SERIES).optional().describe(`Another series instead of the rows. trajectory: the mean overlap (and energy) trajectory of every grid point with its spread, as long-format CSV (one row per point and sweep: point, the varied parameters, neurons, patterns, alpha, sweep, running, overlap.mean|sd|se, energy.mean|sd|se) or JSON ({ specHash, series, padding, points: [{ point, values, params, overlap, energy }] }); needs measures.overlapTrajectory or energyTrajectory in the spec (else 400 naming \`series\`); not with trials=true. ${TRAJECTORY_PADDING}`)
})

interface Rendered { body: Buffer, etag: string }

/**
 * Rendered results, newest last. Results are immutable, so an entry never goes stale; the
 * cache only saves re-encoding for repeated downloads and 304 checks.
 */
class RenderedCache {
  readonly #entries = new Map<string, Rendered>()
  #bytes = 0

  constructor (readonly maxBytes: number) {}

  get (key: string): Rendered | undefined {
    const hit = this.#entries.get(key)
    if (hit !== undefined) { this.#entries.delete(key); this.#entries.set(key, hit) }
    return hit
  }

  set (key: string, value: Rendered): void {
    if (value.body.length > this.maxBytes / 4) return
    this.#entries.set(key, value)
    this.#bytes += value.body.length
    for (const [oldKey, old] of this.#entries) {
      if (this.#bytes <= this.maxBytes) break
      this.#entries.delete(oldKey)
      this.#bytes -= old.body.length
    }
  }
}

/** Ready-made bytes skip the response serializer (and its typing): they are the representation. */
function sendBytes (reply: FastifyReply, body: Buffer): FastifyReply {
  return reply.send(body)
}

function seriesProblem (message: string): ServiceError {
  return new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: `invalid query parameter series: ${message}` }, { extensions: listedIssues([{ ...fieldIssue(['series'], message), path: 'querystring.series' }]) })
}

export const resultRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  const cache = new RenderedCache(64 * 1024 * 1024)

  app.get('/v1/sweeps/:id/results', {
    schema: {
      operationId: 'getSweepResults',
      summary: 'Results of a succeeded sweep (JSON, CSV or Apache Arrow)',
      description: 'JSON by default; CSV with `Accept: text/csv` or `?format=csv`; an Apache Arrow IPC file with `Accept: application/vnd.apache.arrow.file` or `?format=arrow` (the CSV\'s table with typed columns; docs/data-dictionary.md lists every column). Every CSV and Arrow row starts with sweepId, specHash, seed, the point and every model parameter, varied or fixed, in one column order. One row per grid point with the varied parameters, aggregated measures with uncertainties and the theory values that apply; `?trials=true` for per-trial rows; `?series=trajectory` for the mean trajectories per point (long-format CSV, or JSON). An analysis (threshold search) gives `searches` (and `scaling` when asked for) in JSON; its CSV has one row per search, or with `?trials=true` one row per evaluated step (searches keep per-step summaries, not per-trial records; scaling fits are JSON-only). A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 422 (limit maxTrialRows) for per-trial rows of sweeps over a million trials.',
      tags: ['sweeps'],
      params: z.object({ id: sweepIdSchema }),
      querystring: resultsQuery,
      response: {
        200: {
          description: 'The results.',
          content: {
            'application/json': { schema: z.union([sweepResultSchema, trajectorySeriesSchema]).describe('The result (SweepResult), or with ?series=trajectory the trajectory series (TrajectorySeries).') },
            'text/csv': { schema: z.string().describe('RFC 4180 CSV with a header row; CRLF line ends.') },
            'application/vnd.apache.arrow.file': { schema: z.string().describe('Apache Arrow IPC file (binary): the CSV\'s columns, typed; the schema metadata holds memsweep.specHash.') }
          }
        },
        304: z.undefined().describe('Not modified: the ETag in If-None-Match is current.'),
        ...problemResponses(400, 401, 404, 406, 409, 422, 429)
      }
    }
  }, async (request, reply) => {
    const { id } = request.params
    const record = await visibleSweep(ctx.queue, request.principal, id)
    let format: Format | null = request.query.format ?? null
    if (format === null) {
      const media = negotiate(request.headers.accept, [MEDIA.json, MEDIA.csv, MEDIA.arrow])
      if (media === null) {
        throw new ServiceError('MEMSWEEP_NOT_ACCEPTABLE', { accept: request.headers.accept ?? '', available: `${MEDIA.json}, ${MEDIA.csv}, ${MEDIA.arrow}` })
      }
      format = media === MEDIA.csv ? 'csv' : media === MEDIA.arrow ? 'arrow' : 'json'
    }
    // Known from submission on, so refused before the sweep even finishes.
    const perTrial = request.query.trials === 'true'
    if (perTrial && record.progress.trialsTotal > MAX_TRIAL_ROWS) {
      throw new ServiceError('MEMSWEEP_WORK_LIMIT_EXCEEDED', { limit: 'maxTrialRows', value: record.progress.trialsTotal, max: MAX_TRIAL_ROWS }, {
        extensions: { limit: { name: 'maxTrialRows', value: record.progress.trialsTotal, max: MAX_TRIAL_ROWS } }
      })
    }
    const partial = request.query.partial === 'true' && record.status !== 'succeeded'
    if (partial) {
      if (perTrial) throw new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: 'partial results hold rows only: leave out trials=true' }, { extensions: { errors: [{ path: 'querystring.trials', message: 'not with partial=true' }] } })
      return await sendPartial(id, format)
    }
    requireSucceeded(record)
    const timing = request.query.timing === 'true'
    const series = request.query.series ?? null
    if (series !== null && perTrial) throw seriesProblem('a series replaces the rows, so it cannot be combined with trials=true')
    const key = `${id}\u0000${format}\u0000${perTrial ? 1 : 0}\u0000${timing ? 1 : 0}\u0000${series ?? ''}`
    let rendered = cache.get(key)
    if (rendered === undefined) {
      if (series !== null) {
        const missing = trajectoryUnavailable(record.spec)
        if (missing !== null) throw seriesProblem(missing)
      }
      const stored = await ctx.queue.encodedResult(id, { trials: perTrial })
      if (stored === null) throw new Error(`sweep ${id} succeeded but the backend has no result for it`)
      // Decoding, rendering and hashing happen on the rendering thread: other requests go on meanwhile.
      const outcome = await ctx.render.render({ kind: 'result', sweepId: id, source: { kind: 'result', stored }, format, perTrial, timing, series })
      if (outcome.kind !== 'rendered') throw new Error(`rendering sweep ${id} answered ${outcome.kind}`)
      rendered = { body: Buffer.from(outcome.body.buffer, outcome.body.byteOffset, outcome.body.byteLength), etag: outcome.etag }
      cache.set(key, rendered)
    }
    reply
      .header('etag', rendered.etag)
      .header('vary', 'Accept')
      .header('cache-control', 'private, max-age=86400, immutable')
    if (ifNoneMatchHits(request.headers['if-none-match'], rendered.etag)) return reply.code(304).send()
    return sendAs(format, `memsweep-${id}${perTrial ? '-trials' : ''}${series !== null ? `-${series}` : ''}`, rendered.body)

    /** The bytes with their media type; CSV and Arrow as attachments named `base`.csv|.arrow. */
    function sendAs (as: Format, base: string, body: Buffer): FastifyReply {
      if (as === 'json') return sendBytes(reply.type('application/json; charset=utf-8'), body)
      reply.header('content-disposition', `attachment; filename="${base}.${as}"`)
      return sendBytes(reply.type(as === 'csv' ? 'text/csv; charset=utf-8; header=present' : MEDIA.arrow), body)
    }

    /** The finished points of an unfinished sweep: rendered afresh each time (they change), never cached. */
    async function sendPartial (sweepId: string, as: Format): Promise<FastifyReply> {
      const progress = await ctx.queue.storedProgress(sweepId)
      if (progress === null) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id: sweepId })
      const outcome = await ctx.render.render({ kind: 'result', sweepId, source: { kind: 'partial', progress }, format: as, perTrial: false, timing: false, series: null })
      if (outcome.kind !== 'rendered') throw new Error(`rendering sweep ${sweepId} answered ${outcome.kind}`)
      const body = Buffer.from(outcome.body.buffer, outcome.body.byteOffset, outcome.body.byteLength)
      const done = new Set(progress.chunks.map((chunk) => chunk.index))
      const points = new Set(progress.plan.map((chunk) => chunk.point))
      const open = new Set(progress.openPoints)
      const finished = [...points].filter((point) => !open.has(point) && progress.plan.every((chunk) => chunk.point !== point || done.has(chunk.index))).length
      reply.header('cache-control', 'no-store').header('memsweep-partial', `${finished}/${points.size}`)
      return sendAs(as, `memsweep-${sweepId}-partial`, body)
    }
  })
}
