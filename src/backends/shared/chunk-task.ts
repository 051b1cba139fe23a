/**
 * The messages between a backend's scheduler and the thread that computes: one chunk of
 * trials, or the final assembly of a sweep's chunks. Everything here must survive the
 * structured clone of `postMessage`; results travel as opaque encoded bytes so the
 * scheduler's thread never decodes trial records it only has to store.
 */
import type { MessagePort } from 'node:worker_threads'
import type { Chunk, NormalisedSpec, Provenance } from '../../spec/index.js'
import type { ClassifiedError } from './failure.js'

export interface RunChunkTask {
  kind: 'run'
  spec: NormalisedSpec
  chunk: Chunk
  /** 1 on the first try; passed along for logs and for fault-injection fixtures. */
  attempt: number
  /** Int32 flag shared by every chunk of one sweep: non-zero means stop between trials. */
  stopFlag: SharedArrayBuffer
  /** Receives `ChunkProgressMessage`s while the chunk runs. */
  progressPort: MessagePort
  /** Minimum milliseconds between two progress messages. */
  progressIntervalMs: number
}

export interface AssembleTask {
  kind: 'assemble'
  spec: NormalisedSpec
  /** Encoded chunk results in chunk-index order (see trial-codec.ts). */
  chunks: Uint8Array[]
  provenance: Provenance
}

/** A no-op answered by a freshly started thread: proves the entry module loads. */
export interface PingTask {
  kind: 'ping'
}

export type ChunkTask = RunChunkTask | AssembleTask | PingTask

export interface ChunkProgressMessage {
  /** Trials of this chunk finished so far. */
  trialsDone: number
}

export type ChunkTaskOutcome =
  | { kind: 'chunk-done', body: Uint8Array, trials: number, computeMs: number }
  | { kind: 'assembled', body: Uint8Array }
  | { kind: 'pong', threadId: number }
  | { kind: 'stopped' }
  | { kind: 'failed', error: ClassifiedError }
