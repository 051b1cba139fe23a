/**
 * The real service for browser tests: buildApp around the embedded backend in a temporary
 * DATA_DIR, listening on a free port of 127.0.0.1, serving a web build made for the test.
 */
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Writable } from 'node:stream'
import type { FastifyInstance } from 'fastify'
import { pino } from 'pino'
import { buildApp } from '../../../src/api/app.js'
import { createEmbeddedQueue } from '../../../src/backends/embedded/index.js'
import type { SweepQueue } from '../../../src/backends/port.js'
import { loadConfig } from '../../../src/config.js'
import { buildWeb } from '../../../scripts/build-web.mjs'

export interface WebServer {
  url: string
  app: FastifyInstance
  queue: SweepQueue
  /** Every line the server logged (info level), to check that no token is ever written. */
  logs: string[]
  close: () => Promise<void>
}

/** Builds the page into a fresh temporary folder once per process. */
let built: Promise<string> | null = null
export function buildWebOnce (): Promise<string> {
  built ??= mkdtemp(join(tmpdir(), 'memsweep-web-')).then((dir) => buildWeb(join(dir, 'web'), { typecheck: false }))
  return built
}

export async function startWebServer (options: { tokens?: string[], env?: Record<string, string> } = {}): Promise<WebServer> {
  const webRoot = await buildWebOnce()
  const dataDir = await mkdtemp(join(tmpdir(), 'memsweep-web-data-'))
  const env: Record<string, string> = { DATA_DIR: dataDir, WORKER_THREADS: '2', HOST: '127.0.0.1', PORT: '0', ...options.env }
  if (options.tokens !== undefined) {
    const file = join(dataDir, 'tokens.txt')
    await writeFile(file, options.tokens.join('\n') + '\n')
    env.TOKENS_FILE = file
  }
  const config = loadConfig(env)
  const logs: string[] = []
  const sink = new Writable({ write (chunk: Buffer, _encoding, done) { logs.push(chunk.toString('utf8')); done() } })
  const logger = pino({ level: 'info' }, sink)
  const queue = await createEmbeddedQueue({ dataDir, threads: config.workerThreads, logger })
  const app = buildApp({ config, queue, logger, webRoot })
  const url = await app.listen({ host: '127.0.0.1', port: 0 })
  return {
    url,
    app,
    queue,
    logs,
    close: async () => {
      await app.close()
      await queue.close()
      await rm(dataDir, { recursive: true, force: true })
    }
  }
}
