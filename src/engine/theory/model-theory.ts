/**
 * The theory of the model families beyond the fully connected coupling-matrix rules, every
 * value with its domain (see domain.ts and docs/theory.md). All assume ±1 neurons and
 * unbiased random patterns except the modern softmax network, whose bound holds for any
 * unit-length patterns.
 */
import type { PointParams } from '../params.js'
import type { SignProbabilities } from './binomial-walk.js'
import { clippedCrosstalkErrorExact, clippedCrosstalkErrorGaussian } from './clipped-crosstalk.js'
import { clippedCriticalLoad, clippedRetrievalOverlap } from './clipped-retrieval.js'
import { denseCapacity, denseCrosstalkErrorGaussian, exponentialCapacityExponent } from './dense-memory.js'
import { dilutedFirstStepExact, dilutedFixedPointExact } from './diluted-exact.js'
import { DILUTED_CRITICAL_LOAD, dilutedOverlapMap, dilutedRetrievalOverlap } from './diluted-overlap-map.js'
import type { TheoryModel } from './domain.js'
import { flipCueOverlap, isUnbiasedPm1, isUndiluted, loadOf } from './hebbian-theory.js'
import { softmaxSeparationThreshold } from './softmax-bound.js'

const isInDegree = (p: PointParams): boolean => p.dilution?.kind === 'fixed-in-degree'
const inDegreeOf = (p: PointParams): number => (p.dilution?.kind === 'fixed-in-degree' ? p.dilution.inDegree : p.neurons)
/** P/K, the load that matters under fixed in-degree K. */
export const dilutedLoadOf = (p: PointParams): number => p.patterns / inDegreeOf(p)
const selfCoupled = (p: PointParams): boolean => 'selfCoupling' in p.rule && p.rule.selfCoupling

let lastClipped: { key: string, value: SignProbabilities } | null = null
function exactClipped (p: PointParams): SignProbabilities {
  const key = `${p.neurons} ${p.patterns} ${selfCoupled(p)}`
  if (lastClipped?.key !== key) lastClipped = { key, value: clippedCrosstalkErrorExact(p.neurons, p.patterns, { selfCoupling: selfCoupled(p) }) }
  return lastClipped.value
}

export const CLIPPED_THEORY: TheoryModel = {
  name: 'clipped',
  concerns: (p) => p.rule.kind === 'clipped' && !isInDegree(p),
  covers: (p) => isUnbiasedPm1(p) && isUndiluted(p),
  entries: [
    { name: 'loadAlpha', domain: {}, evaluate: loadOf },
    { name: 'clippedCrosstalkErrorExact', domain: {}, evaluate: (p) => exactClipped(p).below },
    { name: 'clippedCrosstalkTieExact', domain: {}, evaluate: (p) => exactClipped(p).tie },
    { name: 'clippedCrosstalkErrorGaussian', domain: { selfCoupling: false }, evaluate: (p) => clippedCrosstalkErrorGaussian(loadOf(p)) },
    { name: 'clippedCriticalLoad', domain: { selfCoupling: false }, evaluate: () => clippedCriticalLoad().alphaC },
    {
      name: 'clippedRetrievalOverlap',
      domain: { selfCoupling: false, temperature: 'zero', updates: ['async-random', 'async-sequential'] },
      evaluate: (p) => clippedRetrievalOverlap(loadOf(p))
    }
  ]
}

export const DILUTED_THEORY: TheoryModel = {
  name: 'fixed-in-degree',
  concerns: isInDegree,
  covers: (p) => p.rule.kind === 'hebbian' && isUnbiasedPm1(p),
  entries: [
    { name: 'dilutedLoad', domain: {}, evaluate: dilutedLoadOf },
    { name: 'dilutedCriticalLoad', domain: {}, evaluate: () => DILUTED_CRITICAL_LOAD },
    { name: 'dilutedRetrievalOverlap', domain: { temperature: 'zero' }, evaluate: (p) => dilutedRetrievalOverlap(dilutedLoadOf(p)) },
    {
      name: 'dilutedFirstStepOverlap',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => dilutedOverlapMap(flipCueOverlap(p), dilutedLoadOf(p))
    },
    {
      name: 'dilutedFirstStepOverlapExactTiesKeep',
      ties: 'keep',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => dilutedFirstStepExact(p.neurons, inDegreeOf(p), p.patterns, flipCueOverlap(p), 'keep')
    },
    {
      name: 'dilutedFirstStepOverlapExactTiesRandom',
      ties: 'random',
      domain: { temperature: 'zero', updates: ['sync'], cues: ['flip'] },
      evaluate: (p) => dilutedFirstStepExact(p.neurons, inDegreeOf(p), p.patterns, flipCueOverlap(p), 'random')
    },
    {
      name: 'dilutedRetrievalOverlapExactTiesRandom',
      ties: 'random',
      domain: {
        temperature: 'zero',
        updates: ['sync'],
        cues: ['flip'],
        conditions: [{ holds: (p) => inDegreeOf(p) * inDegreeOf(p) <= p.neurons, reason: 'size-outside-domain', text: 'K² ≤ N (tree-like inputs over the first steps)' }]
      },
      evaluate: (p) => dilutedFixedPointExact(inDegreeOf(p), p.patterns, flipCueOverlap(p)) ?? 'not-converged'
    }
  ]
}

export const DENSE_POLYNOMIAL_THEORY: TheoryModel = {
  name: 'dense-polynomial',
  concerns: (p) => p.rule.kind === 'dense-polynomial',
  covers: isUnbiasedPm1,
  entries: [
    { name: 'denseCrosstalkErrorGaussian', domain: {}, evaluate: (p) => denseCrosstalkErrorGaussian(p.neurons, p.patterns, degreeOf(p)) },
    {
      name: 'denseCapacity',
      domain: { conditions: [{ holds: (p) => p.neurons >= 2, reason: 'size-outside-domain', text: 'N ≥ 2' }] },
      evaluate: (p) => denseCapacity(p.neurons, degreeOf(p))
    }
  ]
}

export const DENSE_EXPONENTIAL_THEORY: TheoryModel = {
  name: 'dense-exponential',
  concerns: (p) => p.rule.kind === 'dense-exponential',
  covers: isUnbiasedPm1,
  entries: [
    { name: 'exponentialLoad', domain: {}, evaluate: (p) => Math.log(p.patterns) / p.neurons },
    {
      name: 'exponentialCapacityExponent',
      domain: { cues: ['flip'] },
      // ρ = the cue's fraction of wrong bits; a flip fraction above ½ is a cue nearer the reversed pattern.
      evaluate: (p) => exponentialCapacityExponent(Math.min(0.5, (1 - flipCueOverlap(p)) / 2))
    }
  ]
}

export const SOFTMAX_THEORY: TheoryModel = {
  name: 'modern-softmax',
  concerns: (p) => p.rule.kind === 'modern-softmax',
  covers: (p) => p.coding === 'pm1',
  entries: [
    {
      name: 'softmaxSeparationThreshold',
      domain: { conditions: [{ holds: (p) => p.patterns >= 2, reason: 'size-outside-domain', text: 'P ≥ 2' }] },
      evaluate: (p) => softmaxSeparationThreshold(p.patterns, p.rule.kind === 'modern-softmax' ? p.rule.beta : NaN)
    }
  ]
}

function degreeOf (p: PointParams): number {
  return p.rule.kind === 'dense-polynomial' ? p.rule.degree : NaN
}
