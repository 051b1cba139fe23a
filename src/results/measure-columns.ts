/**
 * CSV columns of the measures that apply to some sweeps only: the stability spread over
 * networks, the T > 0 time averages with their final snapshots, a mixture cue's components,
 * the stored patterns' overlap statistics, and the load per input under a fixed in-degree.
 * A column group is present when the sweep has the measure (decided from the spec and the
 * rows, so a sweep's header never depends on which point is read first); column names follow
 * the JSON paths.
 */
import { END_STATES, type MeanWithError, type PointSummary, type TrialRecord } from '../engine/index.js'
import type { CsvCell } from './csv.js'
import type { NormalisedSpec } from '../spec/types.js'

/** Which optional groups a sweep's CSV holds. */
export interface MeasureLayout {
  stabilitySpread: boolean
  thermal: boolean
  /** Mixture-cue components (0 = none); component 0 is the target. */
  components: number
  patternOverlaps: boolean
}

const STABILITY_FIELDS = ['unstableFraction', 'tieFraction', 'fixedPatternFraction'] as const
const PATTERN_OVERLAP_STATS = ['mean', 'meanAbs', 'rms', 'maxAbs'] as const

// MAIN //

export function measureLayout (spec: NormalisedSpec, summaries: readonly PointSummary[]): MeasureLayout {
  return {
    stabilitySpread: spec.measures.stability,
    thermal: summaries.some((s) => s.endStateShares !== undefined),
    components: summaries.reduce((most, s) => Math.max(most, s.componentOverlaps?.length ?? 0), 0),
    patternOverlaps: spec.measures.patternOverlaps === true
  }
}

/** Point columns: after the summary columns of summary-cells.ts. */
export function measureHeader (layout: MeasureLayout): string[] {
  return [
    ...(layout.stabilitySpread ? STABILITY_FIELDS.flatMap((f) => [`stability.sd.${f}`, `stability.se.${f}`]) : []),
    ...(layout.thermal
      ? [
          ...END_STATES.map((s) => `endStateShares.${s}`),
          ...END_STATES.map((s) => `finalEndStates.${s}`),
          ...meanHeader('finalMaxOtherOverlap'),
          ...meanHeader('finalEnergy')
        ]
      : []),
    ...range(layout.components).flatMap((k) => meanHeader(`componentOverlaps.${k}`)),
    ...(layout.patternOverlaps
      ? [
          'patternOverlaps.networks', 'patternOverlaps.pairs',
          ...PATTERN_OVERLAP_STATS.flatMap((stat) => meanHeader(`patternOverlaps.${stat}`)),
          ...PATTERN_OVERLAP_STATS.map((stat) => `patternOverlaps.expected.${stat}`)
        ]
      : [])
  ]
}

export function measureCells (s: PointSummary, layout: MeasureLayout): CsvCell[] {
  const st = s.stability
  const po = s.patternOverlaps
  return [
    ...(layout.stabilitySpread ? STABILITY_FIELDS.flatMap((f) => [st?.sd[f], st?.se[f]]) : []),
    ...(layout.thermal
      ? [
          ...END_STATES.map((state) => s.endStateShares?.[state]),
          ...END_STATES.map((state) => s.finalEndStates?.[state]),
          ...meanCells(s.finalMaxOtherOverlap),
          ...meanCells(s.finalEnergy)
        ]
      : []),
    ...range(layout.components).flatMap((k) => meanCells(s.componentOverlaps?.[k])),
    ...(layout.patternOverlaps
      ? [
          po?.networks, po?.pairs,
          ...PATTERN_OVERLAP_STATS.flatMap((stat) => meanCells(po?.[stat])),
          ...PATTERN_OVERLAP_STATS.map((stat) => po?.expected[stat])
        ]
      : [])
  ]
}

/** Per-trial columns: after the trial record's own columns. */
export function trialMeasureHeader (layout: MeasureLayout): string[] {
  return [
    ...(layout.thermal ? ['finalEndState', 'finalMaxOtherOverlap', 'finalEnergy', ...END_STATES.map((s) => `endStateShares.${s}`)] : []),
    ...range(layout.components).map((k) => `componentOverlaps.${k}`),
    ...(layout.patternOverlaps ? ['patternOverlaps.pairs', ...PATTERN_OVERLAP_STATS.map((stat) => `patternOverlaps.${stat}`)] : [])
  ]
}

export function trialMeasureCells (t: TrialRecord, layout: MeasureLayout): CsvCell[] {
  const po = t.patternOverlaps
  return [
    ...(layout.thermal ? [t.finalEndState, t.finalMaxOtherOverlap, t.finalEnergy, ...END_STATES.map((s) => t.endStateShares?.[s])] : []),
    ...range(layout.components).map((k) => t.componentOverlaps?.[k]),
    ...(layout.patternOverlaps ? [po?.pairs, ...PATTERN_OVERLAP_STATS.map((stat) => po?.[stat])] : [])
  ]
}

function meanHeader (name: string): string[] {
  return [`${name}.mean`, `${name}.sd`, `${name}.se`]
}

function meanCells (m: MeanWithError | undefined): CsvCell[] {
  return [m?.mean, m?.sd, m?.se]
}

function range (n: number): number[] {
  return Array.from({ length: n }, (_, k) => k)
}
