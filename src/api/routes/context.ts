/** What the route plugins share: the queue port, the limits and per-owner bookkeeping. */
import type { FastifySchemaCompiler } from 'fastify'
import { validatorCompiler } from 'fastify-type-provider-zod'
import type { SweepQueue, SweepRecord } from '../../backends/port.js'
import { ServiceError } from '../../errors.js'
import type { WorkLimits } from '../../spec/index.js'
import type { EventStreamRegistry } from '../event-stream.js'
import type { RenderPool } from '../render/render-pool.js'
import type { CallbackTargets } from '../callbacks/setup.js'
import { canSee } from '../plugins/auth.js'
import type { Principal } from '../tokens.js'
import { sweepPath } from '../presenters.js'

export interface RouteContext {
  queue: SweepQueue
  limits: WorkLimits
  maxActiveSweepsPerOwner: number
  heartbeatMs: number
  streams: EventStreamRegistry
  /** Renders results and figures on a thread of its own. */
  render: RenderPool
  /** Completion callbacks: the target guard and the owners' secrets. */
  callbacks: CallbackTargets
}

/** The record of a sweep the caller may see; anything else is a 404 (never a 403, so ids reveal nothing). */
export async function visibleSweep (queue: SweepQueue, principal: Principal, id: string): Promise<SweepRecord> {
  const record = await queue.get(id)
  if (record === null || !canSee(principal, record.owner)) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
  return record
}

/** Refuses, with the problem that explains why, a sweep that has no result (yet). */
export function requireSucceeded (record: SweepRecord): void {
  const { id, status } = record
  if (status === 'queued' || status === 'running') {
    throw new ServiceError('MEMSWEEP_RESULTS_NOT_READY', { id, status }, {
      headers: { 'retry-after': '5', link: `<${sweepPath(id)}>; rel="monitor"` },
      extensions: { sweepId: id, retryAfter: 5 }
    })
  }
  if (status !== 'succeeded') throw new ServiceError('MEMSWEEP_RESULTS_UNAVAILABLE', { id, status }, { extensions: { sweepId: id } })
}

/** The record of a visible sweep that has its result. */
export async function succeededSweep (queue: SweepQueue, principal: Principal, id: string): Promise<SweepRecord> {
  const record = await visibleSweep(queue, principal, id)
  requireSucceeded(record)
  return record
}

/**
 * Validates querystring, params and headers with zod but passes a spec body through
 * untouched: the spec layer's normaliseSpec is the one place that judges a spec, so its
 * field paths and cross-field rules are what the client sees.
 */
export const specBodyValidator: FastifySchemaCompiler<unknown> = (route) => {
  if (route.httpPart === 'body') return (data: unknown) => ({ value: data })
  return validatorCompiler(route as Parameters<typeof validatorCompiler>[0])
}
