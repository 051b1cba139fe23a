/**
 * The one pino factory, shared by the API (as fastify's `loggerInstance`), the CLI and workers.
 * Secrets never reach a log line: credentials in headers and token fields are censored.
 */
import { pino, type DestinationStream, type Logger, type LevelWithSilent } from 'pino'

export type { Logger } from 'pino'

/** Paths pino censors wherever a log object carries them. */
export const REDACTED_PATHS = [
  'req.headers.authorization',
  'req.headers.cookie',
  'req.headers["proxy-authorization"]',
  'headers.authorization',
  'authorization',
  'token',
  'tokens',
  '*.token',
  '*.tokens'
]

export interface LoggerOptions {
  level: LevelWithSilent
  /** Component name bound to every line (`api`, `worker`, `cli`). */
  name?: string
  /** Where lines go; defaults to stdout. Tests pass an in-memory stream. */
  destination?: DestinationStream
}

export function createLogger (options: LoggerOptions): Logger {
  return pino({
    level: options.level,
    name: options.name,
    redact: { paths: REDACTED_PATHS, censor: '[redacted]' },
    // ISO times read well in a terminal and parse unambiguously in log shippers.
    timestamp: pino.stdTimeFunctions.isoTime
  }, options.destination ?? pino.destination(1))
}
