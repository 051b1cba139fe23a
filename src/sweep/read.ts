/**
 * Reading what a store holds for a sweep, the same way for every backend: its stored chunks
 * in bounded slices (an event-loop turn between slices, so a large read never holds up other
 * requests), the bytes of a finished result with the chunks that hold its trials, the trial
 * records themselves, and the stored state of an unfinished sweep for partial results.
 */
import { setImmediate as yieldToEventLoop } from 'node:timers/promises'
import type { TrialRecord } from '../engine/index.js'
import type { NormalisedSpec } from '../spec/index.js'
import type { SweepResult } from '../results/types.js'
import { storedTrials } from './assemble.js'
import { decodeValue } from './codec.js'
import type { Chunk } from './plan.js'
import type { StoredChunk } from './assemble.js'
import type { SweepStore } from './store.js'

/** Most chunks read per slice. */
export const READ_SLICE_CHUNKS = 64

/**
 * Bytes a slice aims at: reading is synchronous in the embedded store and copies what it
 * reads, so a slice of 64 chunks of a per-trial sweep (up to ~16 MB each) held the event loop
 * for hundreds of milliseconds. The first slice is one chunk; later slices take as many chunks
 * as fit this budget at the sizes seen so far (between 1 and READ_SLICE_CHUNKS).
 */
export const READ_SLICE_BYTES = 16 * 1024 * 1024

/** A finished result's stored bytes, with the plan and chunks that hold its trials when asked for. */
export interface EncodedResult {
  /** The encoded SweepResult (rows or searches and provenance; `trials` empty unless stored by an earlier release). */
  result: Uint8Array
  trials: { plan: Chunk[], chunks: StoredChunk[] } | null
}

/** What an unfinished sweep has stored: enough to assemble the rows of its finished points. */
export interface StoredProgress {
  spec: NormalisedSpec
  plan: Chunk[]
  chunks: StoredChunk[]
  /** Points still taking trial blocks (precision targets): their rows are not final. */
  openPoints: number[]
}

/** Every stored chunk of a plan of `planLength` chunks, ascending, read a slice at a time. */
export async function readChunks (store: Pick<SweepStore, 'chunksBetween'>, id: string, planLength: number): Promise<StoredChunk[]> {
  const chunks: StoredChunk[] = []
  let count = 1
  let seenChunks = 0
  let seenBytes = 0
  for (let from = 0; from < planLength; from += count) {
    if (from > 0) {
      await yieldToEventLoop()
      count = seenChunks === 0 ? READ_SLICE_CHUNKS : Math.max(1, Math.min(READ_SLICE_CHUNKS, Math.floor(READ_SLICE_BYTES * seenChunks / Math.max(1, seenBytes))))
    }
    const slice = await store.chunksBetween(id, from, Math.min(count, planLength - from))
    for (const chunk of slice) {
      seenBytes += chunk.body.byteLength
      chunks.push(chunk)
    }
    seenChunks += slice.length
  }
  return chunks
}

export async function readEncodedResult (store: SweepStore, id: string, options: { trials: boolean }): Promise<EncodedResult | null> {
  const result = await store.resultBody(id)
  if (result === null) return null
  if (!options.trials) return { result, trials: null }
  const plan = await store.trialsPlan(id)
  if (plan === null) return { result, trials: null }
  return { result, trials: { plan: plan.chunks, chunks: await readChunks(store, id, plan.chunks.length) } }
}

export async function readResult (store: SweepStore, id: string): Promise<SweepResult | null> {
  const body = await store.resultBody(id)
  return body === null ? null : decodeValue<SweepResult>(body)
}

/** trials[point][trial] of a succeeded sweep, from its stored chunks. */
export async function readTrials (store: SweepStore, id: string): Promise<TrialRecord[][] | null> {
  const encoded = await readEncodedResult(store, id, { trials: true })
  if (encoded === null) return null
  const result = decodeValue<SweepResult>(encoded.result)
  // Results stored before chunks were kept hold their trials themselves.
  if (result.trials.length > 0 || result.spec.analysis !== undefined || encoded.trials === null) return result.trials
  return storedTrials(result.spec, encoded.trials.plan, encoded.trials.chunks)
}

export async function readStoredProgress (store: SweepStore, id: string): Promise<StoredProgress | null> {
  const [record, plan] = await Promise.all([store.get(id), store.trialsPlan(id)])
  if (record === null || plan === null) return null
  return { spec: record.spec, plan: plan.chunks, chunks: await readChunks(store, id, plan.chunks.length), openPoints: await store.openPoints(id) }
}
