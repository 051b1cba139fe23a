/**
 * Raised by a backend's `list` for a cursor it did not issue; the API answers 400 naming
 * the `cursor` parameter. Shared so that every backend rejects cursors the same way.
 */
export class InvalidCursorError extends RangeError {
  constructor (readonly cursor: string) {
    super('invalid argument. cursor: not a cursor issued by this service.')
    this.name = 'InvalidCursorError'
  }
}

/** Raised by `submit` when an Idempotency-Key is reused with a different spec (→ 422). */
export class IdempotencyConflictError extends Error {
  constructor (readonly key: string) {
    super(`Idempotency-Key '${key}' was already used with a different request body.`)
    this.name = 'IdempotencyConflictError'
  }
}

/** Raised by `submit` when the owner already has the most queued and running sweeps allowed (→ 429). */
export class ActiveSweepCapError extends Error {
  constructor (readonly owner: string | null, readonly active: number, readonly max: number) {
    super(`${owner === null ? 'This server' : `Owner '${owner}'`} already has ${active} active sweeps (at most ${max}).`)
    this.name = 'ActiveSweepCapError'
  }
}

/**
 * Raised by `submit` when the backend's storage cannot keep new work (the embedded data
 * directory vanished or was replaced): answered with 503. The cause, with its path, goes to
 * the service log only.
 */
export class StorageUnavailableError extends Error {
  constructor (readonly problem: string) {
    super('The storage of sweeps is unavailable.')
    this.name = 'StorageUnavailableError'
  }
}
