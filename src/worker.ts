/**
 * `npm run worker`: one worker process of the Redis backend, configured from the
 * environment (REDIS_URL, REDIS_PREFIX, WORKER_THREADS for the concurrency, LOG_LEVEL, and
 * for batch allocations and containers WORKER_MAX_RUNTIME, WORKER_EXIT_WHEN_IDLE,
 * WORKER_SHUTDOWN_GRACE, WORKER_HEALTH_PORT). Start as many as you like, on any machines
 * that reach the same Redis. It exits 0 once drained: on SIGTERM, when idle, or at its limit.
 */
import { pathToFileURL } from 'node:url'
import { loadConfig } from './config.js'
import { createLogger } from './logger.js'
import { closeOnSignals, startWorker } from './backends/redis/worker/worker.js'
import { missingEngineFlags } from './runtime/node-flags.js'

export async function runWorkerFromEnvironment (env: Record<string, string | undefined>): Promise<void> {
  const config = loadConfig(env)
  const logger = createLogger({ level: config.logLevel, format: config.logFormat, name: 'worker' })
  if (config.redisUrl === null) {
    throw new Error('REDIS_URL is not set: workers serve the Redis backend (the embedded backend runs its own threads inside the API).')
  }
  // Never trap a crash: log it and let the supervisor restart the process; its chunks return to the queue.
  const fatal = (err: unknown): void => {
    logger.fatal({ err }, 'worker crashed')
    process.exit(1)
  }
  process.on('uncaughtException', fatal)
  process.on('unhandledRejection', fatal)
  const missing = missingEngineFlags()
  if (missing.length > 0) logger.warn({ missing }, 'started without the recommended node flags: compute threads will share fewer cycles (see src/runtime/node-flags.ts)')
  const lifetime = config.workerLifetime
  const worker = await startWorker({
    url: config.redisUrl,
    prefix: config.redisPrefix,
    concurrency: config.workerThreads,
    logger,
    retentionSeconds: config.retentionSeconds,
    shutdownGraceMs: lifetime.shutdownGraceMs,
    ...(lifetime.maxRuntimeMs === null ? {} : { maxRuntimeMs: lifetime.maxRuntimeMs }),
    ...(lifetime.exitWhenIdleMs === null ? {} : { exitWhenIdleMs: lifetime.exitWhenIdleMs }),
    ...(lifetime.healthPort === null ? {} : { healthPort: lifetime.healthPort })
  })
  await closeOnSignals(worker, logger)
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  runWorkerFromEnvironment(process.env).then(() => process.exit(0), (error: unknown) => {
    console.error(error instanceof Error ? error.message : error)
    process.exit(1)
  })
}
