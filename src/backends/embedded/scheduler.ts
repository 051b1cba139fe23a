/**
 * Hands chunks of active sweeps to free compute threads, records every finished chunk,
 * retries chunks that failed for system reasons, and assembles a sweep once its last
 * chunk is stored. Runs on the main thread and does no numerical work itself.
 */
import type { Logger } from 'pino'
import type { SweepFailure, SweepRecord } from '../port.js'
import type { ChunkTaskOutcome } from '../shared/chunk-task.js'
import { systemFailureMessage } from '../shared/failure.js'
import { ActiveSweep } from './active-sweep.js'
import type { SweepEventHub } from './event-hub.js'
import { FairOrder } from './fair-order.js'
import type { SweepStore } from './store.js'
import type { ChunkThreadPool } from './thread-pool.js'
import { embeddedProvenance } from './provenance.js'

export interface SchedulerOptions {
  /** Tries per chunk (and per assembly) before a system failure fails the sweep. */
  maxAttempts: number
  progressIntervalMs: number
}

export class ChunkScheduler {
  readonly #store: SweepStore
  readonly #pool: ChunkThreadPool
  readonly #events: SweepEventHub
  readonly #logger: Logger | undefined
  readonly #options: SchedulerOptions
  readonly #active = new Map<string, ActiveSweep>()
  readonly #order = new FairOrder()
  readonly #inFlight = new Set<Promise<void>>()
  #closing = false

  constructor (deps: { store: SweepStore, pool: ChunkThreadPool, events: SweepEventHub, logger?: Logger, options: SchedulerOptions }) {
    this.#store = deps.store
    this.#pool = deps.pool
    this.#events = deps.events
    this.#logger = deps.logger
    this.#options = deps.options
  }

  add (sweep: ActiveSweep): void {
    this.#active.set(sweep.id, sweep)
    this.#pump()
  }

  /** Trials of a sweep's running chunks, not yet stored. */
  runningTrials (id: string): number {
    return this.#active.get(id)?.runningTrials ?? 0
  }

  counts (): { chunksWaiting: number, chunksActive: number } {
    let chunksWaiting = 0
    for (const sweep of this.#active.values()) chunksWaiting += sweep.pendingCount
    return { chunksWaiting, chunksActive: this.#pool.busy }
  }

  /** Stops an active sweep for good; its running chunks notice between two trials. */
  cancel (id: string): boolean {
    const sweep = this.#active.get(id)
    const changed = this.#store.finishUnsuccessfully(id, 'canceled', null, Date.now())
    if (sweep !== undefined) this.#retire(sweep)
    if (changed) this.#emitState(id)
    return changed
  }

  /**
   * Stops dispatching and asks running chunks to stop, then waits (bounded) for them. The
   * sweeps stay queued or running in storage, to be resumed by the next start.
   */
  async close (graceMs: number): Promise<void> {
    this.#closing = true
    for (const sweep of this.#active.values()) Atomics.store(new Int32Array(sweep.stopFlag), 0, 1)
    const settled = Promise.allSettled([...this.#inFlight])
    let timer: NodeJS.Timeout | undefined
    const timeout = new Promise<void>(resolve => { timer = setTimeout(resolve, graceMs) })
    await Promise.race([settled, timeout])
    clearTimeout(timer)
    this.#active.clear()
  }

  #pump (): void {
    while (!this.#closing && this.#pool.idle > 0) {
      const assembling = [...this.#active.values()].find(sweep => sweep.allDone && !sweep.assembling)
      if (assembling !== undefined) {
        this.#assemble(assembling)
        continue
      }
      const sweep = this.#order.pick([...this.#active.values()].filter(candidate => candidate.hasPending))
      if (sweep === undefined) return
      this.#order.served(sweep.ownerKey)
      this.#dispatch(sweep)
    }
  }

  #dispatch (sweep: ActiveSweep): void {
    const next = sweep.takeNext()
    if (next === undefined) return
    if (!sweep.started) this.#markStarted(sweep)
    const { chunk, attempt } = next
    const task = this.#pool.runChunk(
      { kind: 'run', spec: sweep.spec, chunk, attempt, stopFlag: sweep.stopFlag, progressIntervalMs: Math.min(100, this.#options.progressIntervalMs) },
      message => {
        if (this.#active.get(sweep.id) !== sweep) return
        sweep.reportTrials(chunk.index, message.trialsDone)
        this.#events.progress(sweep.id)
      }
    )
    this.#track(task.then(
      outcome => this.#onChunkOutcome(sweep, chunk.index, chunk.point, attempt, outcome),
      (error: unknown) => this.#onChunkOutcome(sweep, chunk.index, chunk.point, attempt, threadCrash(error))
    ))
  }

  #onChunkOutcome (sweep: ActiveSweep, index: number, point: number, attempt: number, outcome: ChunkTaskOutcome): void {
    if (this.#closing) return
    if (this.#active.get(sweep.id) !== sweep) {
      sweep.drop(index)
      return this.#pump()
    }
    const log = this.#logger?.child({ sweepId: sweep.id, chunk: index, attempt })
    switch (outcome.kind) {
      case 'chunk-done':
        try {
          const chunk = { index, point, trials: outcome.trials, computeMs: outcome.computeMs, body: outcome.body }
          if (this.#store.commitChunk(sweep.id, chunk, sweep.pointsCompletedBy(index), Date.now())) {
            sweep.finish(index)
            this.#events.progress(sweep.id)
          } else {
            sweep.drop(index)
          }
        } catch (error) {
          log?.error({ err: error }, 'storing a finished chunk failed')
          this.#retryOrFail(sweep, index, attempt, 'the result could not be stored')
        }
        break
      case 'stopped':
        // Only a canceled or closing sweep sets the flag, and both are handled above.
        sweep.drop(index)
        break
      case 'failed':
        if (outcome.error.kind === 'user') {
          log?.info({ error: outcome.error }, 'chunk refused by the engine')
          this.#fail(sweep, { kind: 'user', message: outcome.error.message })
        } else {
          log?.error({ error: outcome.error }, 'chunk failed')
          this.#retryOrFail(sweep, index, attempt, publicCause(outcome.error.name))
        }
        break
      default:
        log?.error({ outcome: outcome.kind }, 'unexpected answer from a compute thread')
        this.#retryOrFail(sweep, index, attempt, 'the compute thread answered unexpectedly')
    }
    this.#pump()
  }

  #retryOrFail (sweep: ActiveSweep, index: number, attempt: number, cause: string): void {
    if (attempt < this.#options.maxAttempts) {
      sweep.requeue(index)
      return
    }
    sweep.drop(index)
    this.#fail(sweep, { kind: 'system', message: systemFailureMessage(index, sweep.plan.length, attempt, cause) })
  }

  #assemble (sweep: ActiveSweep, attempt = 1): void {
    sweep.assembling = true
    let task: Promise<ChunkTaskOutcome>
    try {
      const stored = this.#store.chunkBodies(sweep.id)
      const provenance = embeddedProvenance(sweep.spec, { startedMs: sweep.startedMs ?? Date.now(), finishedMs: Date.now(), computeMs: stored.computeMs, threads: this.#pool.threads })
      task = this.#pool.assemble({ kind: 'assemble', spec: sweep.spec, chunks: stored.bodies, provenance })
    } catch (error) {
      this.#logger?.error({ err: error, sweepId: sweep.id }, 'reading chunk results for assembly failed')
      task = Promise.resolve({ kind: 'failed', error: { kind: 'system', name: 'StorageError', message: 'storage error' } })
    }
    this.#track(task.then(
      outcome => this.#onAssembled(sweep, attempt, outcome),
      (error: unknown) => this.#onAssembled(sweep, attempt, threadCrash(error))
    ))
  }

  #onAssembled (sweep: ActiveSweep, attempt: number, outcome: ChunkTaskOutcome): void {
    if (this.#closing || this.#active.get(sweep.id) !== sweep) return this.#pump()
    if (outcome.kind === 'assembled') {
      try {
        if (this.#store.completeSweep(sweep.id, outcome.body, Date.now())) this.#emitState(sweep.id)
        this.#retire(sweep)
      } catch (error) {
        this.#logger?.error({ err: error, sweepId: sweep.id }, 'storing the assembled result failed')
        this.#assemblyRetryOrFail(sweep, attempt, 'the result could not be stored')
      }
    } else if (outcome.kind === 'failed' && outcome.error.kind === 'user') {
      this.#fail(sweep, { kind: 'user', message: outcome.error.message })
    } else {
      this.#logger?.error({ sweepId: sweep.id, outcome }, 'assembling a sweep failed')
      this.#assemblyRetryOrFail(sweep, attempt, 'the result could not be assembled')
    }
    this.#pump()
  }

  #assemblyRetryOrFail (sweep: ActiveSweep, attempt: number, cause: string): void {
    if (attempt < this.#options.maxAttempts) {
      this.#assemble(sweep, attempt + 1)
      return
    }
    this.#fail(sweep, {
      kind: 'system',
      message: `The finished chunks could not be assembled after ${attempt} attempts (${cause}). The service log has the details.`
    })
  }

  #markStarted (sweep: ActiveSweep): void {
    const now = Date.now()
    sweep.started = true
    sweep.startedMs = now
    if (this.#store.markRunning(sweep.id, now)) this.#emitState(sweep.id)
  }

  #fail (sweep: ActiveSweep, failure: SweepFailure): void {
    const changed = this.#store.finishUnsuccessfully(sweep.id, 'failed', failure, Date.now())
    this.#retire(sweep)
    if (changed) this.#emitState(sweep.id)
  }

  #retire (sweep: ActiveSweep): void {
    sweep.requestStop()
    this.#active.delete(sweep.id)
    this.#events.settle(sweep.id)
    this.#order.retainOnly(new Set([...this.#active.values()].map(active => active.ownerKey)))
  }

  #emitState (id: string): void {
    const record: SweepRecord | null = this.#store.get(id)
    if (record !== null) this.#events.state(record)
  }

  #track (work: Promise<void>): void {
    const tracked = work.catch((error: unknown) => {
      this.#logger?.error({ err: error }, 'scheduler bookkeeping failed')
    }).finally(() => this.#inFlight.delete(tracked))
    this.#inFlight.add(tracked)
  }
}

const THREAD_CRASH = 'ThreadCrash'
const THREAD_OUT_OF_MEMORY = 'ThreadOutOfMemory'

/** A rejected task: the thread died (exit, uncaught error, heap limit) instead of answering. */
function threadCrash (error: unknown): ChunkTaskOutcome {
  const outOfMemory = (error as { code?: unknown } | null)?.code === 'ERR_WORKER_OUT_OF_MEMORY'
  const message = error instanceof Error ? (error.message.split('\n', 1)[0] ?? '') : String(error)
  return { kind: 'failed', error: { kind: 'system', name: outOfMemory ? THREAD_OUT_OF_MEMORY : THREAD_CRASH, message } }
}

/** What a status body may say about a system failure: a category, never internals. */
function publicCause (errorName: string): string {
  if (errorName === THREAD_OUT_OF_MEMORY) return 'the compute thread ran out of memory'
  if (errorName === THREAD_CRASH) return 'the compute thread stopped unexpectedly'
  return 'an internal error'
}
