/**
 * Hands chunks of active sweeps to free compute threads, stores every finished chunk,
 * retries chunks that failed for system reasons, and assembles a sweep once every chunk of
 * its stored plan is stored. Runs on the main thread and does no numerical work itself;
 * what a chunk is, how it runs and how a result is assembled are the lifecycle's
 * (src/sweep).
 */
import type { Logger } from 'pino'
import {
  applyBlock, systemCauseOf, systemFailure, userFailure, THREAD_CRASH_ERROR_NAME, THREAD_OUT_OF_MEMORY_ERROR_NAME,
  type SweepFailure, type SystemCause
} from '../../sweep/index.js'
import { ActiveSweep } from './active-sweep.js'
import type { ChunkTaskOutcome } from './chunk-task.js'
import type { LocalSweepEvents } from './event-hub.js'
import { FairOrder } from './fair-order.js'
import type { SqliteSweepStore } from './store.js'
import type { ChunkThreadPool } from './thread-pool.js'

export interface SchedulerOptions {
  /** Tries per chunk (and per assembly) before a system failure fails the sweep. */
  maxAttempts: number
  progressIntervalMs: number
}

export class ChunkScheduler {
  readonly #store: SqliteSweepStore
  readonly #pool: ChunkThreadPool
  readonly #events: LocalSweepEvents
  readonly #logger: Logger | undefined
  readonly #options: SchedulerOptions
  readonly #active = new Map<string, ActiveSweep>()
  readonly #order = new FairOrder()
  readonly #inFlight = new Set<Promise<void>>()
  #closing = false
  #paused = false

  constructor (deps: { store: SqliteSweepStore, pool: ChunkThreadPool, events: LocalSweepEvents, logger?: Logger, options: SchedulerOptions }) {
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

  counts (): { chunksWaiting: number, chunksActive: number } {
    let chunksWaiting = 0
    for (const sweep of this.#active.values()) chunksWaiting += sweep.pendingCount
    return { chunksWaiting, chunksActive: this.#pool.busy }
  }

  /** Starts no more chunks or assemblies (storage lost); running ones finish. Until the process restarts. */
  pause (): void {
    this.#paused = true
  }

  /** Stops an active sweep for good; its running chunks notice between two trials. */
  cancel (id: string): boolean {
    const sweep = this.#active.get(id)
    const changed = this.#store.stopNow(id, 'canceled', null, Date.now()).changed
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
    const timeout = new Promise<void>((resolve) => { timer = setTimeout(resolve, graceMs) })
    await Promise.race([settled, timeout])
    clearTimeout(timer)
    this.#active.clear()
  }

  #pump (): void {
    while (!this.#closing && !this.#paused && this.#pool.idle > 0) {
      const assembling = [...this.#active.values()].find((sweep) => sweep.allDone && !sweep.assembling)
      if (assembling !== undefined) {
        this.#assemble(assembling)
        continue
      }
      // Decisions on points first: they unblock the next blocks of trials.
      const deciding = this.#nextDecision()
      if (deciding !== undefined) {
        this.#decide(deciding.sweep, deciding.point)
        continue
      }
      const sweep = this.#order.pick([...this.#active.values()].filter((candidate) => candidate.hasPending))
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
      (message) => {
        if (this.#active.get(sweep.id) !== sweep) return
        this.#store.reportProgress(sweep.id, chunk.index, message.trialsDone, Date.now())
          .then(() => this.#events.progress(sweep.id))
          .catch((error: unknown) => this.#logger?.warn({ err: error, sweepId: sweep.id }, 'cannot store chunk progress'))
      }
    )
    this.#track(task.then(
      (outcome) => this.#onChunkOutcome(sweep, chunk.index, attempt, outcome),
      (error: unknown) => this.#onChunkOutcome(sweep, chunk.index, attempt, threadCrash(error))
    ))
  }

  #onChunkOutcome (sweep: ActiveSweep, index: number, attempt: number, outcome: ChunkTaskOutcome): void {
    if (this.#closing) return
    if (this.#active.get(sweep.id) !== sweep) {
      sweep.drop(index)
      return this.#pump()
    }
    const log = this.#logger?.child({ sweepId: sweep.id, chunk: index, attempt })
    switch (outcome.kind) {
      case 'done':
        // The thread is free: it takes its next chunk before this one's durable write (a
        // synchronous commit, milliseconds on a virtual disk), so the write overlaps computing.
        this.#pump()
        try {
          const recorded = this.#store.recordChunkNow(sweep.id, sweep.plan[index]!, outcome.body, outcome.computeMs, Date.now())
          if (recorded.status === 'running') {
            sweep.finish(index)
            this.#events.progress(sweep.id)
          } else {
            sweep.drop(index)
          }
        } catch (error) {
          log?.error({ err: error }, 'storing a finished chunk failed')
          this.#retryOrFail(sweep, index, attempt, 'storage')
        }
        break
      case 'stopped':
        // Only a canceled or closing sweep sets the flag, and both are handled above.
        sweep.drop(index)
        break
      case 'failed':
        if (outcome.error.kind === 'user') {
          log?.info({ error: outcome.error }, 'chunk refused by the engine')
          this.#fail(sweep, userFailure(outcome.error.message))
        } else {
          log?.error({ error: outcome.error }, 'chunk failed')
          this.#retryOrFail(sweep, index, attempt, systemCauseOf(outcome.error.name))
        }
        break
      default:
        log?.error({ outcome: outcome.kind }, 'unexpected answer from a compute thread')
        this.#retryOrFail(sweep, index, attempt, 'unexpected-answer')
    }
    this.#pump()
  }

  /** One due decision of any active sweep (precision targets), marked as asked for. */
  #nextDecision (): { sweep: ActiveSweep, point: number } | undefined {
    for (const sweep of this.#active.values()) {
      const point = sweep.takeDuePoint()
      if (point !== undefined) return { sweep, point }
    }
    return undefined
  }

  /**
   * Precision targets: reads an open point's stored chunks and, on a compute thread, decides to
   * close it or give it another block; applies the decision to the store and the plan.
   */
  #decide (sweep: ActiveSweep, point: number, attempt = 1): void {
    let task: Promise<ChunkTaskOutcome>
    try {
      const plan = sweep.plan.filter((chunk) => chunk.point === point)
      const wanted = new Set(plan.map((chunk) => chunk.index))
      const chunks = this.#store.storedChunksNow(sweep.id).chunks.filter((chunk) => wanted.has(chunk.index))
      task = this.#pool.decide({ kind: 'decide', spec: sweep.spec, point, plan, chunks })
    } catch (error) {
      this.#logger?.error({ err: error, sweepId: sweep.id }, 'reading a point\'s chunks for a decision failed')
      task = Promise.resolve({ kind: 'failed', error: { kind: 'system', name: 'StorageError', message: 'storage error' } })
    }
    this.#track(task.then(
      (outcome) => this.#onDecided(sweep, point, attempt, outcome),
      (error: unknown) => this.#onDecided(sweep, point, attempt, threadCrash(error))
    ))
  }

  async #onDecided (sweep: ActiveSweep, point: number, attempt: number, outcome: ChunkTaskOutcome): Promise<void> {
    if (this.#closing || this.#active.get(sweep.id) !== sweep) return this.#pump()
    if (outcome.kind !== 'decided') {
      this.#logger?.error({ sweepId: sweep.id, point, outcome }, 'deciding on a point failed')
      if (attempt < this.#options.maxAttempts) this.#decide(sweep, point, attempt + 1)
      else this.#fail(sweep, systemFailure({ chunkIndex: null, chunksTotal: sweep.plan.length }, attempt, outcome.kind === 'failed' ? systemCauseOf(outcome.error.name) : 'unexpected-answer'))
      return this.#pump()
    }
    const decision = outcome.decision
    try {
      if (decision.kind === 'close') {
        this.#store.closePointNow(sweep.id, point)
        sweep.decided(point, true)
      } else {
        // The block's trials that earlier sweeps hold are taken (stored already), the rest computed.
        const block = await applyBlock(this.#store, sweep.id, sweep.spec, point, decision, Date.now())
        if (block.appended !== null) sweep.append(block.appended, block.taken.map((chunk) => chunk.index))
        // Nothing appended: the point was closed meanwhile (or its plan moved on); never ask again for it then.
        sweep.decided(point, block.appended === null && !(await this.#store.openPoints(sweep.id)).includes(point))
      }
    } catch (error) {
      // Storing a decision failed: left as it was, the point would stay marked as being decided
      // and the sweep would never end; decide it again (it stays marked) or fail the sweep.
      this.#logger?.error({ err: error, sweepId: sweep.id, point }, 'storing a decision on a point failed')
      if (attempt >= this.#options.maxAttempts) this.#fail(sweep, systemFailure({ chunkIndex: null, chunksTotal: sweep.plan.length }, attempt, 'storage'))
      else this.#decide(sweep, point, attempt + 1)
      return this.#pump()
    }
    this.#events.progress(sweep.id)
    this.#pump()
  }

  #retryOrFail (sweep: ActiveSweep, index: number, attempt: number, cause: SystemCause): void {
    if (attempt < this.#options.maxAttempts) {
      sweep.requeue(index)
      return
    }
    sweep.drop(index)
    this.#fail(sweep, systemFailure({ chunkIndex: index, chunksTotal: sweep.plan.length }, attempt, cause))
  }

  #assemble (sweep: ActiveSweep, attempt = 1): void {
    sweep.assembling = true
    let task: Promise<ChunkTaskOutcome>
    try {
      const stored = this.#store.storedChunksNow(sweep.id)
      const finishedMs = Date.now()
      task = this.#pool.assemble({
        kind: 'assemble',
        spec: sweep.spec,
        plan: [...sweep.plan],
        chunks: stored.chunks,
        // From the first dispatch to assembly, including any time the service was down; the
        // compute threads' busy time stands for their CPU time (the work is CPU-bound).
        timing: { wallSeconds: Math.max(0, finishedMs - (sweep.startedMs ?? finishedMs)) / 1000, cpuSeconds: stored.computeMs / 1000, workers: this.#pool.threads }
      })
    } catch (error) {
      this.#logger?.error({ err: error, sweepId: sweep.id }, 'reading chunk results for assembly failed')
      task = Promise.resolve({ kind: 'failed', error: { kind: 'system', name: 'StorageError', message: 'storage error' } })
    }
    this.#track(task.then(
      (outcome) => this.#onAssembled(sweep, attempt, outcome),
      (error: unknown) => this.#onAssembled(sweep, attempt, threadCrash(error))
    ))
  }

  #onAssembled (sweep: ActiveSweep, attempt: number, outcome: ChunkTaskOutcome): void {
    if (this.#closing || this.#active.get(sweep.id) !== sweep) return this.#pump()
    if (outcome.kind === 'assembled') {
      try {
        if (this.#store.succeedNow(sweep.id, outcome.body, Date.now()).changed) this.#emitState(sweep.id)
        this.#retire(sweep)
      } catch (error) {
        this.#logger?.error({ err: error, sweepId: sweep.id }, 'storing the assembled result failed')
        this.#assemblyRetryOrFail(sweep, attempt, 'storage')
      }
    } else {
      // Stored chunks that cannot be assembled are the system's fault, never the spec's.
      this.#logger?.error({ sweepId: sweep.id, outcome }, 'assembling a sweep failed')
      this.#assemblyRetryOrFail(sweep, attempt, outcome.kind === 'failed' ? systemCauseOf(outcome.error.name) : 'unexpected-answer')
    }
    this.#pump()
  }

  #assemblyRetryOrFail (sweep: ActiveSweep, attempt: number, cause: SystemCause): void {
    if (attempt < this.#options.maxAttempts) {
      this.#assemble(sweep, attempt + 1)
      return
    }
    this.#fail(sweep, systemFailure({ chunkIndex: null, chunksTotal: sweep.plan.length }, attempt, cause))
  }

  #markStarted (sweep: ActiveSweep): void {
    const now = Date.now()
    sweep.startedMs = now
    this.#store.markRunning(sweep.id, now)
      .then((status) => { if (status === 'running') this.#emitState(sweep.id) })
      .catch((error: unknown) => this.#logger?.error({ err: error, sweepId: sweep.id }, 'cannot mark a sweep running'))
  }

  #fail (sweep: ActiveSweep, failure: SweepFailure): void {
    const changed = this.#store.stopNow(sweep.id, 'failed', failure, Date.now()).changed
    this.#retire(sweep)
    if (changed) this.#emitState(sweep.id)
  }

  #retire (sweep: ActiveSweep): void {
    sweep.requestStop()
    this.#active.delete(sweep.id)
    this.#events.settle(sweep.id)
    this.#order.retainOnly(new Set([...this.#active.values()].map((active) => active.ownerKey)))
  }

  #emitState (id: string): void {
    const record = this.#store.getNow(id)
    if (record !== null) this.#events.state(record)
  }

  #track (work: Promise<void>): void {
    const tracked = work.catch((error: unknown) => {
      this.#logger?.error({ err: error }, 'scheduler bookkeeping failed')
    }).finally(() => this.#inFlight.delete(tracked))
    this.#inFlight.add(tracked)
  }
}

/** A rejected task: the thread died (exit, uncaught error, heap limit) instead of answering. */
function threadCrash (error: unknown): ChunkTaskOutcome {
  const outOfMemory = (error as { code?: unknown } | null)?.code === 'ERR_WORKER_OUT_OF_MEMORY'
  const message = error instanceof Error ? (error.message.split('\n', 1)[0] ?? '') : String(error)
  return { kind: 'failed', error: { kind: 'system', name: outOfMemory ? THREAD_OUT_OF_MEMORY_ERROR_NAME : THREAD_CRASH_ERROR_NAME, message } }
}
