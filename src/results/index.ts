/** A sweep result's shape and its representations (canonical JSON, tidy CSV; Apache Arrow in arrow-output.ts, loaded only where it is written). */
export type { Provenance, ResultRow, SweepResult } from './types.js'
export { resultToJson, resultToCsv, resultTable, type OutputOptions } from './output.js'
export { RESULT_SERIES, TRAJECTORY_PADDING, trajectoryCsv, trajectoryTable, trajectoryJson, trajectoryUnavailable, type ResultSeries } from './trajectory-output.js'
export { rowParams } from './row-params.js'
export { MEASURE_SIGNIFICANT_DIGITS, atPublishedPrecision, roundMeasure } from './precision.js'
export { DERIVED_COLUMNS, IDENTITY_COLUMNS, PARAMETER_COLUMNS } from './parameter-columns.js'
export { columnType, type ColumnType } from './column-types.js'
export type { CsvCell, Table } from './csv.js'
