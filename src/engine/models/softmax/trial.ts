import type { PointParams } from '../../params.js'
import type { StabilityRecord, TrialRecord } from '../../results.js'
import type { RandomSource } from '../../random/source.js'
import { createScratch, type Scratch } from '../../dynamics/scratch.js'
import { writeCue } from '../../dynamics/cue.js'
import { maxOtherOverlap } from '../../measures.js'
import { classifierFor, componentOverlaps } from '../../trial-measures.js'
import type { SoftmaxMemory } from './memory.js'

/** The iteration has converged (`fixed`) once an update moves the state by less than this (patterns have unit length). */
export const SOFTMAX_TOLERANCE = 1e-9

/** Buffers reused across the trials of one grid point. */
export interface SoftmaxScratch {
  cue: Scratch
  state: Float64Array
  next: Float64Array
  overlaps: Float64Array
}

export function createSoftmaxScratch (dimension: number, patterns: number): SoftmaxScratch {
  return {
    cue: createScratch(dimension, patterns),
    state: new Float64Array(dimension),
    next: new Float64Array(dimension),
    overlaps: new Float64Array(patterns)
  }
}

/**
 * One recall trial of the modern continuous Hopfield network: the cue (a stored pattern
 * with flipped or erased entries, a mixture or a random state, drawn exactly as for the
 * spin models) scaled to σ/√d, then ξ ← X softmax(β Xᵀξ) until an update moves ξ by less
 * than SOFTMAX_TOLERANCE in Euclidean norm (`fixed`) or `maxSweeps` updates (`max`).
 * `sweeps` counts updates, the last included. Overlaps are x^μᵀξ (see memory.ts), `energy`
 * is E(ξ) itself (not divided by d), and the end state is classified on those overlaps.
 * The update is parallel by nature, so `dynamics.update` does not apply; T must be 0.
 */
export function runSoftmaxTrial (mem: SoftmaxMemory, p: PointParams, trial: number, target: number, rng: RandomSource, scratch: SoftmaxScratch): TrialRecord {
  const d = mem.dimension
  writeCue(p.cue, mem.patterns, d, mem.patternCount, target, rng, scratch.cue)
  const scale = 1 / Math.sqrt(d)
  let state = scratch.state
  let next = scratch.next
  for (let i = 0; i < d; i++) state[i] = scratch.cue.initial[i]! * scale
  const targetOverlap = (x: Float64Array): number => {
    let dot = 0
    for (let i = 0; i < d; i++) dot += mem.patterns[target * d + i]! * x[i]!
    return dot * scale
  }
  const overlapTrajectory = p.measures.overlapTrajectory ? [] as number[] : null
  const energyTrajectory = p.measures.energyTrajectory ? [] as number[] : null
  const initialOverlap = targetOverlap(state)
  let sweeps = 0
  let ending: TrialRecord['ending'] = 'max'
  for (let sweep = 1; sweep <= p.dynamics.maxSweeps; sweep++) {
    sweeps = sweep
    mem.update(state, next)
    let moved = 0
    for (let i = 0; i < d; i++) moved += (next[i]! - state[i]!) ** 2
    const swap = state
    state = next
    next = swap
    overlapTrajectory?.push(targetOverlap(state))
    energyTrajectory?.push(mem.energy(state))
    if (Math.sqrt(moved) < SOFTMAX_TOLERANCE) {
      ending = 'fixed'
      break
    }
  }
  const overlaps = scratch.overlaps
  mem.overlaps(state, overlaps)
  const record: TrialRecord = {
    trial,
    target,
    initialOverlap,
    overlap: overlaps[target]!,
    maxOtherOverlap: maxOtherOverlap(overlaps, mem.patternCount, target),
    sweeps,
    ending,
    energy: mem.energy(state, overlaps),
    endState: classifierFor(p).classify(overlaps, mem.patternCount, target)
  }
  if (p.cue.kind === 'mixture') record.componentOverlaps = componentOverlaps(overlaps, mem.patternCount, target, p.cue.components)
  if (overlapTrajectory !== null) record.overlapTrajectory = overlapTrajectory
  if (energyTrajectory !== null) record.energyTrajectory = energyTrajectory
  return record
}

/**
 * One-update stability of every stored pattern: apply f(ξ) = X softmax(β Xᵀξ) once to
 * ξ = x^μ and count the entries whose sign disagrees with ξ^μ (`unstable`) or that are exactly
 * 0 (`tie`); a pattern is fixed when no entry disagrees. The continuous analogue of the
 * spin models' one-step stability. Costs O(P²·d).
 */
export function softmaxStability (mem: SoftmaxMemory, scratch: SoftmaxScratch): StabilityRecord {
  const d = mem.dimension
  const p = mem.patternCount
  const scale = 1 / Math.sqrt(d)
  let unstable = 0
  let ties = 0
  let fixed = 0
  for (let mu = 0; mu < p; mu++) {
    for (let i = 0; i < d; i++) scratch.state[i] = mem.patterns[mu * d + i]! * scale
    mem.update(scratch.state, scratch.next)
    let flips = 0
    for (let i = 0; i < d; i++) {
      const aligned = mem.patterns[mu * d + i]! * scratch.next[i]!
      if (aligned < 0) flips++
      else if (aligned === 0) ties++
    }
    unstable += flips
    if (flips === 0) fixed++
  }
  return { unstableFraction: unstable / (d * p), tieFraction: ties / (d * p), fixedPatternFraction: fixed / p }
}
