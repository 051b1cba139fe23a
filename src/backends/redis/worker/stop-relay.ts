/**
 * Stops running chunks of sweeps that ended (canceled, or failed elsewhere). A chunk runs
 * synchronously in a sandbox thread, so the relay reaches it through the shared-memory stop
 * board (stop-board.ts), and through BullMQ's cancelJob for the job's AbortSignal. Stop
 * requests arrive on the stop channel; a slow poll of the statuses of sweeps with running
 * chunks covers messages lost while the subscriber reconnected.
 */
import type { Redis } from 'ioredis'
import type { Logger } from 'pino'
import type { SweepStatus } from '../../../sweep/index.js'
import type { KeyLayout } from '../keys.js'
import type { RedisSweepStore } from '../store.js'
import type { StopBoardWriter } from './stop-board.js'

/** Chunk jobs this process runs now, by sweep. */
export class RunningChunks {
  readonly #sweepOf = new Map<string, string>()

  get size (): number { return this.#sweepOf.size }

  add (jobId: string, sweepId: string): void { this.#sweepOf.set(jobId, sweepId) }
  remove (jobId: string): void { this.#sweepOf.delete(jobId) }
  hasSweep (sweepId: string): boolean { return [...this.#sweepOf.values()].includes(sweepId) }
  jobsOf (sweepId: string): string[] { return [...this.#sweepOf].filter(([, id]) => id === sweepId).map(([jobId]) => jobId) }
  sweeps (): string[] { return [...new Set(this.#sweepOf.values())] }
}

export interface StopRelayDeps {
  subscriber: Redis
  keys: KeyLayout
  store: RedisSweepStore
  board: StopBoardWriter
  running: RunningChunks
  /** BullMQ's cancel of one of this process's active jobs. */
  cancelJob: (jobId: string, reason: string) => void
  logger: Logger
  pollMs: number
  /** Runs after each status poll (the worker checks Redis's epoch there). */
  afterPoll?: () => Promise<unknown>
}

export class StopRelay {
  readonly #deps: StopRelayDeps
  #poll: NodeJS.Timeout | null = null

  constructor (deps: StopRelayDeps) {
    this.#deps = deps
  }

  async start (): Promise<void> {
    const { subscriber, keys } = this.#deps
    subscriber.on('message', (channel: string, sweepId: string) => {
      if (channel === keys.stopChannel) this.stop(sweepId, 'sweep was canceled or failed')
    })
    await subscriber.subscribe(keys.stopChannel)
    this.#poll = setInterval(() => {
      this.#pollStatuses().then(() => this.#deps.afterPoll?.())
        .catch((err: unknown) => this.#deps.logger.warn({ err }, 'cannot poll sweep statuses'))
    }, this.#deps.pollMs)
  }

  stop (sweepId: string, why: string): void {
    const { running, board, cancelJob, logger } = this.#deps
    if (!running.hasSweep(sweepId)) return
    board.postStop(sweepId)
    for (const jobId of running.jobsOf(sweepId)) cancelJob(jobId, why)
    logger.info({ sweepId }, `stopping running chunks: ${why}`)
  }

  close (): void {
    if (this.#poll !== null) clearInterval(this.#poll)
    this.#poll = null
  }

  async #pollStatuses (): Promise<void> {
    for (const sweepId of this.#deps.running.sweeps()) {
      const status: SweepStatus | null = await this.#deps.store.status(sweepId)
      if (status === null) this.stop(sweepId, 'sweep is gone')
      else if (status === 'canceled' || status === 'failed') this.stop(sweepId, `sweep is ${status}`)
    }
  }
}
