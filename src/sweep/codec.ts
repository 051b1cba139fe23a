/**
 * How chunk results and assembled results are written to storage. The V8 serializer keeps
 * every double bit-exact, including −0, NaN and ±Infinity, which JSON would turn into 0 or
 * null; that exactness is what lets a sweep resumed from storage give the same bytes as an
 * uninterrupted one. Its wire format is versioned and read back by later Node releases.
 */
import { deserialize, serialize } from 'node:v8'
import { fromColumns, toColumns, type RecordColumns } from './trial-columns.js'

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

/**
 * A chunk's body: its value with the trial records stored by column (trial-columns.ts)
 * under `trialColumns` in place of `trials`. Same codec: the body is still one V8 value, and
 * bodies stored with the records as they are (before columns, or records of no common
 * shape) read as before.
 */
export function encodeChunkValue<T extends { trials: readonly unknown[] }> (value: T): Uint8Array {
  const columns = toColumns(value.trials)
  if (columns === null) return encodeValue(value)
  const { trials, ...rest } = value
  return encodeValue({ ...rest, trialColumns: columns })
}

/** The value `encodeChunkValue` stored, records rebuilt, or a body stored with its records as they are. */
export function decodeChunkValue<T extends { trials: unknown[] }> (body: Uint8Array, codec: string = CODEC_NAME): T {
  const value = decodeValue<Record<string, unknown>>(body, codec)
  if (value.trialColumns === undefined) return value as T
  const { trialColumns, ...rest } = value
  return { ...rest, trials: fromColumns(trialColumns as RecordColumns) } as unknown as T
}
