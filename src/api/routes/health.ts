/** Liveness, readiness, metrics and the OpenAPI document. */
import { z } from 'zod'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import type { SweepQueue } from '../../backends/port.js'
import { ServiceError } from '../../errors.js'
import { problemResponses } from '../schemas/problem.js'
import { sendProblem } from '../problem-reply.js'
import { requireAdmin } from '../plugins/auth.js'

export interface HealthRoutesOptions {
  queue: SweepQueue
}

const liveSchema = z.object({ status: z.literal('ok') }).meta({ id: 'Liveness' })
const readySchema = z.object({
  status: z.literal('ready'),
  backend: z.enum(['embedded', 'redis'])
}).meta({ id: 'Readiness' })

export const healthRoutes: FastifyPluginAsyncZod<HealthRoutesOptions> = async (app, { queue }) => {
  app.get('/healthz', {
    config: { public: true, rateLimit: false },
    schema: {
      operationId: 'getLiveness',
      summary: 'Liveness: the process answers',
      description: 'Checks nothing else (no storage, no Redis), so an outage of a dependency never gets a healthy process restarted.',
      tags: ['operations'],
      security: [],
      response: { 200: liveSchema.describe('The process is up.'), ...problemResponses(503) }
    }
  }, async () => ({ status: 'ok' as const }))

  app.get('/readyz', {
    config: { public: true, rateLimit: false },
    schema: {
      operationId: 'getReadiness',
      summary: 'Readiness: storage and queue connections answer',
      tags: ['operations'],
      security: [],
      response: { 200: readySchema.describe('Ready to take requests.'), ...problemResponses() }
    }
  }, async (request, reply) => {
    let state: { ok: boolean, detail?: string }
    try {
      state = await queue.ready()
    } catch (error) {
      request.log.warn({ err: error }, 'readiness check threw')
      state = { ok: false, detail: 'the queue backend did not answer' }
    }
    if (!state.ok) {
      return sendProblem(reply.header('retry-after', '5'), new ServiceError('MEMSWEEP_NOT_READY', { reason: state.detail ?? 'the queue backend is not ready' }))
    }
    return { status: 'ready' as const, backend: queue.kind }
  })

  app.get('/metrics', {
    config: { rateLimit: false },
    schema: {
      operationId: 'getMetrics',
      summary: 'Prometheus metrics (text exposition format)',
      description: 'Sweeps by status count every owner\'s sweeps, so on a server with tokens only an admin token may read them (others get 403); give the scraper an admin token.',
      tags: ['operations'],
      response: {
        200: { description: 'Metrics in the Prometheus text format 0.0.4.', content: { 'text/plain': { schema: z.string() } } },
        ...problemResponses(401, 403, 429)
      }
    }
  }, async (request, reply) => {
    requireAdmin(request.principal, 'read the service metrics')
    const registry = app.metrics.registry
    const text = await registry.metrics()
    return reply.type(registry.contentType).send(text)
  })

  app.get('/openapi.json', {
    schema: {
      operationId: 'getOpenApiDocument',
      summary: 'This API\'s OpenAPI 3.1 document',
      tags: ['operations'],
      response: {
        200: { description: 'The OpenAPI document (the same as openapi/openapi.json in the repository).', content: { 'application/json': { schema: z.record(z.string(), z.unknown()) } } },
        ...problemResponses(401, 429)
      }
    }
  }, async () => app.swagger() as Record<string, unknown>)
}
