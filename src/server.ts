/**
 * The service process: config → queue backend → app → listen, with graceful shutdown.
 * The embedded backend (SQLite + worker threads) is the default; REDIS_URL selects Redis.
 * This is the only module that listens on a port.
 */
import { existsSync, readFileSync, realpathSync } from 'node:fs'
import { isIPv6, type AddressInfo } from 'node:net'
import { isatty } from 'node:tty'
import { parseEnv } from 'node:util'
import { pathToFileURL } from 'node:url'
import closeWithGrace from 'close-with-grace'
import type { FastifyInstance } from 'fastify'
import type { Redis } from 'ioredis'
import { buildApp } from './api/app.js'
import type { SweepQueue } from './backends/port.js'
import { ConfigError, decideAccess, loadConfig, type AccessDecision, type Config } from './config.js'
import { createLogger, type Logger } from './logger.js'
import { missingEngineFlags } from './runtime/node-flags.js'

/** Seconds the shutdown may take before the process exits anyway (open streams, running chunks). */
const SHUTDOWN_GRACE_MS = 10_000

async function createQueue (config: Config, logger: Logger): Promise<SweepQueue> {
  if (config.redisUrl !== null) {
    // Loaded only when asked for: a single-machine server never loads the Redis client.
    const { createRedisQueue } = await import('./backends/redis/index.js')
    return await createRedisQueue({ url: config.redisUrl, prefix: config.redisPrefix, retentionSeconds: config.retentionSeconds, logger })
  }
  const { createEmbeddedQueue } = await import('./backends/embedded/index.js')
  return await createEmbeddedQueue({ dataDir: config.dataDir, threads: config.workerThreads, logger })
}

export interface RunningServer {
  app: FastifyInstance
  queue: SweepQueue
  address: string
  /** Stops taking requests, ends event streams, then closes the queue. */
  close: () => Promise<void>
}

/** What the start-up line reports. */
export interface ListeningReport {
  address: string
  backend: SweepQueue['kind']
  /** Embedded backend: where sweeps and results persist. */
  dataDir: string | null
  /** Redis backend: the URL without its password. */
  redis: string | null
  authentication: boolean
  authenticationReason: string
}

/** The one human-readable start-up line: where to connect, what backs it, who may use it. */
export function listeningLine (report: ListeningReport): string {
  const backend = report.backend === 'embedded' ? `embedded backend, data in ${report.dataDir ?? '?'}` : `Redis backend at ${report.redis ?? '?'}`
  const access = `authentication ${report.authentication ? 'on' : 'off'}: ${report.authenticationReason}`
  return `memsweep listening on ${report.address} (${backend}, ${access})`
}

function httpUrl (host: string, port: number): string {
  return `http://${isIPv6(host) ? `[${host}]` : host}:${port}`
}

async function listeningReport (config: Config, address: string, queue: SweepQueue, access: AccessDecision): Promise<ListeningReport> {
  let redis: string | null = null
  if (config.redisUrl !== null) {
    const { redactUrl } = await import('./backends/redis/connections.js')
    redis = redactUrl(config.redisUrl)
  }
  return {
    address,
    backend: queue.kind,
    dataDir: queue.kind === 'embedded' ? config.dataDir : null,
    redis,
    authentication: access.authentication,
    authenticationReason: access.reason
  }
}

/** Starts the service with the given environment; resolves once it listens. */
export async function startServer (env: Record<string, string | undefined>, logger?: Logger): Promise<RunningServer> {
  const config = loadConfig(env)
  // Before anything is opened: a server that would be open to the network does not start at all.
  const access = decideAccess(config)
  const log = logger ?? createLogger({ level: config.logLevel, format: config.logFormat, name: 'memsweep' })
  const queue = await createQueue(config, log)
  let rateLimitRedis: Redis | undefined
  let app: FastifyInstance | undefined
  const closeAll = async (): Promise<void> => {
    await app?.close()
    await queue.close()
    if (rateLimitRedis !== undefined) await closeConnection(rateLimitRedis)
  }
  try {
    if (config.redisUrl !== null) {
      // API instances behind one load balancer share their rate-limit counters.
      const { openConnection } = await import('./backends/redis/connections.js')
      rateLimitRedis = await openConnection(config.redisUrl, 'producer', 'memsweep:api-rate-limit')
    }
    app = buildApp({ config, queue, logger: log, ...(rateLimitRedis === undefined ? {} : { rateLimitRedis }) })
    await app.ready()
    // fastify logs "Server listening at …" once per interface at info; the start-up line below
    // says more, once. Its logger is quieted for the listen call only, after every plugin has
    // booted (so none keeps the quiet one).
    const appLog = app.log
    app.log = appLog.child({}, { level: 'warn' })
    try {
      await app.listen({ port: config.port, host: config.host })
    } finally {
      app.log = appLog
    }
    // The address as configured, with the port actually bound: for 0.0.0.0 fastify would name
    // just one interface, hiding that every other one is open too.
    const address = httpUrl(config.host, (app.server.address() as AddressInfo).port)
    const listening = await listeningReport(config, address, queue, access)
    log.info({ listening }, listeningLine(listening))
    const missing = missingEngineFlags()
    if (queue.kind === 'embedded' && missing.length > 0) log.warn({ missing }, 'started without the recommended node flags: compute threads will share fewer cycles (see src/runtime/node-flags.ts)')
    let closing: Promise<void> | null = null
    const running = app
    return { app: running, queue, address, close: async () => { closing ??= closeAll(); return await closing } }
  } catch (error) {
    await closeAll().catch(() => undefined)
    throw error
  }
}

async function closeConnection (redis: Redis): Promise<void> {
  const { closeConnection: close } = await import('./backends/redis/connections.js')
  await close(redis)
}

/**
 * Variables from a `.env` file in the working directory, if there is one (copy .env.example).
 * The real environment wins over the file, as with `node --env-file`.
 */
export function withDotEnv (env: Record<string, string | undefined>, file = '.env'): Record<string, string | undefined> {
  if (!existsSync(file)) return env
  return { ...parseEnv(readFileSync(file, 'utf8')), ...env }
}

/** Standard descriptors that were terminals when the process started. */
const terminalsAtStart = [0, 1, 2].filter((fd) => isatty(fd))

/**
 * Node 20 restores the terminal's settings as it exits, and when the terminal has hung up (the
 * SSH session that started the server dropped) that fails an internal check whose report then
 * crashes in a loop at full CPU (nodejs/node#51519, fixed in later Node releases). So a server
 * whose terminal went away ends, once it has closed everything, with SIGKILL instead of exit.
 */
function endIfTerminalHungUp (): void {
  if (terminalsAtStart.some((fd) => !isatty(fd))) process.kill(process.pid, 'SIGKILL')
}

/** Runs the service until SIGTERM/SIGINT; used by `npm start` and `memsweep serve`. */
export async function main (env: Record<string, string | undefined> = process.env): Promise<void> {
  let server: RunningServer
  try {
    server = await startServer(withDotEnv(env))
  } catch (error) {
    if (error instanceof ConfigError) {
      console.error(error.message)
      process.exit(2)
    }
    throw error
  }
  const log = server.app.log
  closeWithGrace({ delay: SHUTDOWN_GRACE_MS }, async ({ signal, err }) => {
    if (err !== undefined) log.fatal({ err }, 'shutting down after an uncaught error')
    else log.info({ signal }, 'shutting down')
    await server.close()
    endIfTerminalHungUp()
  })
}

// Compared through realpath: an npm bin is a symlink to this file.
const invokedDirectly = process.argv[1] !== undefined && import.meta.url === pathToFileURL(realpathSync(process.argv[1])).href
if (invokedDirectly) {
  main().catch((error: unknown) => {
    console.error(error)
    process.exit(1)
  })
}
