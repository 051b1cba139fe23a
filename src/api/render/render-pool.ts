/**
 * The API's rendering thread: one thread, so rendering large results takes at most one core
 * from the compute threads, and its own heap limit, so an oversized rendering fails alone
 * (as a 500 for that request) without taking the server with it. Tasks queue in order.
 */
import { Piscina } from 'piscina'
import { siblingWorkerEntry } from '../../runtime/worker-entry.js'
import type { RenderOutcome, RenderTask } from './render-task.js'

export interface RenderPoolOptions {
  /**
   * Heap of the rendering thread, MiB. Per-trial downloads are limited (MAX_TRIAL_ROWS) to
   * what renders within it.
   * @defaultValue 3072
   */
  heapMb?: number
}

export class RenderPool {
  readonly #pool: Piscina

  constructor (options: RenderPoolOptions = {}) {
    const entry = siblingWorkerEntry(import.meta.url, 'render-thread')
    this.#pool = new Piscina({
      filename: entry.filename,
      execArgv: entry.execArgv,
      argv: entry.argv,
      minThreads: 0,
      maxThreads: 1,
      // Started on the first download, gone after a minute of quiet: an idle server holds no rendering heap.
      idleTimeout: 60_000,
      resourceLimits: { maxOldGenerationSizeMb: options.heapMb ?? 3072 }
    })
  }

  async render (task: RenderTask): Promise<RenderOutcome> {
    return await this.#pool.run(task) as RenderOutcome
  }

  async close (): Promise<void> {
    await this.#pool.destroy()
  }
}
