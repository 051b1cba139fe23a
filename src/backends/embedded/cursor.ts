/**
 * Opaque list cursors: the position (creation time, insertion sequence) of the last item
 * of a page. Keyset positions neither skip nor repeat items when sweeps are added between
 * two page reads.
 */
import { InvalidCursorError } from '../errors.js'

export { InvalidCursorError }

export interface ListPosition {
  createdMs: number
  seq: number
}

export function encodeCursor (position: ListPosition): string {
  return Buffer.from(`${position.createdMs}.${position.seq}`, 'utf8').toString('base64url')
}

export function decodeCursor (cursor: string): ListPosition {
  const text = Buffer.from(cursor, 'base64url').toString('utf8')
  const match = /^(\d{1,15})\.(\d{1,15})$/.exec(text)
  if (match === null || encodeCursor({ createdMs: Number(match[1]), seq: Number(match[2]) }) !== cursor) {
    throw new InvalidCursorError(cursor)
  }
  return { createdMs: Number(match[1]), seq: Number(match[2]) }
}
