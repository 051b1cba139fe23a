/** The shape of a sweep's result: what the assembler produces and every output renders. */
import type { ENGINE_TIE_RULE, PointSummary, TrialRecord, UnavailableReason } from '../engine/index.js'
import type { AxisValue, NormalisedSpec, ScalingRow, SearchRow } from '../spec/index.js'

/** Where and how a result was computed. Timing describes one run; everything else the code. */
export interface Provenance {
  specHash: string
  engineVersion: string
  /** Node.js version of the assembling process. */
  node: string
  /** V8 version; Math.exp and friends may change with it. */
  v8: string
  /** Random number algorithm and stream derivation. */
  rng: string
  /** How a grid point's streams are keyed (by its model parameters, not its position). */
  pointKeying: string
  /** T = 0 tie rule of the dynamics: `keep` = a zero local field leaves the neuron's state unchanged. */
  tieRule: typeof ENGINE_TIE_RULE
  /** Wall-clock seconds from the first chunk started to the last one finished. */
  wallSeconds: number
  /** CPU seconds summed over all chunks. */
  cpuSeconds: number
  /** Worker threads or processes that ran chunks, when known. */
  workers?: number
  /** Name of an accelerated code path used by the workers, when one was. */
  fastPath?: string
}

export interface ResultRow {
  point: number
  /** The varied parameters at this point, by path (a rule axis gives the rule's label, a self-coupling axis true/false). */
  values: Record<string, AxisValue>
  /**
   * N, P and the realised load α = P/N (load per neuron); under a fixed in-degree K also
   * `inDegreeLoad` = P/K (load per input), the load that matters there.
   */
  params: { alpha: number, neurons: number, patterns: number, inDegreeLoad?: number }
  summary: PointSummary
  /** Theory values that apply at this point, by name. */
  theory: Record<string, number>
  /** The model's other theory values, by name: why each is missing here (reason codes: docs/theory.md). */
  theoryUnavailable: Record<string, UnavailableReason>
  /** With precision targets: the 95 % half-width this point reached with its trials, and whether it met the target. */
  precision?: { measure: 'success' | 'overlap', target: number, halfWidth: number, met: boolean }
}

export interface SweepResult {
  specHash: string
  spec: NormalisedSpec
  /** One row per grid point (empty for an analysis: see `searches`). */
  rows: ResultRow[]
  /**
   * trials[point][trial]. Empty in a stored result: stores keep trial records in their chunks
   * and attach them only when a reader asks for them (and always empty for an analysis,
   * which keeps per-step summaries instead).
   */
  trials: TrialRecord[][]
  /** Analysis specs only: one threshold search per point of the outer grid. */
  searches?: SearchRow[]
  /** Analysis specs with a scaling fit only: one fit per combination of the other varied parameters. */
  scaling?: ScalingRow[]
  provenance: Provenance
  /** Present only on partial results (a sweep not finished, canceled or failed): the rows are those of the points finished so far. */
  partial?: { pointsDone: number, pointsTotal: number }
}
