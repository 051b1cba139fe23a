/**
 * The spec layer: what a sweep is (schema, normalisation, hash, grid), how much work it is
 * (estimate, limits), and the execution core every backend shares (chunks, assembly,
 * output). Pure functions of their arguments; no I/O.
 */
export { SweepSpecSchema, SPEC_FORMAT_VERSION, SPEC_DEFAULTS, SPEC_CEILINGS, VARIED_PARAMETERS } from './schema.js'
export type { SweepSpecInput, VariedPath } from './schema.js'
export { MAX_AXIS_VALUES, AXIS_SIGNIFICANT_DIGITS, type Varied } from './axis.js'
export type { NormalisedSpec, NormalisedFamily, NormalisedRule, NormalisedCue } from './types.js'
export { SpecValidationError, WorkLimitError, ChunkCanceledError, IncompleteResultError } from './errors.js'
export type { SpecIssue, WorkLimitName } from './errors.js'
export { MAX_SPEC_ISSUES, normaliseSpec } from './normalise.js'
export { specHash, canonicalJson } from './canonical.js'
export { countPoints, pointAt, gridAxes, patternsForLoad, type Axis, type GridPoint } from './grid.js'
export { estimateWork, checkLimits, DEFAULT_LIMITS, ENGINE_OPS_PER_CPU_SECOND, TARGET_CHUNK_SECONDS } from './work.js'
export type { WorkLimits, WorkEstimate } from './work.js'
export { dispatchOrder, planChunks, runChunk, type Chunk, type ChunkResult, type RunChunkOptions } from './chunks.js'
export { assembleResult, makeProvenance, type Provenance, type ResultRow, type SweepResult } from './assemble.js'
export { resultToJson, resultToCsv, type OutputOptions } from './output.js'
export { searchStreamPoint, SEARCH_STREAM_OFFSET, SEARCH_STEP_STRIDE } from './analysis/run.js'
export { SIMULATED_CAPACITY, RS_CAPACITY_SOURCE } from './analysis/scaling.js'
export type { NormalisedAnalysis, NormalisedScaling, SearchPayload, SearchRow, SearchStepRecord, ScalingRow, ScalingReference } from './analysis/types.js'
