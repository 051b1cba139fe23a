/**
 * The one pino factory, shared by the API (as fastify's `loggerInstance`), the CLI and workers.
 * Secrets never reach a log line: credentials in headers and token fields are censored.
 * Lines are JSON (one object per line, for log shippers) unless a person is watching: on a
 * terminal they are printed by pino-pretty, one readable line each.
 */
import { pino, type DestinationStream, type Logger, type LevelWithSilent } from 'pino'
import pinoPretty from 'pino-pretty'

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

/** `auto`: readable lines when standard output is a terminal, JSON otherwise. */
export const LOG_FORMATS = ['auto', 'json', 'pretty'] as const
export type LogFormat = typeof LOG_FORMATS[number]

/**
 * Fields pretty lines leave out: the process and host (one process per terminal) and the
 * start-up line's `listening` object, whose message already says it all in words.
 */
const PRETTY_IGNORED = 'pid,hostname,name,listening'

export interface LoggerOptions {
  level: LevelWithSilent
  /** Component name bound to every line (`api`, `worker`, `cli`). */
  name?: string
  /** Where lines go; defaults to stdout. Tests pass an in-memory stream. */
  destination?: DestinationStream
  /** Default `auto`: pretty when the destination is standard output and that is a terminal. */
  format?: LogFormat
}

/** Whether lines should be pretty, given the format asked for and where they go. */
export function wantsPretty (format: LogFormat, toTerminal: boolean): boolean {
  return format === 'pretty' || (format === 'auto' && toTerminal)
}

export function createLogger (options: LoggerOptions): Logger {
  const toTerminal = options.destination === undefined && process.stdout.isTTY === true
  const pretty = wantsPretty(options.format ?? 'auto', toTerminal)
  const destination = pretty
    ? pinoPretty({
      destination: options.destination ?? 1,
      sync: true,
      // colorette's check: a terminal, and neither NO_COLOR nor TERM=dumb.
      colorize: toTerminal && pinoPretty.isColorSupported,
      singleLine: true,
      translateTime: 'SYS:HH:MM:ss',
      ignore: PRETTY_IGNORED
    })
    : options.destination ?? pino.destination(1)
  return pino({
    level: options.level,
    name: options.name,
    redact: { paths: REDACTED_PATHS, censor: '[redacted]' },
    // ISO times read well in a terminal and parse unambiguously in log shippers.
    timestamp: pino.stdTimeFunctions.isoTime
  }, destination)
}
