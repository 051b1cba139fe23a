import type { PointParams } from './params.js'
import type { TrialRecord } from './results.js'
import type { RandomSource } from './random/source.js'
import type { Network } from './network/network.js'
import type { Scratch } from './dynamics/scratch.js'
import { writeCue } from './dynamics/cue.js'
import { runDynamics } from './dynamics/run.js'
import { nominalMean } from './patterns/generate.js'
import { classifyEndState, maxOtherOverlap, normalisedOverlaps, targetOverlapOf } from './measures.js'

/**
 * One recall trial on a built network: cue towards pattern `target`, run the dynamics,
 * measure. Draws the cue first, then the update orders and thermal noise, all from `rng`.
 */
export function runTrialOn (net: Network, p: PointParams, trial: number, target: number, rng: RandomSource, scratch: Scratch): TrialRecord {
  const n = p.neurons
  const centre = nominalMean(p)
  writeCue(p.cue, net.patterns, n, p.patterns, target, rng, scratch)
  net.load(scratch.initial)
  const initialOverlap = targetOverlapOf(net, target, centre)
  const outcome = runDynamics(net, p.dynamics, rng, scratch, {
    targetOverlap: () => targetOverlapOf(net, target, centre),
    recordOverlap: p.measures.overlapTrajectory,
    recordEnergy: p.measures.energyTrajectory
  })
  const overlaps = scratch.overlaps
  normalisedOverlaps(net, centre, overlaps)
  const record: TrialRecord = {
    trial,
    target,
    initialOverlap,
    overlap: p.dynamics.temperature > 0 ? outcome.timeAveragedOverlap : overlaps[target]!,
    maxOtherOverlap: maxOtherOverlap(overlaps, p.patterns, target),
    sweeps: outcome.sweeps,
    ending: outcome.ending,
    energy: net.energyPerNeuron(),
    endState: classifyEndState(overlaps, p.patterns, target, n)
  }
  if (outcome.overlapTrajectory !== null) record.overlapTrajectory = outcome.overlapTrajectory
  if (outcome.energyTrajectory !== null) record.energyTrajectory = outcome.energyTrajectory
  return record
}
