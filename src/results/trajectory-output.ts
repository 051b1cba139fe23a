/**
 * The mean trajectories of a sweep as a series of their own: long-format CSV (one row per
 * grid point and sweep) and JSON (one entry per grid point). Both come from the rows'
 * `overlapTrajectory` / `energyTrajectory` summaries, which exist when the spec recorded
 * trajectories (measures.overlapTrajectory, measures.energyTrajectory).
 */
import type { TrajectorySummary } from '../engine/index.js'
import { canonicalJson } from '../spec/canonical.js'
import { atPublishedPrecision } from './precision.js'
import { pointLeadingCells, pointLeadingHeader } from './parameter-columns.js'
import type { NormalisedSpec } from '../spec/types.js'
import { toCsv, type CsvCell, type Table } from './csv.js'
import type { ResultRow, SweepResult } from './types.js'

/** The series a result offers besides its rows. */
export const RESULT_SERIES = ['trajectory'] as const
export type ResultSeries = typeof RESULT_SERIES[number]

/** How a trajectory that ended early is extended (stated in every trajectory output). */
export const TRAJECTORY_PADDING = 'A trial that stopped (fixed point or 2-cycle) before the longest trial of its point holds its last value from then on; `running` counts the trials still running at each sweep. Sweep 0 of the overlap is the cue.'

// MAIN //

/** Why a sweep has no trajectory series, or null when it has one (known from its spec alone). */
export function trajectoryUnavailable (spec: NormalisedSpec): string | null {
  if (spec.analysis !== undefined) return 'a threshold search keeps per-step summaries, not trajectories'
  const m = spec.measures
  if (!m.overlapTrajectory && !m.energyTrajectory) return 'the sweep recorded no trajectories; set measures.overlapTrajectory (or energyTrajectory) to true in the spec'
  return null
}

/**
 * Long-format CSV: the leading columns of every table (sweepId, specHash, seed, point, every
 * model parameter, alpha, alphaK), then `sweep`, `running`, and `overlap.mean|sd|se` and/or
 * `energy.mean|sd|se` for whichever trajectories were recorded (the energy has no sweep 0:
 * empty there), at the published precision.
 */
export function trajectoryCsv (exact: SweepResult, sweepId: string | null = null): string {
  const { header, rows } = trajectoryTable(exact, sweepId)
  return toCsv(header, rows)
}

/** The trajectory series as a table (what the CSV and the Arrow file hold). */
export function trajectoryTable (exact: SweepResult, sweepId: string | null = null): Table {
  const result = atPublishedPrecision(exact)
  const source = { sweepId, specHash: result.specHash, spec: result.spec }
  const { overlapTrajectory: withOverlap, energyTrajectory: withEnergy } = result.spec.measures
  const header = [
    ...pointLeadingHeader(), 'sweep', 'running',
    ...(withOverlap ? ['overlap.mean', 'overlap.sd', 'overlap.se'] : []),
    ...(withEnergy ? ['energy.mean', 'energy.sd', 'energy.se'] : [])
  ]
  const rows: CsvCell[][] = []
  for (const row of result.rows) {
    const overlap = row.summary.overlapTrajectory
    const energy = row.summary.energyTrajectory
    const [first, last] = sweepRange([overlap, energy])
    const lead = pointLeadingCells(source, row)
    for (let sweep = first; sweep <= last; sweep++) {
      rows.push([
        ...lead, sweep,
        (overlap !== undefined ? at(overlap, 'running', sweep) : undefined) ?? (energy !== undefined ? at(energy, 'running', sweep) : undefined),
        ...(withOverlap ? statCells(overlap, sweep) : []),
        ...(withEnergy ? statCells(energy, sweep) : [])
      ])
    }
  }
  return { header, rows }
}

/** JSON: the spec hash, the padding rule, and per grid point its values and trajectories (null where not recorded). */
export function trajectoryJson (exact: SweepResult): string {
  const result = atPublishedPrecision(exact)
  return canonicalJson({
    specHash: result.specHash,
    series: 'trajectory',
    padding: TRAJECTORY_PADDING,
    points: result.rows.map((row: ResultRow) => ({
      point: row.point,
      values: row.values,
      params: row.params,
      overlap: row.summary.overlapTrajectory ?? null,
      energy: row.summary.energyTrajectory ?? null
    }))
  }) + '\n'
}

/** First and last sweep covered by any of the trajectories. */
function sweepRange (trajectories: ReadonlyArray<TrajectorySummary | undefined>): [number, number] {
  let first = Infinity
  let last = -Infinity
  for (const t of trajectories) {
    if (t === undefined || t.mean.length === 0) continue
    first = Math.min(first, t.firstSweep)
    last = Math.max(last, t.firstSweep + t.mean.length - 1)
  }
  return Number.isFinite(first) ? [first, last] : [0, -1]
}

/** A trajectory's value at a sweep; past its end, its last value (`running`: 0). */
function at (t: TrajectorySummary, field: 'mean' | 'sd' | 'se' | 'running', sweep: number): number | undefined {
  const k = sweep - t.firstSweep
  if (k < 0 || t.mean.length === 0) return undefined
  if (k >= t.mean.length) return field === 'running' ? 0 : t[field][t.mean.length - 1]
  return t[field][k]
}

function statCells (t: TrajectorySummary | undefined, sweep: number): CsvCell[] {
  if (t === undefined) return [undefined, undefined, undefined]
  return [at(t, 'mean', sweep), at(t, 'sd', sweep), at(t, 'se', sweep)]
}
