/**
 * A fixed set of compute threads (piscina). The scheduler hands over at most one task per
 * thread, so piscina's own queue stays empty: what waits, waits in the scheduler, where it
 * can be reordered or dropped on cancel.
 */
import { MessageChannel } from 'node:worker_threads'
import { Piscina } from 'piscina'
import type { ResourceLimits } from 'node:worker_threads'
import type { AssembleTask, ChunkProgressMessage, ChunkTask, ChunkTaskOutcome, DecideTask, RunChunkTask } from './chunk-task.js'
import type { WorkerEntry } from '../../runtime/worker-entry.js'

export interface ThreadPoolOptions {
  threads: number
  entry: WorkerEntry
  resourceLimits?: ResourceLimits
  /** Errors of an idle thread, which no task can receive (unhandled, they would end the process). */
  onIdleThreadError: (error: unknown) => void
}

export class ChunkThreadPool {
  readonly threads: number
  #pool: Piscina<ChunkTask, ChunkTaskOutcome>
  #busy = 0

  constructor (options: ThreadPoolOptions) {
    this.threads = options.threads
    this.#pool = new Piscina({
      filename: options.entry.filename,
      execArgv: options.entry.execArgv,
      argv: options.entry.argv,
      minThreads: options.threads,
      maxThreads: options.threads,
      // Threads stay up: starting one under the TypeScript loader costs hundreds of ms.
      idleTimeout: Number.MAX_SAFE_INTEGER,
      concurrentTasksPerWorker: 1,
      ...(options.resourceLimits ? { resourceLimits: options.resourceLimits } : {})
    })
    this.#pool.on('error', options.onIdleThreadError)
  }

  get busy (): number {
    return this.#busy
  }

  get idle (): number {
    return this.threads - this.#busy
  }

  /** Waits until every thread has loaded the entry module: fails fast on a broken install. */
  async warmUp (): Promise<void> {
    await Promise.all(Array.from({ length: this.threads }, () => this.#run({ kind: 'ping' })))
  }

  /** Runs one chunk; `onProgress` sees the chunk's running trial count. */
  runChunk (task: Omit<RunChunkTask, 'progressPort'>, onProgress: (message: ChunkProgressMessage) => void): Promise<ChunkTaskOutcome> {
    const { port1, port2 } = new MessageChannel()
    port1.on('message', onProgress)
    // The thread closes its end when the chunk ends; close ours too in case it crashed.
    return this.#run({ ...task, progressPort: port2 }, [port2]).finally(() => port1.close())
  }

  assemble (task: AssembleTask): Promise<ChunkTaskOutcome> {
    return this.#run(task)
  }

  decide (task: DecideTask): Promise<ChunkTaskOutcome> {
    return this.#run(task)
  }

  async destroy (): Promise<void> {
    await this.#pool.destroy()
  }

  async #run (task: ChunkTask, transferList?: RunChunkTask['progressPort'][]): Promise<ChunkTaskOutcome> {
    this.#busy++
    try {
      return await this.#pool.run(task, transferList ? { transferList } : {})
    } finally {
      this.#busy--
    }
  }
}
