/** Live progress of one sweep as Server-Sent Events. */
import { z } from 'zod'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { ServiceError } from '../../errors.js'
import { streamSweepEvents } from '../event-stream.js'
import { problemResponses } from '../schemas/problem.js'
import { sweepIdSchema } from '../schemas/sweep.js'
import { visibleSweep, type RouteContext } from './context.js'

const EVENT_STREAM_DESCRIPTION = [
  'A text/event-stream. Events, each with an increasing `id:`:',
  '- `snapshot` (first): the SweepStatus as GET /v1/sweeps/{id} returns it (without the spec);',
  '- `progress`: the SweepStatus after more trials finished (at most about 4 per second);',
  '- `state`: the SweepStatus after a change of status; after a terminal one (succeeded, failed, canceled) the server closes the stream.',
  'Every stream ends with that terminal `state` event: for a sweep that had already ended, the stream is its `snapshot`, then its `state`, then the close.',
  'Lines starting with `:` are heartbeats (`: ping`). A reconnecting client gets a fresh snapshot.'
].join('\n')

export const eventRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  app.get('/v1/sweeps/:id/events', {
    // A HEAD request would open a stream that never sends a body.
    exposeHeadRoute: false,
    schema: {
      operationId: 'streamSweepEvents',
      summary: 'Follow a sweep live (Server-Sent Events)',
      description: EVENT_STREAM_DESCRIPTION,
      tags: ['sweeps'],
      params: z.object({ id: sweepIdSchema }),
      response: {
        200: { description: EVENT_STREAM_DESCRIPTION, content: { 'text/event-stream': { schema: z.string() } } },
        ...problemResponses(400, 401, 404, 429, 503)
      }
    }
  }, async (request, reply) => {
    const id = request.params.id
    await visibleSweep(ctx.queue, request.principal, id)
    if (ctx.streams.closing) throw new ServiceError('MEMSWEEP_NOT_READY', { reason: 'the server is shutting down' })
    const gauge = app.metrics.openStreams
    const headers = reply.getHeaders() as Record<string, string | number | string[]>
    reply.hijack()
    await streamSweepEvents({
      queue: ctx.queue,
      id,
      raw: reply.raw,
      heartbeatMs: ctx.heartbeatMs,
      registry: ctx.streams,
      headers,
      onOpen: () => gauge.inc(),
      onClose: () => gauge.dec()
    })
  })
}
