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
