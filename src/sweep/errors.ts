/** Errors of running and assembling a sweep's chunks. */

/** `runChunk` noticed a stop request between two trials; the chunk's partial work is discarded. */
export class ChunkCanceledError extends Error {
  readonly chunk: number
  readonly trialsDone: number

  constructor (chunk: number, trialsDone: number) {
    super(`Chunk ${chunk} was canceled after ${trialsDone} trial${trialsDone === 1 ? '' : 's'}.`)
    this.name = 'ChunkCanceledError'
    this.chunk = chunk
    this.trialsDone = trialsDone
    Object.setPrototypeOf(this, new.target.prototype)
  }
}

/** `assembleResult` was given chunk results that do not cover every trial of every point exactly once. */
export class IncompleteResultError extends Error {
  readonly problems: string[]

  constructor (problems: string[]) {
    super(`Cannot assemble the sweep result: ${problems.slice(0, 3).join('; ')}${problems.length > 3 ? `; and ${problems.length - 3} more` : ''}.`)
    this.name = 'IncompleteResultError'
    this.problems = problems
    Object.setPrototypeOf(this, new.target.prototype)
  }
}

/** A stored chunk was computed by another engine release than the one assembling the sweep. */
export class EngineMixError extends Error {
  constructor (readonly chunk: number, readonly computedBy: string, readonly assembledBy: string) {
    super(`Chunk ${chunk} was computed by engine ${computedBy}; this release runs engine ${assembledBy}.`)
    this.name = 'EngineMixError'
    Object.setPrototypeOf(this, new.target.prototype)
  }
}
