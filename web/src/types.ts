/** The API's shapes as the page reads them (openapi/openapi.json is the full description). */

export type SweepStatusName = 'queued' | 'running' | 'succeeded' | 'failed' | 'canceled'

export const STATUS_NAMES: readonly SweepStatusName[] = ['queued', 'running', 'succeeded', 'failed', 'canceled']

export interface SweepProgress {
  pointsDone: number
  pointsTotal: number
  trialsDone: number
  trialsTotal: number
  chunksDone: number
  chunksTotal: number
  fraction: number
  elapsedSeconds: number | null
  estimatedSecondsLeft: number | null
}

export interface SweepStatus {
  id: string
  status: SweepStatusName
  label: string | null
  owner: string | null
  specHash: string
  createdAt: string
  startedAt: string | null
  finishedAt: string | null
  progress: SweepProgress
  error: { kind: 'user' | 'system', message: string } | null
  reusedFrom: string | null
}

export interface SweepDetail extends SweepStatus {
  spec: Spec
}

export interface SweepList {
  items: SweepStatus[]
  nextCursor: string | null
}

/** A spec as JSON: the page edits it as a plain object. */
export type Spec = Record<string, unknown>

export interface FieldIssue {
  path: string
  pointer?: string
  message: string
}

export interface Problem {
  type?: string
  title?: string
  status: number
  detail?: string
  code?: string
  errors?: FieldIssue[]
  retryAfter?: number
  limit?: { name: string, value: number, max: number }
}

export interface WorkEstimate {
  points: number
  trialsPerPoint: number
  trials: number
  neuronUpdates: number
  peakBytes: number
  cpuSeconds: number
}

export interface Validation {
  specHash: string
  spec: Spec
  work: WorkEstimate
  limits: { maxNeurons: number, maxPoints: number, maxTrials: number, maxBytes: number, maxCpuSeconds: number | null }
  exceeded: { name: string, value: number, max: number } | null
}

export interface MeanWithError { mean: number | null, sd: number | null, se: number | null }

export interface ResultRow {
  point: number
  values: Record<string, number>
  params: { alpha: number, neurons: number, patterns: number }
  summary: {
    trials: number
    overlap: MeanWithError
    success: { count: number, rate: number | null, low: number | null, high: number | null }
    sweeps: MeanWithError
    maxOtherOverlap: MeanWithError
    energy: MeanWithError
    endings: Record<string, number>
    endStates: Record<string, number>
    stability: { networks: number, unstableFraction: number | null, tieFraction: number | null, fixedPatternFraction: number | null } | null
  }
  theory: Record<string, number | null>
}

export interface SearchStep {
  step: number
  value: number
  side: 'above' | 'below'
  params: { alpha: number, neurons: number, patterns: number }
  summary: ResultRow['summary']
}

/** One threshold search of an analysis spec. */
export interface SearchRow {
  search: number
  values: Record<string, number>
  neurons: number
  estimate: number | null
  low: number | null
  high: number | null
  stoppedBy: string
  bracket: { low: number, high: number } | null
  fit: { method: string, estimate: number | null, low: number | null, high: number | null, slope: number | null, separated: boolean, dispersion: number | null } | null
  note: string | null
  stepsUsed: number
  trialsUsed: number
  steps: SearchStep[]
}

/** One finite-size fit of an analysis spec with `analysis.scaling`. */
export interface ScalingRow {
  values: Record<string, number>
  form: string
  fit: {
    limit: { value: number, se: number | null }
    limitInterval: { low: number, high: number, confidence: number }
    amplitude: { value: number, se: number | null }
    exponent: { value: number, se: number | null }
    chiSquare: number
    degreesOfFreedom: number
  } | null
  sizes: Array<{ search: number, neurons: number, estimate: number, se: number }>
  excluded: Array<{ search: number, neurons: number, reason: string }>
  references: Array<{ name: string, value: number, uncertainty: number | null, source: string, deviation: number | null }>
  note: string | null
}

export interface SweepResult {
  specHash: string
  spec: Spec
  /** One per grid point; empty for an analysis (see searches). */
  rows: ResultRow[]
  searches?: SearchRow[]
  scaling?: ScalingRow[]
  provenance: Record<string, string | number | undefined>
}
