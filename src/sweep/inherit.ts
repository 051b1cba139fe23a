/**
 * Taking stored trials of an earlier sweep as a chunk of this one: a whole stored chunk is
 * copied by the store; a run of trials inside one (a slice) is cut from its records and stored
 * as this sweep's own chunk. Either way the records are those a fresh run computes: a trial's
 * record depends on the seed, the point's parameters and its index only (compute-chunk.ts).
 */
import { decodeChunkValue, encodeChunkValue } from './codec.js'
import type { ChunkResult } from './compute-chunk.js'
import type { Chunk, InheritSource } from './plan.js'
import type { ChunkOutcome, SweepStore } from './store.js'

/** Stores the chunk from its source; null (left to compute) when the source is gone or holds other trials. */
export async function inheritStored (store: SweepStore, id: string, chunk: Chunk, from: InheritSource, nowMs: number): Promise<ChunkOutcome | null> {
  if (from.skip === undefined) return await store.inheritChunk(id, chunk, from, nowMs)
  const [stored] = await store.chunksBetween(from.sweepId, from.chunkIndex, 1)
  if (stored === undefined || stored.index !== from.chunkIndex) return null
  const source = decodeChunkValue<ChunkResult>(stored.body)
  const trials = source.trials.slice(from.skip, from.skip + chunk.count)
  if (source.search !== undefined || trials.length !== chunk.count) return null
  const slice: ChunkResult = { ...source, chunk: chunk.index, point: chunk.point, trials }
  return await store.recordChunk(id, chunk, encodeChunkValue(slice), 0, nowMs)
}
