/**
 * The messages between the embedded scheduler and its compute threads: run one chunk, or
 * assemble a finished sweep. Everything here survives the structured clone of
 * `postMessage`; chunk results travel as opaque encoded bytes, so the scheduler's thread
 * never decodes trial records it only has to store.
 */
import type { MessagePort } from 'node:worker_threads'
import type { NormalisedSpec } from '../../spec/index.js'
import type { Provenance } from '../../results/index.js'
import type { Chunk, ChunkRunOutcome, ClassifiedError, PointDecision, StoredChunk } from '../../sweep/index.js'

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
  plan: Chunk[]
  chunks: StoredChunk[]
  /** The run's timing; the thread adds the facts of its own process. */
  timing: { wallSeconds: number, cpuSeconds: number, workers: number }
}

/** Precision targets: after an open point's planned chunks are all stored, close it or give it another block. */
export interface DecideTask {
  kind: 'decide'
  spec: NormalisedSpec
  point: number
  /** The point's planned chunks and their stored bodies. */
  plan: Chunk[]
  chunks: StoredChunk[]
}

/** A no-op answered by a freshly started thread: proves the entry module loads. */
export interface PingTask {
  kind: 'ping'
}

export type ChunkTask = RunChunkTask | AssembleTask | DecideTask | PingTask

export interface ChunkProgressMessage {
  /** Trials of this chunk finished so far. */
  trialsDone: number
}

export type ChunkTaskOutcome =
  | ChunkRunOutcome
  | { kind: 'assembled', body: Uint8Array }
  | { kind: 'decided', decision: PointDecision }
  | { kind: 'pong', threadId: number }
  | { kind: 'failed', error: ClassifiedError }

export type { Provenance }
