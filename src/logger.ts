/**
 * The one pino factory, shared by the API (as fastify's `loggerInstance`), the CLI and workers.
 * Secrets never reach a log line: credentials in headers and token fields are censored.
 * Lines are JSON (one object per line, for log shippers) unless a person is watching: on a
 * terminal they are printed by pino-pretty, one readable line each.
 */
import { isatty } from 'node:tty'
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

/**
 * Standard output for log lines, written synchronously (a crash loses no line). When it is gone
 * (the terminal closed, or whoever read the pipe exited) lines are dropped: an error per line
 * would keep a server that is shutting down, because its terminal went away, from finishing.
 */
function standardOutput (): DestinationStream {
  const out = pino.destination({ dest: 1, sync: true })
  let gone = false
  out.on('error', () => { gone = true })
  return { write: (line: string) => { if (!gone) out.write(line) } }
}

/** Each JSON line rewritten as one readable line (pino-pretty's formatter, run in this thread). */
function prettyLines (sink: DestinationStream, colorize: boolean): DestinationStream {
  const prettify = pinoPretty.prettyFactory({
    colorize,
    singleLine: true,
    translateTime: 'SYS:HH:MM:ss',
    ignore: PRETTY_IGNORED
  })
  return { write: (line: string) => { sink.write(prettify(line)) } }
}

export function createLogger (options: LoggerOptions): Logger {
  // Asked of the descriptor itself: process.stdout would open a stream on it just to answer.
  const toTerminal = options.destination === undefined && isatty(1)
  const sink = options.destination ?? standardOutput()
  // colorette's check: a terminal, and neither NO_COLOR nor TERM=dumb.
  const destination = wantsPretty(options.format ?? 'auto', toTerminal) ? prettyLines(sink, toTerminal && pinoPretty.isColorSupported) : sink
  return pino({
    level: options.level,
    name: options.name,
    redact: { paths: REDACTED_PATHS, censor: '[redacted]' },
    // ISO times read well in a terminal and parse unambiguously in log shippers.
    timestamp: pino.stdTimeFunctions.isoTime
  }, destination)
}
