/**
 * Builds the real app around a real queue backend for one group of tests, and sends
 * requests through `inject` with every response checked against the OpenAPI document.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { FastifyInstance, InjectOptions } from 'fastify'
import { pino } from 'pino'
import { buildApp } from '../../../src/api/app.js'
import type { SweepQueue, SweepRecord } from '../../../src/backends/port.js'
import { TERMINAL_STATUSES } from '../../../src/backends/port.js'
import { loadConfig, type Config } from '../../../src/config.js'
import { assertMatchesDocument } from './openapi.js'

/** Makes a fresh, empty backend; the contract suite runs once per backend kind. */
export type QueueFactory = (scope: { dataDir: string, name: string }) => Promise<SweepQueue>

export interface HarnessOptions {
  /** Extra environment for loadConfig, e.g. { MAX_NEURONS: '100' }. */
  env?: Record<string, string>
  /** Lines of a tokens file; when given, the app runs with tokens. */
  tokens?: string[]
}

export interface Harness {
  app: FastifyInstance
  queue: SweepQueue
  config: Config
  dataDir: string
  /** Injects a request; the response must match the OpenAPI document. */
  request: (options: InjectOptions & { url: string }) => Promise<Awaited<ReturnType<FastifyInstance['inject']>>>
  /** Resolves with the record once the sweep reaches a state `until` accepts (driven by backend events, not sleeps). */
  waitFor: (id: string, until: (record: SweepRecord) => boolean, timeoutMs?: number) => Promise<SweepRecord>
  close: () => Promise<void>
}

export const isTerminal = (record: SweepRecord): boolean => TERMINAL_STATUSES.has(record.status)

export async function createHarness (factory: QueueFactory, options: HarnessOptions = {}): Promise<Harness> {
  const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-api-'))
  const env: Record<string, string> = { DATA_DIR: dataDir, WORKER_THREADS: '2', LOG_LEVEL: 'silent', ...options.env }
  if (options.tokens !== undefined) {
    const file = join(dataDir, 'tokens.txt')
    await writeFile(file, options.tokens.join('\n') + '\n')
    env.TOKENS_FILE = file
  }
  const config = loadConfig(env)
  const logger = pino({ level: 'silent' })
  const queue = await factory({ dataDir, name: `api-${Math.random().toString(36).slice(2)}` })
  const app = buildApp({ config, queue, logger })
  await app.ready()

  const request: Harness['request'] = async (injectOptions) => {
    const response = await app.inject(injectOptions)
    assertMatchesDocument(injectOptions.method ?? 'GET', injectOptions.url, {
      statusCode: response.statusCode,
      headers: response.headers,
      body: response.body
    })
    return response
  }

  const waitFor: Harness['waitFor'] = async (id, until, timeoutMs = 60_000) => {
    return await new Promise<SweepRecord>((resolve, reject) => {
      let settled = false
      const finish = (error: Error | null, record?: SweepRecord): void => {
        if (settled) return
        settled = true
        clearTimeout(timer)
        unsubscribe()
        if (error !== null) reject(error)
        else resolve(record as SweepRecord)
      }
      const timer = setTimeout(() => finish(new Error(`sweep ${id} did not reach the awaited state within ${timeoutMs} ms`)), timeoutMs)
      const unsubscribe = queue.subscribe(id, (event) => {
        if (until(event.sweep)) finish(null, event.sweep)
      })
      // The state may already hold (or have been reached before the subscription).
      queue.get(id).then((record) => {
        if (record !== null && until(record)) finish(null, record)
      }, (error: unknown) => finish(error as Error))
    })
  }

  return {
    app,
    queue,
    config,
    dataDir,
    request,
    waitFor,
    close: async () => {
      await app.close()
      await queue.close()
      await rm(dataDir, { recursive: true, force: true })
    }
  }
}

/** Splits a text/event-stream body into its events (comments are returned as `comment`). */
export function parseEventStream (text: string): Array<{ id?: string, event?: string, data?: string, retry?: string, comment?: string }> {
  const events: Array<{ id?: string, event?: string, data?: string, retry?: string, comment?: string }> = []
  for (const block of text.split('\n\n')) {
    if (block.trim() === '') continue
    const event: { id?: string, event?: string, data?: string, retry?: string, comment?: string } = {}
    for (const line of block.split('\n')) {
      if (line.startsWith(':')) { event.comment = line.slice(1).trim(); continue }
      const colon = line.indexOf(':')
      const field = line.slice(0, colon)
      const value = line.slice(colon + 1).replace(/^ /, '')
      if (field === 'id' || field === 'event' || field === 'data' || field === 'retry') event[field] = value
    }
    events.push(event)
  }
  return events
}
