/**
 * Why a sweep failed, in two parts: sorting an error into the user's fault or the system's
 * (so that only failures a retry could fix are retried), and the one builder of every
 * public failure text. Public texts name a category and what to do, never internals: those
 * may name paths, hosts or library details and go to the service log instead.
 */
import type { SweepFailure } from './state.js'

// VARIABLES //

/** Error names that mean the spec itself cannot be computed: retrying would fail again. */
const USER_ERROR_NAMES: ReadonlySet<string> = new Set(['EngineInputError', 'SpecValidationError'])

/** Name of the error the engine throws when asked to stop between trials. */
export const CHUNK_CANCELED_ERROR_NAME = 'ChunkCanceledError'

/** Longest message we pass on; engine messages are one line, anything longer is noise. */
const MAX_MESSAGE_LENGTH = 500

/**
 * The categories of system failure a status body may name. `transient` causes may pass on
 * a later try, so the text invites submitting again; the others would fail the same way.
 */
export const SYSTEM_CAUSES = {
  'thread-crash': { text: 'the compute thread stopped unexpectedly', transient: true },
  'out-of-memory': { text: 'the compute thread ran out of memory', transient: false },
  storage: { text: 'the result could not be stored', transient: true },
  'lost-worker': { text: 'the worker running it stopped answering (a crash or a lost lock)', transient: true },
  'unexpected-answer': { text: 'the compute thread answered unexpectedly', transient: true },
  'engine-changed': { text: 'its chunks were computed by two engine releases (the service was upgraded while it ran), and one result never mixes two engines', transient: true },
  internal: { text: 'an internal error', transient: true }
} as const satisfies Record<string, { text: string, transient: boolean }>

export type SystemCause = keyof typeof SYSTEM_CAUSES

/** Names of the errors a compute thread's death is reported as (see the embedded scheduler). */
export const THREAD_CRASH_ERROR_NAME = 'ThreadCrash'
export const THREAD_OUT_OF_MEMORY_ERROR_NAME = 'ThreadOutOfMemory'
/** Assembly found chunks of another engine release (errors.ts EngineMixError). */
export const ENGINE_MIX_ERROR_NAME = 'EngineMixError'

export interface ClassifiedError {
  kind: SweepFailure['kind'] | 'canceled'
  /** Constructor name, for logs and for choosing a public cause. */
  name: string
  /** First line of the message only: never a stack trace. */
  message: string
}

// MAIN //

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

/** The public cause of a system failure, from the error's name only. */
export function systemCauseOf (errorName: string): SystemCause {
  if (errorName === THREAD_OUT_OF_MEMORY_ERROR_NAME) return 'out-of-memory'
  if (errorName === THREAD_CRASH_ERROR_NAME) return 'thread-crash'
  if (errorName === ENGINE_MIX_ERROR_NAME) return 'engine-changed'
  return 'internal'
}

/** A user failure: the engine's or spec layer's own one-line explanation of what to change. */
export function userFailure (message: string): SweepFailure {
  return { kind: 'user', message: firstLine(message) }
}

/** A chunk (or, with `chunkIndex` null, the assembly of the finished chunks) failed for good for system reasons. */
export function systemFailure (at: { chunkIndex: number | null, chunksTotal: number }, attempts: number, cause: SystemCause): SweepFailure {
  const times = attempts === 1 ? 'once' : `${attempts} times`
  const where = at.chunkIndex === null
    ? `The results of all ${at.chunksTotal} chunks were computed but could not be assembled (${attempts === 1 ? 'one attempt' : `${attempts} attempts`}: ${SYSTEM_CAUSES[cause].text}).`
    : `Chunk ${at.chunkIndex + 1} of ${at.chunksTotal} failed ${times} for reasons outside the spec (${SYSTEM_CAUSES[cause].text}).`
  const advice = SYSTEM_CAUSES[cause].transient
    ? 'Submitting the sweep again may succeed; the service log has the details.'
    : 'Submitting it again will fail the same way: it needs more than this service gives one computation (see the limits at POST /v1/sweeps/validate); the service log has the details.'
  return { kind: 'system', message: `${where} ${advice}` }
}

/** Redis lost the sweep's data (restart without persistence, or a flush) before it finished. */
export function dataLossFailure (): SweepFailure {
  return {
    kind: 'system',
    message: 'Redis lost this sweep\'s data (it restarted without persistence or was flushed) before the sweep finished; submit it again. Operators: enable appendonly on Redis.'
  }
}

/** A stored sweep whose plan this release cannot run. */
export function unresumableFailure (): SweepFailure {
  return {
    kind: 'system',
    message: 'The sweep could not be resumed after a restart: this version of the service cannot run its stored plan. Submit it again.'
  }
}

function firstLine (text: string): string {
  const line = text.split('\n', 1)[0] ?? ''
  return line.length > MAX_MESSAGE_LENGTH ? `${line.slice(0, MAX_MESSAGE_LENGTH - 1)}…` : line
}
