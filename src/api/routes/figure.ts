/**
 * A figure of a succeeded sweep's results, drawn by src/figures as a standalone SVG. The
 * query is the figure options schema itself, so the OpenAPI document lists every option;
 * options that do not fit this sweep (an x it does not vary, …) are 400s naming the field.
 */
import { createHash } from 'node:crypto'
import { z } from 'zod'
import type { FastifyReply } from 'fastify'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { ServiceError } from '../../errors.js'
import { FigureOptionsError, FigureOptionsSchema, renderFigure } from '../../figures/index.js'
import { ifNoneMatchHits, sweepPath } from '../presenters.js'
import { fieldIssue } from '../problem-reply.js'
import { problemResponses } from '../schemas/problem.js'
import { sweepIdSchema } from '../schemas/sweep.js'
import { visibleSweep, type RouteContext } from './context.js'

interface Rendered { body: Buffer, etag: string }

/** Rendered figures kept, newest last: a page that redraws on every control change asks for the same few often. */
const CACHED_FIGURES = 128

/** A figure is a document of its own: nothing in it may run or load anything. */
const SVG_POLICY = "default-src 'none'; style-src 'unsafe-inline'"

function sendBytes (reply: FastifyReply, body: Buffer): FastifyReply {
  return reply.send(body)
}

export const figureRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  const cache = new Map<string, Rendered>()

  app.get('/v1/sweeps/:id/figure.svg', {
    schema: {
      operationId: 'getSweepFigure',
      summary: 'A figure of a succeeded sweep (SVG)',
      description: 'A measure against one varied parameter, one series per value of the others, 95 % error bars, theory overlaid where it applies, legend; readable in black and white. Every point carries its numbers as data-x, data-y, data-low, data-high attributes. A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 400 naming the option when the options do not fit this sweep (for example an x it does not vary).',
      tags: ['sweeps'],
      params: z.object({ id: sweepIdSchema }),
      querystring: FigureOptionsSchema,
      response: {
        200: {
          description: 'The figure.',
          content: { 'image/svg+xml': { schema: z.string().describe('A standalone SVG document (UTF-8) with <title> and <desc>.') } }
        },
        304: z.undefined().describe('Not modified: the ETag in If-None-Match is current.'),
        ...problemResponses(400, 401, 404, 409, 429)
      }
    }
  }, async (request, reply) => {
    const { id } = request.params
    const record = await visibleSweep(ctx.queue, request.principal, id)
    if (record.status === 'queued' || record.status === 'running') {
      throw new ServiceError('MEMSWEEP_RESULTS_NOT_READY', { id, status: record.status }, {
        headers: { 'retry-after': '5', link: `<${sweepPath(id)}>; rel="monitor"` },
        extensions: { sweepId: id, retryAfter: 5 }
      })
    }
    if (record.status !== 'succeeded') {
      throw new ServiceError('MEMSWEEP_RESULTS_UNAVAILABLE', { id, status: record.status }, { extensions: { sweepId: id } })
    }
    const options = request.query
    const key = `${id}\u0000${JSON.stringify(Object.entries(options).sort(([a], [b]) => a.localeCompare(b)))}`
    let rendered = cache.get(key)
    if (rendered === undefined) {
      const result = await ctx.queue.results(id)
      if (result === null) throw new Error(`sweep ${id} succeeded but the backend has no result for it`)
      const body = Buffer.from(render(result, options), 'utf8')
      rendered = { body, etag: `"${createHash('sha256').update(body).digest('base64url')}"` }
      cache.set(key, rendered)
      if (cache.size > CACHED_FIGURES) cache.delete(cache.keys().next().value!)
    }
    reply
      .header('etag', rendered.etag)
      .header('cache-control', 'private, max-age=86400, immutable')
      .header('content-security-policy', SVG_POLICY)
      .header('x-content-type-options', 'nosniff')
    if (ifNoneMatchHits(request.headers['if-none-match'], rendered.etag)) return reply.code(304).send()
    reply.header('content-disposition', `inline; filename="memsweep-${id}-${options.measure}.svg"`)
    return sendBytes(reply.type('image/svg+xml; charset=utf-8'), rendered.body)
  })
}

function render (result: Parameters<typeof renderFigure>[0], options: z.output<typeof FigureOptionsSchema>): string {
  try {
    return renderFigure(result, options)
  } catch (error) {
    if (!(error instanceof FigureOptionsError)) throw error
    const errors = error.issues.map((issue) => ({
      ...fieldIssue(issue.path === '' ? [] : [issue.path], issue.message),
      path: issue.path === '' ? 'querystring' : `querystring.${issue.path}`
    }))
    throw new ServiceError('MEMSWEEP_MALFORMED_REQUEST', { reason: 'the figure options do not fit this sweep' }, { extensions: { errors } })
  }
}
