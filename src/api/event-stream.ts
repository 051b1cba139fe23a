/**
 * Server-Sent Events for one sweep: a `snapshot` event first, then `progress` and `state`
 * events, `: ping` comments as heartbeats, and the stream closes after the terminal `state`
 * event (sent at once after the snapshot when the sweep has already ended).
 * Every open stream is registered so the app can end them on shutdown (an open response
 * would otherwise keep `close()` waiting forever).
 */
import type { ServerResponse } from 'node:http'
import type { SweepEvent, SweepQueue, SweepRecord } from '../backends/port.js'
import { TERMINAL_STATUSES } from '../backends/port.js'
import { presentSweep } from './presenters.js'

/** Progress events closer together than this are merged (the latest wins). */
const PROGRESS_MIN_INTERVAL_MS = 250
/** Browsers wait this long before reconnecting after a drop. */
const RECONNECT_MS = 3000

export class EventStreamRegistry {
  readonly #open = new Set<() => void>()
  #closing = false

  get size (): number { return this.#open.size }
  get closing (): boolean { return this.#closing }

  add (end: () => void): () => void {
    this.#open.add(end)
    return () => { this.#open.delete(end) }
  }

  /** Ends every open stream; called before the server closes. */
  endAll (): void {
    this.#closing = true
    for (const end of [...this.#open]) end()
  }
}

/** Order of a record in a sweep's life, to drop events older than the snapshot already sent. */
function isNewer (candidate: SweepRecord, than: SweepRecord): boolean {
  const rank = (r: SweepRecord): number => (TERMINAL_STATUSES.has(r.status) ? 2 : r.status === 'running' ? 1 : 0)
  if (rank(candidate) !== rank(than)) return rank(candidate) > rank(than)
  return candidate.progress.trialsDone > than.progress.trialsDone || candidate.progress.chunksDone > than.progress.chunksDone
}

export interface StreamOptions {
  queue: SweepQueue
  id: string
  raw: ServerResponse
  heartbeatMs: number
  registry: EventStreamRegistry
  /** Headers already set on the reply (request id, rate-limit headers). */
  headers: Record<string, string | number | string[]>
  onOpen?: () => void
  onClose?: () => void
}

/**
 * Streams a sweep's events. Subscribes before reading the snapshot so no change between the
 * two is missed; events that the snapshot already reflects are dropped.
 */
export async function streamSweepEvents (options: StreamOptions): Promise<void> {
  const { queue, id, raw } = options
  let eventId = 0
  let ended = false
  let snapshot: SweepRecord | null = null
  const early: SweepEvent[] = []
  let pendingProgress: SweepRecord | null = null
  let progressTimer: NodeJS.Timeout | null = null
  let lastProgressAt = 0

  const write = (text: string): void => { if (!ended) raw.write(text) }
  const send = (event: string, record: SweepRecord): void => {
    eventId++
    write(`id: ${eventId}\nevent: ${event}\ndata: ${JSON.stringify(presentSweep(record))}\n\n`)
  }

  const end = (): void => {
    if (ended) return
    ended = true
    unsubscribe()
    clearInterval(heartbeat)
    if (progressTimer !== null) clearTimeout(progressTimer)
    unregister()
    options.onClose?.()
    raw.end()
  }

  const flushProgress = (): void => {
    progressTimer = null
    if (pendingProgress === null) return
    const record = pendingProgress
    pendingProgress = null
    lastProgressAt = Date.now()
    send('progress', record)
  }

  const deliver = (event: SweepEvent): void => {
    if (ended) return
    if (event.type === 'progress') {
      pendingProgress = event.sweep
      const wait = PROGRESS_MIN_INTERVAL_MS - (Date.now() - lastProgressAt)
      if (wait <= 0) flushProgress()
      else progressTimer ??= setTimeout(flushProgress, wait)
      return
    }
    // A state change supersedes any progress still waiting to be sent.
    if (progressTimer !== null) { clearTimeout(progressTimer); progressTimer = null }
    pendingProgress = null
    send('state', event.sweep)
    if (TERMINAL_STATUSES.has(event.sweep.status)) end()
  }

  const unsubscribe = queue.subscribe(id, (event) => {
    if (snapshot === null) early.push(event)
    else deliver(event)
  })
  const unregister = options.registry.add(end)
  const heartbeat = setInterval(() => write(': ping\n\n'), options.heartbeatMs)
  heartbeat.unref()
  raw.on('close', end)

  raw.writeHead(200, {
    ...options.headers,
    'content-type': 'text/event-stream; charset=utf-8',
    'cache-control': 'no-cache, no-transform',
    connection: 'keep-alive',
    // nginx buffers responses unless told not to; events must arrive as they happen.
    'x-accel-buffering': 'no'
  })
  options.onOpen?.()
  write(`retry: ${RECONNECT_MS}\n\n`)

  let record: SweepRecord | null
  try {
    record = await queue.get(id)
  } catch {
    record = null
  }
  if (record === null) { end(); return }
  snapshot = record
  send('snapshot', record)
  // Every stream ends with the state event of how the sweep ended, including the stream of a
  // sweep that had already ended when it was opened: clients wait for that one event.
  if (TERMINAL_STATUSES.has(record.status)) { send('state', record); end(); return }
  for (const event of early) {
    if (isNewer(event.sweep, record) || (event.type === 'state' && TERMINAL_STATUSES.has(event.sweep.status))) deliver(event)
  }
  early.length = 0
}
