import type { PointParams } from './params.js'
import type { TrialRecord } from './results.js'
import type { RandomSource } from './random/source.js'
import type { Network, ThermalTotals } from './network/network.js'
import type { Scratch } from './dynamics/scratch.js'
import { writeCue } from './dynamics/cue.js'
import { runDynamics } from './dynamics/run.js'
import { nominalMean } from './patterns/generate.js'
import { maxOtherOverlap, normalisedOverlaps, targetOverlapOf } from './measures.js'
import { classifierFor, componentOverlaps, ThermalAverages } from './trial-measures.js'

/**
 * One recall trial on a built network: cue towards pattern `target`, run the dynamics,
 * measure. Draws the cue first, then the update orders and thermal noise, all from `rng`.
 * Measuring draws nothing, so what is measured never changes a trial.
 *
 * At T > 0 the overlap, the largest other overlap, the energy and the end state describe the
 * measured sweeps (after burn-in): time averages, with the end state classified on the
 * time-averaged overlaps and the share of sweeps in each class; the state after the last
 * sweep is kept under the `final…` names.
 */
export function runTrialOn (net: Network, p: PointParams, trial: number, target: number, rng: RandomSource, scratch: Scratch): TrialRecord {
  const n = p.neurons
  const centre = nominalMean(p)
  const classifier = classifierFor(p)
  writeCue(p.cue, net.patterns, n, p.patterns, target, rng, scratch)
  net.load(scratch.initial)
  const initialOverlap = targetOverlapOf(net, target, centre)
  const thermal = p.dynamics.temperature > 0
  const averages = thermal ? new ThermalAverages(p.patterns, target, classifier, scratch.overlapSums) : null
  const outcome = runDynamics(net, p.dynamics, rng, scratch, {
    targetOverlap: () => targetOverlapOf(net, target, centre),
    recordOverlap: p.measures.overlapTrajectory,
    recordEnergy: p.measures.energyTrajectory,
    ...(averages === null
      ? {}
      : {
          sample: () => {
            normalisedOverlaps(net, centre, scratch.overlaps)
            averages.add(scratch.overlaps, net.energyPerNeuron())
          },
          // A fast path takes the samples of unbiased patterns (o_μ = m_μ/N) itself.
          ...(centre === 0 ? { nativeSampling: { sampling: averages.nativeSampling(p.dynamics.burnIn), absorb: (totals: ThermalTotals) => { averages.absorb(totals) } } } : {})
        })
  })
  const overlaps = scratch.overlaps
  normalisedOverlaps(net, centre, overlaps)
  const finalEnergy = net.energyPerNeuron()
  const finalOther = maxOtherOverlap(overlaps, p.patterns, target)
  const finalState = classifier.classify(overlaps, p.patterns, target)
  let record: TrialRecord
  if (averages === null || averages.count === 0) {
    record = {
      trial,
      target,
      initialOverlap,
      overlap: thermal ? outcome.timeAveragedOverlap : overlaps[target]!,
      maxOtherOverlap: finalOther,
      sweeps: outcome.sweeps,
      ending: outcome.ending,
      energy: finalEnergy,
      endState: finalState
    }
    if (p.cue.kind === 'mixture') record.componentOverlaps = componentOverlaps(overlaps, p.patterns, target, p.cue.components)
  } else {
    const mean = averages.meanOverlaps()
    // The same number as `overlap`, so `target` and success agree exactly.
    mean[target] = outcome.timeAveragedOverlap
    record = {
      trial,
      target,
      initialOverlap,
      overlap: outcome.timeAveragedOverlap,
      maxOtherOverlap: averages.meanMaxOther(),
      sweeps: outcome.sweeps,
      ending: outcome.ending,
      energy: averages.meanEnergy(),
      endState: classifier.classify(mean, p.patterns, target),
      endStateShares: averages.shares(),
      finalEndState: finalState,
      finalMaxOtherOverlap: finalOther,
      finalEnergy
    }
    if (p.cue.kind === 'mixture') record.componentOverlaps = componentOverlaps(mean, p.patterns, target, p.cue.components)
  }
  if (outcome.overlapTrajectory !== null) record.overlapTrajectory = outcome.overlapTrajectory
  if (outcome.energyTrajectory !== null) record.energyTrajectory = outcome.energyTrajectory
  return record
}
