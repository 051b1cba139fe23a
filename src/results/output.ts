/**
 * A sweep result as bytes: canonical JSON, or tidy CSV (one row per grid point, or one
 * per trial). Both depend on the result's content only, never on how it was computed.
 */
import type { TrialRecord } from '../engine/index.js'
import { searchCsv } from './search-output.js'
import type { ResultRow, SweepResult } from './types.js'
import { canonicalJson } from '../spec/canonical.js'
import { toCsv, type CsvCell } from './csv.js'
import { gridAxes } from '../spec/grid.js'
import { summaryCells, summaryHeader } from './summary-cells.js'
import { hasInDegreeLoad, measureCells, measureHeader, measureLayout, trialMeasureCells, trialMeasureHeader, type MeasureLayout } from './measure-columns.js'

export interface OutputOptions {
  /** Include every trial's record (JSON: the `trials` member; CSV: one row per trial). */
  perTrial: boolean
  /**
   * JSON only: keep the run's timing (wallSeconds, cpuSeconds, workers) in the provenance.
   * Off by default so that the same spec gives byte-identical results whatever ran it,
   * however often it was interrupted. @defaultValue false
   */
  timing?: boolean
}

/** Provenance members that describe one run rather than the result. */
const RUN_TIMING = ['wallSeconds', 'cpuSeconds', 'workers'] as const

// MAIN //

/**
 * The result as canonical JSON (sorted keys, no whitespace, one trailing newline).
 * Without perTrial the `trials` member is left out; without timing the run's timing is.
 * Non-finite numbers become null.
 */
export function resultToJson (result: SweepResult, opts: OutputOptions): string {
  const { trials, provenance, ...rest } = result
  const kept: Record<string, unknown> = { ...provenance }
  if (opts.timing !== true) for (const key of RUN_TIMING) delete kept[key]
  const body = { ...rest, provenance: kept }
  return canonicalJson(opts.perTrial ? { ...body, trials } : body) + '\n'
}

/**
 * The result as tidy CSV. Per point: point, the varied parameters (by path), neurons,
 * patterns and alpha (= P/N; unless already varied), trials, overlap/sweeps/maxOtherOverlap/energy mean·sd·se, success
 * count·rate·low·high (Wilson 95 %), ending and end-state counts, stability (when measured)
 * and one `theory.<name>` column per theory value of the model (empty where the value is
 * unavailable: the JSON says why, in `theoryUnavailable`).
 * Per trial: point, varied parameters, neurons, patterns, alpha, then the trial record
 * (trajectories are JSON-only). An analysis gives one row per search, or with perTrial one
 * per evaluated step (see analysis/output.ts).
 */
export function resultToCsv (result: SweepResult, opts: OutputOptions): string {
  if (result.searches !== undefined) return searchCsv(result, result.searches, opts.perTrial)
  return opts.perTrial ? trialCsv(result) : pointCsv(result)
}

const PARAM_COLUMNS = ['neurons', 'patterns', 'alpha', 'inDegreeLoad'] as const

/**
 * N, P, α = P/N and (under a fixed in-degree) the load per input P/K follow the varied
 * columns, except those already among them (a varied N or P).
 */
function paramColumns (result: SweepResult): Array<typeof PARAM_COLUMNS[number]> {
  const varied = new Set<string>(gridAxes(result.spec).map((axis) => axis.path))
  const perInput = hasInDegreeLoad(result)
  return PARAM_COLUMNS.filter((name) => !varied.has(name) && (name !== 'inDegreeLoad' || perInput))
}

function leadingHeader (result: SweepResult): string[] {
  return ['point', ...gridAxes(result.spec).map((axis) => axis.path), ...paramColumns(result)]
}

function leadingCells (result: SweepResult, row: ResultRow): CsvCell[] {
  return [row.point, ...gridAxes(result.spec).map((axis) => row.values[axis.path]), ...paramColumns(result).map((name) => row.params[name])]
}

function pointCsv (result: SweepResult): string {
  // One column per theory value of the sweep's model, available or not (a stable set of
  // columns for a model); a value unavailable at a point is an empty cell there.
  const theoryNames = [...new Set(result.rows.flatMap((row) => [...Object.keys(row.theory), ...Object.keys(row.theoryUnavailable ?? {})]))].sort()
  const stability = result.spec.measures.stability
  const layout = measureLayout(result, result.rows.map((row) => row.summary))
  const header = [
    ...leadingHeader(result),
    ...summaryHeader(stability),
    ...measureHeader(layout),
    ...theoryNames.map((name) => `theory.${name}`)
  ]
  const rows = result.rows.map((row) => [
    ...leadingCells(result, row),
    ...summaryCells(row.summary, stability),
    ...measureCells(row.summary, layout),
    ...theoryNames.map((name) => row.theory[name])
  ])
  return toCsv(header, rows)
}

function trialCsv (result: SweepResult): string {
  const stability = result.spec.measures.stability
  const layout: MeasureLayout = measureLayout(result, result.rows.map((row) => row.summary))
  const header = [
    ...leadingHeader(result),
    'trial', 'target', 'initialOverlap', 'overlap', 'success', 'maxOtherOverlap', 'sweeps', 'ending', 'energy', 'endState',
    ...(stability ? ['stability.unstableFraction', 'stability.tieFraction', 'stability.fixedPatternFraction'] : []),
    ...trialMeasureHeader(layout)
  ]
  const rows: CsvCell[][] = []
  for (const row of result.rows) {
    const lead = leadingCells(result, row)
    const threshold = successThresholdAt(result, row)
    for (const t of result.trials[row.point] ?? []) rows.push([...lead, ...trialCells(t, threshold, stability), ...trialMeasureCells(t, layout)])
  }
  return toCsv(header, rows)
}

function trialCells (t: TrialRecord, threshold: number, stability: boolean): CsvCell[] {
  return [
    t.trial, t.target, t.initialOverlap, t.overlap, t.overlap >= threshold ? 1 : 0, t.maxOtherOverlap, t.sweeps, t.ending, t.energy, t.endState,
    ...(stability ? [t.stability?.unstableFraction, t.stability?.tieFraction, t.stability?.fixedPatternFraction] : [])
  ]
}

function successThresholdAt (result: SweepResult, row: ResultRow): number {
  const value = result.spec.successThreshold
  return typeof value === 'number' ? value : row.values.successThreshold as number
}
