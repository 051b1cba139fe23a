/**
 * The theory of the fully connected Hebbian network with ±1 neurons and unbiased random
 * patterns, and of the pseudo-inverse rule: every value with its domain (see domain.ts and
 * docs/theory.md).
 */
import type { PointParams } from '../params.js'
import type { SignProbabilities } from './binomial-walk.js'
import { crosstalkErrorExact } from './crosstalk-error-exact.js'
import { crosstalkErrorGaussian } from './crosstalk-error-gaussian.js'
import { curieWeissOverlap } from './curie-weiss-overlap.js'
import type { DomainCondition, TheoryModel } from './domain.js'
import { firstParallelStep } from './first-parallel-step.js'
import { firstParallelStepExact } from './first-parallel-step-exact.js'
import { mixtureOverlap } from './mixture-overlap.js'
import { rsCriticalLoad } from './rs-critical-load.js'
import { rsRetrievalOverlap } from './rs-retrieval-overlap.js'
import { spinGlassTemperature } from './spin-glass-temperature.js'

/** Below this load, finite-P results (mixture states) are used as the α → 0 limit. */
export const VANISHING_LOAD = 0.01

export const loadOf = (p: PointParams): number => p.patterns / p.neurons
const selfCoupled = (p: PointParams): boolean => 'selfCoupling' in p.rule && p.rule.selfCoupling

/** m₀ of a flip cue as the engine realises it: exactly round(fraction·N) flipped bits. */
export function flipCueOverlap (p: PointParams): number {
  if (p.cue.kind !== 'flip') throw new RangeError('invalid argument. The cue is not a flip cue.')
  return 1 - 2 * Math.round(p.cue.fraction * p.neurons) / p.neurons
}

export const isUnbiasedPm1 = (p: PointParams): boolean => p.coding === 'pm1' && p.family.kind === 'random' && p.family.activity === 0.5
/** No dilution, or a random dilution that keeps every coupling. */
export const isUndiluted = (p: PointParams): boolean => p.dilution === null || (p.dilution.kind !== 'fixed-in-degree' && p.dilution.keep === 1)
const isInDegree = (p: PointParams): boolean => p.dilution?.kind === 'fixed-in-degree'

/** The exact instability and tie probabilities share one evaluation. */
let lastCrosstalk: { key: string, value: SignProbabilities } | null = null
function exactCrosstalk (p: PointParams): SignProbabilities {
  const key = `${p.neurons} ${p.patterns} ${selfCoupled(p)}`
  if (lastCrosstalk?.key !== key) lastCrosstalk = { key, value: crosstalkErrorExact(p.neurons, p.patterns, { selfCoupling: selfCoupled(p) }) }
  return lastCrosstalk.value
}

export const VANISHING_LOAD_CONDITION: DomainCondition = { holds: (p) => loadOf(p) <= VANISHING_LOAD, reason: 'load-outside-domain', text: `α ≤ ${VANISHING_LOAD}` }

export const HEBBIAN_THEORY: TheoryModel = {
  name: 'hebbian',
  concerns: (p) => p.rule.kind === 'hebbian' && !isInDegree(p),
  covers: (p) => isUnbiasedPm1(p) && isUndiluted(p),
  entries: [
    { name: 'loadAlpha', domain: {}, evaluate: loadOf },
    { name: 'crosstalkErrorGaussian', domain: {}, evaluate: (p) => crosstalkErrorGaussian(loadOf(p), { selfCoupling: selfCoupled(p) }) },
    { name: 'crosstalkErrorExact', domain: {}, evaluate: (p) => exactCrosstalk(p).below },
    { name: 'crosstalkTieExact', domain: {}, evaluate: (p) => exactCrosstalk(p).tie },
    { name: 'criticalLoad', domain: { selfCoupling: false }, evaluate: () => rsCriticalLoad().alphaC },
    {
      name: 'retrievalOverlapRS',
      domain: { selfCoupling: false, temperature: 'zero', updates: ['async-random', 'async-sequential'] },
      evaluate: (p) => rsRetrievalOverlap(loadOf(p))
    },
    {
      name: 'firstStepOverlap',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => firstParallelStep(flipCueOverlap(p), loadOf(p), { selfCoupling: selfCoupled(p) })
    },
    {
      name: 'firstStepOverlapExact',
      ties: 'keep',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => firstParallelStepExact(p.neurons, p.patterns, flipCueOverlap(p), { selfCoupling: selfCoupled(p), ties: 'keep' })
    },
    {
      name: 'mixtureOverlap',
      domain: {
        temperature: 'zero',
        cues: ['mixture'],
        conditions: [
          { holds: (p) => p.cue.kind === 'mixture' && p.cue.components >= 3 && p.cue.components % 2 === 1, reason: 'cue-outside-domain', text: 'an odd number n ≥ 3 of components' },
          VANISHING_LOAD_CONDITION
        ]
      },
      evaluate: (p) => mixtureOverlap(p.cue.kind === 'mixture' ? p.cue.components : 0)
    },
    { name: 'spinGlassTemperature', domain: { temperature: 'positive' }, evaluate: (p) => spinGlassTemperature(loadOf(p)) },
    {
      name: 'curieWeissOverlap',
      domain: { temperature: 'positive', conditions: [VANISHING_LOAD_CONDITION] },
      evaluate: (p) => curieWeissOverlap(p.dynamics.temperature)
    }
  ]
}

/** Kanter & Sompolinsky, PRA 35, 380 (1987): the pseudo-inverse rule stores up to α = 1. */
export const PSEUDO_INVERSE_THEORY: TheoryModel = {
  name: 'pseudo-inverse',
  concerns: (p) => p.rule.kind === 'pseudo-inverse' && !isInDegree(p),
  covers: (p) => p.coding === 'pm1' && isUndiluted(p),
  entries: [
    { name: 'loadAlpha', domain: {}, evaluate: loadOf },
    { name: 'criticalLoad', domain: {}, evaluate: () => 1 }
  ]
}
