/** A sweep result's shape and its representations (canonical JSON, tidy CSV). */
export type { Provenance, ResultRow, SweepResult } from './types.js'
export { resultToJson, resultToCsv, type OutputOptions } from './output.js'
export { RESULT_SERIES, TRAJECTORY_PADDING, trajectoryCsv, trajectoryJson, trajectoryUnavailable, type ResultSeries } from './trajectory-output.js'
export { rowParams } from './row-params.js'
export { MEASURE_SIGNIFICANT_DIGITS, atPublishedPrecision, roundMeasure } from './precision.js'
export { DERIVED_COLUMNS, IDENTITY_COLUMNS, PARAMETER_COLUMNS } from './parameter-columns.js'
