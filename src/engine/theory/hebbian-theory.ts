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
import { rsCriticalLoadAt, rsRetrievalAt, rsRetrievalTemperature, type FiniteTemperatureRetrieval } from './rs-finite-temperature.js'
import { rsRetrievalOverlap } from './rs-retrieval-overlap.js'
import { spinGlassTemperature } from './spin-glass-temperature.js'

/** Below this load, finite-P results (mixture states) are used as the α → 0 limit. */
export const VANISHING_LOAD = 0.01

/**
 * Curie–Weiss (α → 0) stands for the finite-load RS overlap only where the two differ by at
 * most this much (or where P = 1, with no crosstalk at all).
 */
export const CURIE_WEISS_AGREEMENT = 1e-3

/** Glauber dynamics in equilibrium: asynchronous updates. */
const ASYNC = ['async-random', 'async-sequential'] as const

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

/** The finite-temperature RS solution at the point's (α, T) shares one evaluation between values. */
let lastRetrieval: { key: string, value: FiniteTemperatureRetrieval | null } | null = null
function retrievalAt (p: PointParams): FiniteTemperatureRetrieval | null {
  const key = `${loadOf(p)} ${p.dynamics.temperature}`
  if (lastRetrieval?.key !== key) lastRetrieval = { key, value: rsRetrievalAt(loadOf(p), p.dynamics.temperature) }
  return lastRetrieval.value
}

/** At T > 0 the equilibrium theory describes Glauber (asynchronous) dynamics, not parallel updates. */
const GLAUBER_AT_POSITIVE_T: DomainCondition = {
  holds: (p) => p.dynamics.temperature === 0 || p.dynamics.update !== 'sync',
  reason: 'dynamics-outside-domain',
  text: 'asynchronous updates when T > 0'
}

/** Whether the load changes the RS retrieval overlap by at most CURIE_WEISS_AGREEMENT at this T. */
function negligibleLoad (p: PointParams): boolean {
  if (p.patterns === 1) return true
  const retrieval = retrievalAt(p)
  const m = retrieval === null ? 0 : retrieval.m
  return Math.abs(m - curieWeissOverlap(p.dynamics.temperature)) <= CURIE_WEISS_AGREEMENT
}

export const VANISHING_LOAD_CONDITION: DomainCondition = { holds: (p) => loadOf(p) <= VANISHING_LOAD, reason: 'load-outside-domain', text: `α ≤ ${VANISHING_LOAD}` }

export const HEBBIAN_THEORY: TheoryModel = {
  name: 'hebbian',
  concerns: (p) => p.rule.kind === 'hebbian' && !isInDegree(p),
  covers: (p) => isUnbiasedPm1(p) && isUndiluted(p),
  entries: [
    { name: 'loadAlpha', domain: {}, evaluate: loadOf },
    { name: 'crosstalkErrorGaussian', domain: {}, evaluate: (p) => crosstalkErrorGaussian(loadOf(p), { selfCoupling: selfCoupled(p) }) },
    { name: 'crosstalkErrorExact', ties: 'keep', domain: {}, evaluate: (p) => exactCrosstalk(p).below },
    { name: 'crosstalkErrorExactTiesRandom', ties: 'random', domain: {}, evaluate: (p) => exactCrosstalk(p).below + exactCrosstalk(p).tie / 2 },
    { name: 'crosstalkTieExact', domain: {}, evaluate: (p) => exactCrosstalk(p).tie },
    {
      name: 'criticalLoad',
      domain: { selfCoupling: false, conditions: [GLAUBER_AT_POSITIVE_T] },
      evaluate: (p) => {
        const { alphaC } = p.dynamics.temperature === 0 ? rsCriticalLoad() : rsCriticalLoadAt(p.dynamics.temperature)
        return alphaC > 0 ? alphaC : 'no-retrieval-solution'
      }
    },
    {
      name: 'retrievalOverlapRS',
      domain: { selfCoupling: false, updates: ASYNC },
      // Past the retrieval boundary the RS states left (spin glass, paramagnet) have m = 0.
      evaluate: (p) => p.dynamics.temperature === 0 ? rsRetrievalOverlap(loadOf(p)) : (retrievalAt(p)?.m ?? 0)
    },
    {
      name: 'retrievalTemperature',
      domain: { selfCoupling: false, temperature: 'positive', updates: ASYNC },
      evaluate: (p) => rsRetrievalTemperature(loadOf(p)) ?? 'no-retrieval-solution'
    },
    {
      name: 'firstStepOverlap',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => firstParallelStep(flipCueOverlap(p), loadOf(p), { selfCoupling: selfCoupled(p) })
    },
    {
      name: 'firstStepOverlapExactTiesKeep',
      ties: 'keep',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => firstParallelStepExact(p.neurons, p.patterns, flipCueOverlap(p), { selfCoupling: selfCoupled(p), ties: 'keep' })
    },
    {
      name: 'firstStepOverlapExactTiesRandom',
      ties: 'random',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => firstParallelStepExact(p.neurons, p.patterns, flipCueOverlap(p), { selfCoupling: selfCoupled(p), ties: 'random' })
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
    { name: 'spinGlassTemperature', domain: { selfCoupling: false, temperature: 'positive', updates: ASYNC }, evaluate: (p) => spinGlassTemperature(loadOf(p)) },
    {
      name: 'curieWeissOverlap',
      domain: {
        temperature: 'positive',
        conditions: [{ holds: negligibleLoad, reason: 'load-outside-domain', text: `P = 1, or a load that moves the RS overlap by at most ${CURIE_WEISS_AGREEMENT}` }]
      },
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
