/**
 * Prometheus metrics (prom-client): process defaults, an HTTP request-duration histogram,
 * sweeps by status and chunks waiting/active (read from the queue port at scrape time),
 * and open event streams. Each app has its own registry, so several apps in one process
 * (tests) never share counters.
 * @see https://github.com/siimots/prom-client
 */
import type { FastifyInstance } from 'fastify'
import fp from 'fastify-plugin'
import { Gauge, Histogram, Registry, collectDefaultMetrics } from 'prom-client'
import { SWEEP_STATUSES, type SweepQueue } from '../../backends/port.js'

declare module 'fastify' {
  interface FastifyInstance {
    metrics: { registry: Registry, openStreams: Gauge }
  }
}

export interface MetricsOptions {
  queue: SweepQueue
}

async function metrics (app: FastifyInstance, options: MetricsOptions): Promise<void> {
  const registry = new Registry()
  collectDefaultMetrics({ register: registry, prefix: 'memsweep_' })

  const queue = options.queue
  new Gauge({ // eslint-disable-line no-new -- registered with the registry, read at scrape time
    name: 'memsweep_sweeps',
    help: 'Sweeps known to the queue backend, by status.',
    labelNames: ['status'],
    registers: [registry],
    async collect () {
      const stats = await queue.stats()
      for (const status of SWEEP_STATUSES) this.set({ status }, stats[status])
      chunksWaiting.set(stats.chunksWaiting)
      chunksActive.set(stats.chunksActive)
    }
  })
  const chunksWaiting = new Gauge({ name: 'memsweep_chunks_waiting', help: 'Chunks of trials waiting for a worker.', registers: [registry] })
  const chunksActive = new Gauge({ name: 'memsweep_chunks_active', help: 'Chunks of trials being computed now.', registers: [registry] })
  const openStreams = new Gauge({ name: 'memsweep_event_streams_open', help: 'Server-Sent Event streams open now.', registers: [registry] })
  const duration = new Histogram({
    name: 'memsweep_http_request_duration_seconds',
    help: 'Time from request arrival to response, by route template.',
    labelNames: ['method', 'route', 'status_code'],
    buckets: [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10],
    registers: [registry]
  })

  app.decorate('metrics', { registry, openStreams })
  app.addHook('onResponse', async (request, reply) => {
    // The template, not the URL, keeps label cardinality bounded (ids never become labels).
    const route = request.routeOptions.url ?? 'unmatched'
    duration.observe({ method: request.method, route, status_code: String(reply.statusCode) }, reply.elapsedTime / 1000)
  })
}

export const metricsPlugin = fp(metrics, { name: 'memsweep-metrics', fastify: '5.x' })
