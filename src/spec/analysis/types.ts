/** The normalised `analysis` member of a spec, and what a search chunk and an assembled search hold. */
import type { AxisValue } from '../categorical.js'
import type { CrossingEstimate, Direction, FiniteSizeFit, SearchMeasure, StopReason } from '../../engine/analysis/index.js'
import type { PointSummary } from '../../engine/index.js'

export type NormalisedScaling = { form: 'power', exponent: number | null } | { form: 'linear-inverse' }

export interface NormalisedThresholdAnalysis {
  kind: 'threshold'
  /** A varied-parameter path (see SEARCHABLE_PARAMETERS). */
  parameter: string
  measure: SearchMeasure
  level: number
  from: number
  to: number
  direction: Direction
  maxSteps: number
  tolerance: number
  confidence: number
  scaling: NormalisedScaling | null
}

export type NormalisedAnalysis = NormalisedThresholdAnalysis

/** One evaluated value of the searched parameter. */
export interface SearchStepRecord {
  step: number
  /** The value run (after rounding to whole patterns or flipped bits where the parameter needs it). */
  value: number
  side: 'above' | 'below'
  params: { alpha: number, neurons: number, patterns: number }
  summary: PointSummary
}

/** A search chunk's result: plain JSON data (no NaN, no −0 that matters, no typed arrays), so JSON and the V8 serializer both keep it. */
export interface SearchPayload {
  stoppedBy: StopReason
  estimate: number | null
  low: number | null
  high: number | null
  bracket: { low: number, high: number } | null
  fit: CrossingEstimate | null
  note: string | null
  steps: SearchStepRecord[]
}

/** One search in an assembled result. */
export interface SearchRow extends SearchPayload {
  /** Index of the search = its point in the grid of the other varied parameters. */
  search: number
  /** The other varied parameters of this search, by path (a rule axis gives the rule's label). */
  values: Record<string, AxisValue>
  neurons: number
  stepsUsed: number
  trialsUsed: number
}

export interface ScalingReference {
  name: 'rs-theory' | 'finite-size-simulations'
  value: number
  /** Quoted uncertainty, or null for a theory value. */
  uncertainty: number | null
  source: string
  /** (x_∞ − value) / √(se² + uncertainty²): how many combined standard errors apart. */
  deviation: number | null
}

export interface ScalingRow {
  /** The varied parameters other than `neurons` shared by the searches of this fit ({} when only N varies). */
  values: Record<string, AxisValue>
  form: NormalisedScaling['form']
  /** The fit, or null when too few searches gave a bounded estimate. */
  fit: (FiniteSizeFit & { limitInterval: { low: number, high: number, confidence: number } }) | null
  /** The estimates that entered the fit; se = interval width / (2z). */
  sizes: Array<{ search: number, neurons: number, estimate: number, se: number }>
  /** Searches left out, with the reason. */
  excluded: Array<{ search: number, neurons: number, reason: string }>
  references: ScalingReference[]
  note: string | null
}
