/**
 * Results as Apache Arrow IPC files: the tables of output.ts and trajectory-output.ts through
 * arrow.ts. A module of its own, imported only where files are rendered (the API's rendering
 * thread, tests), so processes that never write Arrow never load the apache-arrow package.
 */
import { toArrow } from './arrow.js'
import { resultTable, type OutputOptions } from './output.js'
import { MEASURE_SIGNIFICANT_DIGITS } from './precision.js'
import { trajectoryTable } from './trajectory-output.js'
import type { SweepResult } from './types.js'

/**
 * The same table as the CSV, as an Apache Arrow IPC file (arrow.ts): typed columns, nulls for
 * empty cells, the spec hash and the measures' precision in the schema's metadata.
 */
export function resultToArrow (result: SweepResult, opts: OutputOptions): Uint8Array {
  return toArrow(resultTable(result, opts), arrowMetadata(result))
}

export function arrowMetadata (result: SweepResult): Record<string, string> {
  return { 'memsweep.specHash': result.specHash, 'memsweep.measureDigits': String(MEASURE_SIGNIFICANT_DIGITS), 'memsweep.dictionary': 'docs/data-dictionary.md' }
}

/** The trajectory series as an Apache Arrow IPC file: the CSV's columns, typed. */
export function trajectoryArrow (exact: SweepResult, sweepId: string | null = null): Uint8Array {
  return toArrow(trajectoryTable(exact, sweepId), { 'memsweep.specHash': exact.specHash, 'memsweep.series': 'trajectory' })
}
