/**
 * A sweep result as bytes: canonical JSON, or tidy CSV (one row per grid point, or one
 * per trial). Both depend on the result's content only, never on how it was computed.
 */
import type { TrialRecord } from '../engine/index.js'
import { searchTable } from './search-output.js'
import type { ResultRow, SweepResult } from './types.js'
import { canonicalJson } from '../spec/canonical.js'
import { atPublishedPrecision, roundCell } from './precision.js'
import { pointLeadingCells, pointLeadingHeader, type RowSource } from './parameter-columns.js'
import { toCsv, type CsvCell, type Table } from './csv.js'
import { summaryCells, summaryHeader } from './summary-cells.js'
import { measureCells, measureHeader, measureLayout, trialMeasureCells, trialMeasureHeader, type MeasureLayout } from './measure-columns.js'

export interface OutputOptions {
  /** Include every trial's record (JSON: the `trials` member; CSV: one row per trial). */
  perTrial: boolean
  /**
   * JSON only: keep the run's timing (wallSeconds, cpuSeconds, workers) in the provenance.
   * Off by default so that the same spec gives byte-identical results whatever ran it,
   * however often it was interrupted. @defaultValue false
   */
  timing?: boolean
  /** CSV and Arrow: the sweep's id for the `sweepId` column (null or absent: a local run, an empty cell). */
  sweepId?: string | null
}

/** Provenance members that describe one run rather than the result. */
const RUN_TIMING = ['wallSeconds', 'cpuSeconds', 'workers'] as const

// MAIN //

/**
 * The result as canonical JSON (sorted keys, no whitespace, one trailing newline), its
 * measures at the published precision (precision.ts). Without perTrial the `trials` member is
 * left out; without timing the run's timing is. Non-finite numbers become null.
 */
export function resultToJson (result: SweepResult, opts: OutputOptions): string {
  const { trials, provenance, ...rest } = atPublishedPrecision(result)
  const kept: Record<string, unknown> = { ...provenance }
  if (opts.timing !== true) for (const key of RUN_TIMING) delete kept[key]
  const body = { ...rest, provenance: kept }
  return canonicalJson(opts.perTrial ? { ...body, trials } : body) + '\n'
}

/**
 * The result as tidy CSV, measures at the published precision. Every row starts with the
 * same columns whatever the sweep varies (parameter-columns.ts): sweepId, specHash, seed,
 * point, every model parameter (varied or fixed) and alpha, alphaK.
 * Per point, then: trials, overlap/sweeps/maxOtherOverlap/energy mean·sd·se, success
 * count·rate·low·high (Wilson 95 %), ending and end-state counts, stability (when measured),
 * the optional measure groups (measure-columns.ts) and one `theory.<name>` column per theory
 * value of the model (empty where the value is unavailable: the JSON says why, in
 * `theoryUnavailable`).
 * Per trial, then: the trial record (trajectories are JSON-only). An analysis gives one row per
 * search, or with perTrial one per evaluated step (see search-output.ts).
 * docs/data-dictionary.md describes every column.
 */
export function resultToCsv (result: SweepResult, opts: OutputOptions): string {
  const { header, rows } = resultTable(result, opts)
  return toCsv(header, rows)
}

/** The table the CSV (and the Arrow file) holds: its header and rows of cells. */
export function resultTable (result: SweepResult, opts: OutputOptions): Table {
  const rounded = atPublishedPrecision(result)
  const source: RowSource = { sweepId: opts.sweepId ?? null, specHash: result.specHash, spec: result.spec }
  if (rounded.searches !== undefined) return searchTable(source, rounded.searches, opts.perTrial)
  // Per trial from the exact records, so `success` agrees with the counts whatever the rounding.
  return opts.perTrial ? trialTable(source, result) : pointTable(source, rounded)
}

function pointTable (source: RowSource, result: SweepResult): Table {
  // One column per theory value of the sweep's model, available or not (a stable set of
  // columns for a model); a value unavailable at a point is an empty cell there.
  // theory.loadAlpha (= P/N) is left out: the `alpha` column states it once.
  const theoryNames = [...new Set(result.rows.flatMap((row) => [...Object.keys(row.theory), ...Object.keys(row.theoryUnavailable ?? {})]))].filter((name) => name !== 'loadAlpha').sort()
  const stability = result.spec.measures.stability
  const layout = measureLayout(result.spec, result.rows.map((row) => row.summary))
  const header = [
    ...pointLeadingHeader(),
    ...summaryHeader(stability),
    ...measureHeader(layout),
    ...theoryNames.map((name) => `theory.${name}`)
  ]
  const rows = result.rows.map((row) => [
    ...pointLeadingCells(source, row),
    ...summaryCells(row.summary, stability),
    ...measureCells(row.summary, layout),
    ...theoryNames.map((name) => row.theory[name])
  ])
  return { header, rows }
}

function trialTable (source: RowSource, result: SweepResult): Table {
  const stability = result.spec.measures.stability
  const layout: MeasureLayout = measureLayout(result.spec, result.rows.map((row) => row.summary))
  const header = [
    ...pointLeadingHeader(),
    'trial', 'target', 'initialOverlap', 'overlap', 'success', 'maxOtherOverlap', 'sweeps', 'ending', 'energy', 'endState',
    ...(stability ? ['stability.unstableFraction', 'stability.tieFraction', 'stability.fixedPatternFraction'] : []),
    ...trialMeasureHeader(layout)
  ]
  const rows: CsvCell[][] = []
  for (const row of result.rows) {
    const lead = pointLeadingCells(source, row)
    const threshold = successThresholdAt(result, row)
    for (const t of result.trials[row.point] ?? []) rows.push([...lead, ...[...trialCells(t, threshold, stability), ...trialMeasureCells(t, layout)].map(roundCell)])
  }
  return { header, rows }
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
