/**
 * Sorting a chunk's failure into the user's fault or the system's, so that only failures
 * a retry could fix are retried, and so that a status body tells a researcher whether to
 * change the spec or to try again later.
 */
import type { SweepFailure } from '../port.js'

/** Error names that mean the spec itself cannot be computed: retrying would fail again. */
const USER_ERROR_NAMES: ReadonlySet<string> = new Set(['EngineInputError', 'SpecValidationError'])

/** Name of the error the engine throws when asked to stop between trials. */
export const CHUNK_CANCELED_ERROR_NAME = 'ChunkCanceledError'

/** Longest message we pass on; engine messages are one line, anything longer is noise. */
const MAX_MESSAGE_LENGTH = 500

export interface ClassifiedError {
  kind: SweepFailure['kind'] | 'canceled'
  /** Constructor name, for logs. */
  name: string
  /** First line of the message only: never a stack trace. */
  message: string
}

/**
 * `user`: the engine or the spec layer refused the parameters (EngineInputError,
 * SpecValidationError, any RangeError, or a TypeError raised by argument validation,
 * whose message starts with "invalid argument"). Everything else, including a TypeError
 * from a programming mistake, is `system`: the user cannot fix it by changing the spec.
 */
export function classifyChunkError (error: unknown): ClassifiedError {
  if (!(error instanceof Error)) {
    return { kind: 'system', name: typeof error, message: firstLine(String(error)) }
  }
  const name = error.name || error.constructor.name
  const message = firstLine(error.message)
  if (name === CHUNK_CANCELED_ERROR_NAME) return { kind: 'canceled', name, message }
  if (USER_ERROR_NAMES.has(name) || error instanceof RangeError) return { kind: 'user', name, message }
  if (error instanceof TypeError && /^invalid argument/i.test(message)) return { kind: 'user', name, message }
  return { kind: 'system', name, message }
}

function firstLine (text: string): string {
  const line = text.split('\n', 1)[0] ?? ''
  return line.length > MAX_MESSAGE_LENGTH ? `${line.slice(0, MAX_MESSAGE_LENGTH - 1)}…` : line
}

/**
 * The public message of a sweep that failed for system reasons. Internal details stay in
 * the service log: they may name paths, hosts or library internals.
 */
export function systemFailureMessage (chunkIndex: number, chunksTotal: number, attempts: number, cause: string): string {
  const times = attempts === 1 ? 'once' : `${attempts} times`
  return `Chunk ${chunkIndex + 1} of ${chunksTotal} failed ${times} for reasons outside the spec (${cause}). ` +
    'Submitting the sweep again may succeed; the service log has the details.'
}
