/**
 * The spec layer: the contract of a sweep. What a sweep is (schema, normalisation, hash,
 * grid) and how much work it is (estimate, limits). Pure functions of their arguments; no
 * I/O. Running a sweep is src/sweep's job; representing its results, src/results'.
 */
export { SweepSpecSchema, SPEC_FORMAT_VERSION, SPEC_FORMAT_VERSIONS, SPEC_DEFAULTS, SPEC_CEILINGS, VARIED_PARAMETERS, CATEGORICAL_PARAMETERS, AXIS_ORDER, isCategoricalPath } from './schema.js'
export type { SweepSpecInput, VariedPath, CategoricalPath, AxisPath } from './schema.js'
export { MAX_AXIS_VALUES, AXIS_SIGNIFICANT_DIGITS, type Varied } from './axis.js'
export { ruleLabel, formatAxisValue, type AxisValue } from './categorical.js'
export type { NormalisedSpec, NormalisedFamily, NormalisedRule, NormalisedCue, NormalisedPrecision, ConstantRule, SelfCoupling } from './types.js'
export { SpecValidationError, WorkLimitError, WORK_LIMIT_NAMES } from './errors.js'
export type { SpecIssue, WorkLimitName } from './errors.js'
export { MAX_SPEC_ISSUES, normaliseSpec } from './normalise.js'
export { specHash, replicateKey, canonicalJson, sortKeysDeep } from './canonical.js'
export { countPoints, pointAt, gridAxes, numericAxes, isNumericAxis, patternsForLoad, type Axis, type NumericAxis, type CategoricalAxis, type GridPoint } from './grid.js'
export { estimateWork, checkLimits, DEFAULT_LIMITS, ENGINE_OPS_PER_CPU_SECOND, TARGET_CHUNK_SECONDS, TRIAL_OVERHEAD_OPS, pointOps, maxChunkTrials, trialRecordBytes, trialRecordMemory } from './work.js'
export type { WorkLimits, WorkEstimate } from './work.js'
export { searchTrialBudget } from './analysis/budget.js'
export { pointsToCheck, type CheckedPoint } from './analysis/normalise.js'
export type { NormalisedAnalysis, NormalisedScaling, SearchPayload, SearchRow, SearchStepRecord, ScalingRow, ScalingReference } from './analysis/types.js'
export { extendSpec, type SpecExtension } from './extend.js'
