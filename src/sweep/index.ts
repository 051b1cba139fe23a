/**
 * The sweep lifecycle, one home for both backends and the CLI: the plan stored with a
 * sweep, the one chunk runner, the assembler, the states and counters, the failure texts
 * and the storage contract. See README.md for the flow.
 */
export { PLAN_VERSION, planSweep, checkPlan, dispatchOrder, chunksPerPoint, encodePlan, decodePlan, type Chunk, type SweepPlan } from './plan.js'
export { computeChunk, pointStreamKey, POINT_KEYING, type ChunkResult, type ComputeChunkOptions } from './compute-chunk.js'
export { runChunk, type ChunkRunHooks, type ChunkRunOutcome } from './run-chunk.js'
export { assembleResult, assembleStored, assemblePartial, storedTrials, makeProvenance, type RunTiming, type StoredChunk } from './assemble.js'
export {
  SWEEP_STATUSES, ACTIVE_STATUSES, TERMINAL_STATUSES, FAILURE_KINDS, isTerminal, canMove, progressCounters, planComplete,
  type SweepStatus, type FailureKind, type SweepFailure, type SweepProgress
} from './state.js'
export {
  classifyChunkError, systemCauseOf, userFailure, systemFailure, dataLossFailure, unresumableFailure,
  SYSTEM_CAUSES, CHUNK_CANCELED_ERROR_NAME, THREAD_CRASH_ERROR_NAME, THREAD_OUT_OF_MEMORY_ERROR_NAME,
  type ClassifiedError, type SystemCause
} from './failure.js'
export { CODEC_NAME, encodeValue, decodeValue, encodeChunkValue, decodeChunkValue } from './codec.js'
export { ChunkCanceledError, EngineMixError, IncompleteResultError } from './errors.js'
export { searchStreamPoint, SEARCH_STREAM_OFFSET, SEARCH_STEP_STRIDE } from './analysis/run-search.js'
export { SIMULATED_CAPACITY, RS_CAPACITY_SOURCE } from './analysis/scaling.js'
export { ANY_OWNER } from './store.js'
export type {
  SweepStore, SweepRecord, SweepDraft, CreateOptions, CreateOutcome, IdempotencyBinding, ChunkOutcome, Transition, ListQuery, SweepPage
} from './store.js'
export { SWEEP_ID_MAX_LENGTH, SWEEP_ID_PATTERN, isSweepId, newSweepId } from './ids.js'
export { planWithReuse, pointPieces, initialTrials, trialsEnd, type ReusableRange, type PlanWithReuse } from './plan.js'
export { reuseKeysOf } from './reuse.js'
export { decidePoint, precisionHalfWidth, precisionOutcome, type PointDecision } from './precision.js'
export { applyBlock, type AppliedBlock } from './blocks.js'
export { pointRecords } from './assemble.js'
export { readChunks, readEncodedResult, readResult, readStoredProgress, readTrials, READ_SLICE_BYTES, READ_SLICE_CHUNKS, type EncodedResult, type StoredProgress } from './read.js'
export { chunkCpuSeconds } from './chunk-cost.js'
export {
  CALLBACK_STATES, DEFAULT_CALLBACK_RETRY, CallbackDispatcher, callbackEvent, callbackRetryDelayMs,
  type CallbackDelivery, type CallbackEvent, type CallbackOutbox, type CallbackRetryPolicy, type CallbackSender, type CallbackSettlement,
  type CallbackState, type CallbackStatus, type CallbackDispatcherOptions
} from './callbacks.js'
export { submitToStore, type SubmitRequest, type SubmitOutcome } from './submit.js'
export type { Annotation, StoredRange } from './store.js'
