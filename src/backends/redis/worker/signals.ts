/** Graceful shutdown of a worker process on SIGTERM or SIGINT. */
import type { Logger } from 'pino'
import type { RunningWorker } from './worker.js'

/**
 * Closes the worker on the first SIGTERM or SIGINT (running chunks finish within the grace
 * period or go back to the queue); a second signal exits at once. Resolves once the worker
 * has closed, on a signal or on its own (idle, or at its run-time limit).
 */
export async function closeOnSignals (worker: RunningWorker, logger: Logger): Promise<void> {
  let received = 0
  const onSignal = (signal: NodeJS.Signals): void => {
    received++
    if (received > 1) {
      logger.warn({ signal }, 'second signal: exiting without waiting for running chunks (they return to the queue when their locks expire)')
      process.exit(1)
    }
    logger.info({ signal }, 'shutting down: no new chunks; running chunks finish or are handed back')
    worker.close().catch((err: unknown) => logger.error({ err }, 'cannot close the worker'))
  }
  process.on('SIGTERM', onSignal)
  process.on('SIGINT', onSignal)
  try {
    await worker.closed
  } finally {
    process.off('SIGTERM', onSignal)
    process.off('SIGINT', onSignal)
  }
}
