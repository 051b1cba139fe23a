/**
 * Progress of running chunks, from sandbox threads to the sweep record: a sandbox posts
 * `{ chunk, trialsDone }` through BullMQ's job progress (the message does not wait for the
 * thread's blocked event loop); the worker process stores it (a high-water mark, see
 * REPORT_PROGRESS) and hints listeners. A report that finds the sweep ended stops its chunks.
 */
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import { isTerminal } from '../../../sweep/index.js'
import { publishSweepEvent } from '../events.js'
import type { KeyLayout } from '../keys.js'
import type { RedisSweepStore } from '../store.js'

export interface ChunkProgressReport {
  chunk: number
  trialsDone: number
}

export function isProgressReport (value: unknown): value is ChunkProgressReport {
  const report = value as Partial<ChunkProgressReport> | null
  return typeof report?.chunk === 'number' && typeof report.trialsDone === 'number'
}

/**
 * A sandbox gives a chunk back to the queue unrun or unfinished (BullMQ emits no event for a
 * job moved back to wait): out of time before the worker's limit, or told to stop (shutdown,
 * or a stop meant for an earlier run of a resumed sweep). Posted like progress, just before.
 */
export interface HandBackNotice {
  chunk: number
  handedBack: 'out-of-time' | 'stopped'
}

export function isHandBackNotice (value: unknown): value is HandBackNotice {
  const notice = value as Partial<HandBackNotice> | null
  return typeof notice?.chunk === 'number' && (notice.handedBack === 'out-of-time' || notice.handedBack === 'stopped')
}

export async function storeProgress (
  deps: { redis: Redis, keys: KeyLayout, store: RedisSweepStore, logger: Logger, stop: (sweepId: string, why: string) => void },
  sweepId: string,
  report: ChunkProgressReport
): Promise<void> {
  try {
    const status = await deps.store.reportProgress(sweepId, report.chunk, report.trialsDone, Date.now())
    if (status === 'running') await publishSweepEvent(deps.redis, deps.keys, sweepId, 'progress')
    else if (status === null || isTerminal(status)) deps.stop(sweepId, `sweep is ${status ?? 'gone'}`)
  } catch (err) {
    deps.logger.warn({ err, sweepId }, 'cannot store chunk progress')
  }
}
