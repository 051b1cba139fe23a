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
import { SWEEP_STATUSES, type QueueStats, type SweepQueue } from '../../backends/port.js'

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

  // The registry collects every metric at once, so each gauge reads the queue through one
  // shared, short-lived read: all of them show the same moment and the backend is asked once.
  const queue = options.queue
  let pending: { at: number, stats: Promise<QueueStats> } | null = null
  const stats = (): Promise<QueueStats> => {
    const now = Date.now()
    if (pending === null || now - pending.at > 250) pending = { at: now, stats: queue.stats() }
    return pending.stats
  }
  new Gauge({ // eslint-disable-line no-new -- registered with the registry, read at scrape time
    name: 'memsweep_sweeps',
    help: 'Sweeps known to the queue backend, by status.',
    labelNames: ['status'],
    registers: [registry],
    async collect () {
      const current = await stats()
      for (const status of SWEEP_STATUSES) this.set({ status }, current[status])
    }
  })
  new Gauge({ // eslint-disable-line no-new -- as above
    name: 'memsweep_chunks_waiting',
    help: 'Chunks of trials waiting for a worker.',
    registers: [registry],
    async collect () { this.set((await stats()).chunksWaiting) }
  })
  new Gauge({ // eslint-disable-line no-new -- as above
    name: 'memsweep_chunks_active',
    help: 'Chunks of trials being computed now.',
    registers: [registry],
    async collect () { this.set((await stats()).chunksActive) }
  })
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
