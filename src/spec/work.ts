/**
 * How much work a sweep is, from the engine's per-point cost model, and the service's
 * limits on it. Everything here uses counts and estimates only: a sweep is refused
 * before any network is allocated.
 */
import { estimatePointCost, type PointParams } from '../engine/index.js'
import { pointsToCheck } from './analysis/normalise.js'
import { searchTrialBudget } from './analysis/budget.js'
import { WorkLimitError, type WorkLimitName } from './errors.js'
import { countPoints, numericAxes, pointAt } from './grid.js'
import type { NormalisedSpec } from './types.js'

// VARIABLES //

/**
 * Engine operations per CPU second on one core, the unit of `cpuSeconds`. An operation is
 * one unit of the engine's cost model (estimatePointCost): a neuron visit costs
 * `opsPerVisit`, building a network `buildOpsPerNetwork`.
 *
 * Measured with `npx tsx test/spec/measure-throughput.ts`: eleven workloads (Hebbian T = 0
 * async and sync in overlap space from N = 200 to 4000, a new network per trial, Glauber,
 * pseudo-inverse, Storkey, covariance, diluted), each rate = modelled ops ÷ process CPU time
 * after a warm-up, on the development machine (2 vCPU, Node 20.20, after the overlap-space
 * kernel's cost was modelled as 2 + P/16 per visit): median 2.5e8; at 1.9e8 the estimate of a single
 * workload is between 0.4× and 9× its measured CPU time. We keep 1.9e8, so estimates err towards more
 * work; the large overlap-space networks, which settle in fewer sweeps than the model's ten,
 * are the ones overestimated most. Re-measure when the engine's kernels or cost model
 * change; only chunk sizes and the cpuSeconds estimate depend on it, never results.
 */
export const ENGINE_OPS_PER_CPU_SECOND = 1.9e8

/** Chunks aim at this much CPU time each (between ~1 and ~10 s on the measured machine). */
export const TARGET_CHUNK_SECONDS = 3

/**
 * Engine operations every trial costs besides its neuron visits: opening its streams, the
 * cue, the record. Measured with N = 10-100, P = 1-5 and 20 000 trials (a new network per
 * trial): 2 800-3 800 operations a trial (15-20 µs on the development machine under load);
 * without it a tiny network's CPU time was estimated 40-45× too low.
 */
export const TRIAL_OVERHEAD_OPS = 3000

/**
 * Stored size of one trial record, as chunks keep records (by column, sweep/trial-columns.ts):
 * a fixed part, what Glauber trials, mixture cues and the stability and pattern-overlap
 * measures add, and the doubles of each recorded trajectory. Measured per record: 45 B plain,
 * 58 B with stability, 113 B at T > 0, 77 B with a 3-component mixture cue, 82 B with pattern
 * overlaps, 3.4 kB with two 201-value trajectories (test/spec/work.test.ts checks the estimate
 * against encoded chunks).
 */
const STORED_BASE_BYTES = 56
const STORED_STABILITY_BYTES = 16
const STORED_THERMAL_BYTES = 75
const STORED_PATTERN_OVERLAP_BYTES = 45
const STORED_COMPONENT_BYTES = 12
const STORED_TRAJECTORY_VALUE_BYTES = 9

/**
 * Memory of one trial record held as a JavaScript object (arrays of doubles): a fixed part,
 * a stability summary, and each trajectory value.
 */
const MEMORY_BASE_BYTES = 400
const MEMORY_STABILITY_BYTES = 200
const MEMORY_TRAJECTORY_VALUE_BYTES = 20

/** A result row (summary, theory values) in stored form, and in JSON or CSV, per grid point. */
const ROW_BYTES = 4096

/** A chunk's trial records are kept to about this much memory (the plan cuts longer runs of trials). */
export const CHUNK_RECORD_BYTES = 32 * 1024 * 1024

export interface WorkLimits {
  /** Largest network size N at any grid point. */
  maxNeurons: number
  /** Most grid points. */
  maxPoints: number
  /** Most trials in total (points × trials per point). */
  maxTrials: number
  /** Largest estimated memory one worker holds while running a point, in bytes. */
  maxBytes: number
  /** Largest estimated total CPU time, in seconds (all workers together); omitted = no limit. */
  maxCpuSeconds?: number
  /** Largest estimated storage of one sweep: its trial records and its result, in bytes. */
  maxStoredBytes: number
}

/** Limits for a single shared machine; operators override them in the service config. */
export const DEFAULT_LIMITS: Readonly<Required<WorkLimits>> = Object.freeze({
  maxNeurons: 20_000,
  maxPoints: 10_000,
  maxTrials: 10_000_000,
  maxBytes: 1024 * 1024 * 1024,
  maxCpuSeconds: 24 * 3600,
  maxStoredBytes: 4 * 1024 * 1024 * 1024
})

export interface WorkEstimate {
  points: number
  /** Trials per grid point; for an analysis, the most a search may run (maxSteps × trials). */
  trialsPerPoint: number
  /** points × trialsPerPoint. */
  trials: number
  /** Expected neuron visits over the whole sweep. */
  neuronUpdates: number
  /**
   * Largest memory one worker holds at once, in bytes: the network and scratch of the costliest
   * point plus a chunk's trial records, or the trial records of one point while its result is
   * assembled, whichever is more.
   */
  peakBytes: number
  /** Estimated CPU time of the whole sweep on one core of the measured machine. */
  cpuSeconds: number
  /** Estimated storage of the sweep: every trial record (as chunks keep them) and the result rows, in bytes. */
  storedBytes: number
}

// MAIN //

/** The estimated work of one point's `trials` trials, in engine operations. */
export function pointOps (cost: ReturnType<typeof estimatePointCost>, trials: number, trialsPerNetwork: number): number {
  const networks = Math.ceil(trials / trialsPerNetwork)
  return trials * (cost.neuronUpdatesPerTrial * cost.opsPerVisit + TRIAL_OVERHEAD_OPS) + networks * cost.buildOpsPerNetwork
}

/** Values a trajectory of one trial may hold: one per sweep (or step), plus the start. */
function trajectoryLength (params: PointParams): number {
  return params.dynamics.maxSweeps + 1
}

/** Trajectories a trial record holds (overlap, energy). */
function trajectories (params: PointParams): number {
  return (params.measures.overlapTrajectory ? 1 : 0) + (params.measures.energyTrajectory ? 1 : 0)
}

/** Estimated stored size of one trial record of a point, in bytes. */
export function trialRecordBytes (params: PointParams): number {
  return STORED_BASE_BYTES +
    (params.measures.stability ? STORED_STABILITY_BYTES : 0) +
    (params.dynamics.temperature > 0 ? STORED_THERMAL_BYTES : 0) +
    (params.measures.patternOverlaps === true ? STORED_PATTERN_OVERLAP_BYTES : 0) +
    (params.cue.kind === 'mixture' ? params.cue.components * STORED_COMPONENT_BYTES : 0) +
    trajectories(params) * trajectoryLength(params) * STORED_TRAJECTORY_VALUE_BYTES
}

/** Estimated memory of one trial record of a point held as a JavaScript object, in bytes. */
export function trialRecordMemory (params: PointParams): number {
  return MEMORY_BASE_BYTES + (params.measures.stability ? MEMORY_STABILITY_BYTES : 0) + trajectories(params) * trajectoryLength(params) * MEMORY_TRAJECTORY_VALUE_BYTES
}

/** Trials one grid point may run: `trials`, or for a search its whole budget. */
export function trialsPerPoint (spec: NormalisedSpec): number {
  return spec.analysis === undefined ? spec.trials : searchTrialBudget(spec, spec.analysis)
}

/**
 * A search's steps lie between the ends of its range, so its cost is bounded by running
 * every step at the costlier end (per resource: the more trial work, the more memory).
 */
export function estimateWork (spec: NormalisedSpec): WorkEstimate {
  const points = countPoints(spec)
  const trials = trialsPerPoint(spec)
  // Each step of a search runs `trials` trials on networks of its own.
  const steps = spec.analysis?.maxSteps ?? 1
  let neuronUpdates = 0
  let ops = 0
  let peakBytes = 0
  let storedBytes = points * ROW_BYTES
  for (let index = 0; index < points; index++) {
    let pointUpdates = 0
    let pointWork = 0
    let pointStored = 0
    for (const { params } of spec.analysis === undefined ? [pointAt(spec, index)] : pointsToCheck(spec, index)) {
      const cost = estimatePointCost(params)
      pointUpdates = Math.max(pointUpdates, trials * cost.neuronUpdatesPerTrial)
      pointWork = Math.max(pointWork, steps * pointOps(cost, spec.trials, params.trialsPerNetwork))
      // A search keeps step summaries, not records: one step's records live at a time.
      const records = spec.analysis === undefined ? trials : spec.trials
      const recordsMemory = Math.min(records, maxChunkTrials(params)) * trialRecordMemory(params)
      peakBytes = Math.max(peakBytes, cost.bytes + recordsMemory, records * trialRecordMemory(params))
      if (spec.analysis === undefined) pointStored = Math.max(pointStored, trials * trialRecordBytes(params))
    }
    neuronUpdates += pointUpdates
    ops += pointWork
    storedBytes += pointStored
  }
  return {
    points,
    trialsPerPoint: trials,
    trials: points * trials,
    neuronUpdates,
    peakBytes,
    cpuSeconds: ops / ENGINE_OPS_PER_CPU_SECOND,
    storedBytes
  }
}

/** Most trials one chunk of this point may hold, so its records stay near CHUNK_RECORD_BYTES in memory. */
export function maxChunkTrials (params: PointParams): number {
  return Math.max(1, Math.floor(CHUNK_RECORD_BYTES / trialRecordMemory(params)))
}

/**
 * Refuses work over the limits, cheapest checks first: network size, grid points and
 * trials come from counts alone; memory and CPU time from the cost model.
 *
 * @throws {WorkLimitError} for the first limit exceeded.
 */
export function checkLimits (spec: NormalisedSpec, limits: WorkLimits): WorkEstimate {
  const largestN = largestNeurons(spec)
  exceeds('maxNeurons', largestN, limits.maxNeurons)
  const points = countPoints(spec)
  exceeds('maxPoints', points, limits.maxPoints)
  exceeds('maxTrials', points * trialsPerPoint(spec), limits.maxTrials)
  const estimate = estimateWork(spec)
  exceeds('maxBytes', estimate.peakBytes, limits.maxBytes)
  exceeds('maxStoredBytes', estimate.storedBytes, limits.maxStoredBytes)
  if (limits.maxCpuSeconds !== undefined) exceeds('maxCpuSeconds', Math.ceil(estimate.cpuSeconds), limits.maxCpuSeconds)
  return estimate
}

function exceeds (limit: WorkLimitName, value: number, max: number): void {
  if (value > max) throw new WorkLimitError(limit, value, max)
}

function largestNeurons (spec: NormalisedSpec): number {
  if (typeof spec.neurons === 'number') return spec.neurons
  const axis = numericAxes(spec).find((a) => a.path === 'neurons')
  return axis === undefined ? 0 : Math.max(...axis.values)
}
