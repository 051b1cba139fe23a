/** `memsweep serve` and `memsweep worker`: the long-running processes, configured like `npm start`. */
import type { CliIo } from '../io.js'

export interface ServeOptions {
  port?: string
  host?: string
  dataDir?: string
  threads?: string
  tokensFile?: string
  allowAnonymous?: boolean
  redisUrl?: string
}

/** Command-line options win over the environment; the names match the variables in .env.example. */
function withOverrides (env: Record<string, string | undefined>, overrides: Record<string, string | undefined>): Record<string, string | undefined> {
  const merged = { ...env }
  for (const [name, value] of Object.entries(overrides)) if (value !== undefined) merged[name] = value
  return merged
}

/** Starts the API server; resolves once it listens (it then runs until SIGTERM/SIGINT). */
export async function serve (io: CliIo, options: ServeOptions): Promise<void> {
  const { main } = await import('../../server.js')
  await main(withOverrides(io.env, {
    PORT: options.port,
    HOST: options.host,
    DATA_DIR: options.dataDir,
    WORKER_THREADS: options.threads,
    TOKENS_FILE: options.tokensFile,
    ALLOW_ANONYMOUS: options.allowAnonymous === true ? 'true' : undefined,
    REDIS_URL: options.redisUrl
  }))
}

export interface WorkerOptions {
  redisUrl?: string
  prefix?: string
  concurrency?: string
  maxRuntime?: string
  exitWhenIdle?: string
  shutdownGrace?: string
  healthPort?: string
}

/** Starts a worker of the Redis backend; resolves after it has shut down (SIGTERM/SIGINT, idle, or its run-time limit). */
export async function worker (io: CliIo, options: WorkerOptions): Promise<void> {
  const { runWorkerFromEnvironment } = await import('../../worker.js')
  await runWorkerFromEnvironment(withOverrides(io.env, {
    REDIS_URL: options.redisUrl,
    REDIS_PREFIX: options.prefix,
    WORKER_THREADS: options.concurrency,
    WORKER_MAX_RUNTIME: options.maxRuntime,
    WORKER_EXIT_WHEN_IDLE: options.exitWhenIdle,
    WORKER_SHUTDOWN_GRACE: options.shutdownGrace,
    WORKER_HEALTH_PORT: options.healthPort
  }))
}
