/**
 * How chunk results and assembled results are written to storage. The V8 serializer keeps
 * every double bit-exact, including −0, NaN and ±Infinity, which JSON would turn into 0 or
 * null; that exactness is what lets a sweep resumed from storage give the same bytes as an
 * uninterrupted one. Its wire format is versioned and read back by later Node releases.
 */
import { deserialize, serialize } from 'node:v8'

/** Stored beside each body so a later format change can still read old rows. */
export const CODEC_NAME = 'v8'

export function encodeValue (value: unknown): Uint8Array {
  const buffer = serialize(value)
  // A view of exactly the serialized bytes, never of a shared pool.
  return new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength)
}

export function decodeValue<T> (body: Uint8Array, codec: string = CODEC_NAME): T {
  if (codec !== CODEC_NAME) throw new Error(`Unknown result codec '${codec}'.`)
  return deserialize(body) as T
}
