import { describe, expect, it } from 'vitest'
import { countPoints, estimateWork, normaliseSpec, pointAt, specHash, SpecValidationError, type SpecIssue } from '../../src/spec/index.js'
import { assembleResult, makeProvenance, planSweep, computeChunk } from '../../src/sweep/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

function issuesOf (input: unknown): SpecIssue[] {
  try {
    normaliseSpec(input)
  } catch (error) {
    if (error instanceof SpecValidationError) return error.issues
    throw error
  }
  throw new Error('expected the spec to be refused')
}

const paths = (input: unknown) => issuesOf(input).map((issue) => issue.path)

describe('model families in the sweep spec', () => {
  it('normalises each new rule and dilution, and the normalised form is a fixed point', () => {
    const specs = [
      { neurons: 100, load: 0.05, rule: { kind: 'clipped' } },
      { neurons: 64, patterns: 100, rule: { kind: 'dense-polynomial', degree: 3 } },
      { neurons: 32, patterns: 500, rule: { kind: 'dense-exponential' } },
      { neurons: 64, patterns: 50, rule: { kind: 'modern-softmax', beta: 8 } },
      { neurons: 2000, patterns: 10, dilution: { kind: 'fixed-in-degree', inDegree: 20 }, dynamics: { update: 'sync' } }
    ]
    const rules = specs.map((input) => normaliseSpec(input))
    expect(rules.map((s) => s.rule)).toEqual([
      { kind: 'clipped', selfCoupling: false },
      { degree: 3, kind: 'dense-polynomial' },
      { kind: 'dense-exponential' },
      { beta: 8, kind: 'modern-softmax' },
      { kind: 'hebbian', selfCoupling: false }
    ])
    expect(rules[4]!.dilution).toEqual({ inDegree: 20, kind: 'fixed-in-degree' })
    for (const spec of rules) expect(normaliseSpec(JSON.parse(JSON.stringify(spec)))).toEqual(spec)
  })

  it('keeps random dilution without a kind, so older specs keep their hash', () => {
    const plain = normaliseSpec({ neurons: 100, patterns: 5, dilution: { keep: 0.5 } })
    const named = normaliseSpec({ neurons: 100, patterns: 5, dilution: { kind: 'random', keep: 0.5 } })
    expect(named).toEqual(plain)
    expect(plain.dilution).toEqual({ keep: 0.5, symmetric: true })
    expect(specHash(named)).toBe(specHash(plain))
  })

  it('varies degree, β and in-degree as axes like any numeric parameter', () => {
    const dense = normaliseSpec({ neurons: 40, patterns: 30, rule: { kind: 'dense-polynomial', degree: { from: 2, to: 5, step: 1 } } })
    expect(countPoints(dense)).toBe(4)
    expect(pointAt(dense, 3).params.rule).toEqual({ kind: 'dense-polynomial', degree: 5 })
    const soft = normaliseSpec({ neurons: 40, patterns: 30, rule: { kind: 'modern-softmax', beta: { from: 1, to: 64, count: 4, scale: 'log' } } })
    expect(pointAt(soft, 3).values).toEqual({ 'rule.beta': 64 })
    const sparse = normaliseSpec({ neurons: 500, load: 0.02, dilution: { kind: 'fixed-in-degree', inDegree: { values: [10, 20] } } })
    expect(pointAt(sparse, 1).params.dilution).toEqual({ kind: 'fixed-in-degree', inDegree: 20 })
  })

  it('names the offending field of every refused model', () => {
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'dense-polynomial' } })).toEqual(['rule.degree'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'dense-polynomial', degree: 1 } })).toEqual(['rule.degree'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'dense-polynomial', degree: 2.5 } })).toEqual(['rule.degree'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'modern-softmax', beta: 0 } })).toEqual(['rule.beta'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'modern-softmax', beta: 2, selfCoupling: true } })).toEqual(['rule.selfCoupling'])
    expect(paths({ neurons: 40, patterns: 5, coding: 'binary', rule: { kind: 'dense-exponential' } })).toEqual(['coding'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'dense-exponential' }, dynamics: { temperature: 0.5 } })).toEqual(['dynamics.temperature'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'modern-softmax', beta: 1 }, dilution: { keep: 0.5 } })).toEqual(['dilution'])
    expect(paths({ neurons: 40, patterns: 5, dilution: { kind: 'fixed-in-degree', inDegree: 40 } })).toEqual(['dilution.inDegree'])
    expect(paths({ neurons: 40, patterns: 5, dilution: { kind: 'fixed-in-degree' } })).toEqual(['dilution.inDegree'])
    expect(paths({ neurons: 40, patterns: 5, dilution: { kind: 'fixed-in-degree', inDegree: 4, keep: 0.5 } })).toEqual(['dilution.keep'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'storkey' }, dilution: { kind: 'fixed-in-degree', inDegree: 4 } })).toEqual(['dilution.kind'])
    expect(paths({ neurons: 40, patterns: 5, rule: { kind: 'hebbian', selfCoupling: true }, dilution: { kind: 'fixed-in-degree', inDegree: 4 } })).toEqual(['rule.selfCoupling'])
    const grid = issuesOf({ neurons: { values: [20, 40] }, patterns: 5, dilution: { kind: 'fixed-in-degree', inDegree: 30 } })
    expect(grid).toHaveLength(1)
    expect(grid[0]!.path).toBe('dilution.inDegree')
    expect(grid[0]!.message).toMatch(/at 1 of 2 grid points; first at neurons=20/)
  })

  it('runs every family end to end through chunks, with theory values and provenance', () => {
    const specs = [
      { neurons: 60, patterns: 5, rule: { kind: 'clipped' }, measures: { stability: true } },
      { neurons: 30, patterns: 60, rule: { kind: 'dense-polynomial', degree: 3 } },
      { neurons: 24, patterns: 200, rule: { kind: 'dense-exponential' } },
      { neurons: 32, patterns: 40, rule: { kind: 'modern-softmax', beta: 16 }, measures: { energyTrajectory: true } },
      { neurons: 300, patterns: 3, dilution: { kind: 'fixed-in-degree', inDegree: 15 }, dynamics: { update: 'sync' } }
    ]
    const theoryKeys = ['clippedCrosstalkErrorExact', 'denseCrosstalkErrorGaussian', 'exponentialCapacityExponent', 'softmaxSeparationThreshold', 'dilutedRetrievalOverlap']
    specs.forEach((input, k) => {
      const spec = normaliseSpec({ ...input, seed: 3, trials: 6, trialsPerNetwork: 2 })
      expect(estimateWork(spec).cpuSeconds).toBeLessThan(1)
      const result = assembleResult(spec, planSweep(spec).chunks.map((chunk) => computeChunk(spec, chunk)), makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
      const row = result.rows[0]!
      expect(row.summary.trials).toBe(6)
      // Every family recalls on average: the dense x^3 point (P = 2N) succeeds in about two
      // thirds of its trials (measured over 7 seeds × 60 trials), so six trials test the
      // mean final overlap (0.77-0.89 over those seeds), not the success rate.
      expect(row.summary.overlap.mean).toBeGreaterThan(0.5)
      expect(row.theory[theoryKeys[k]!]).toEqual(expect.any(Number))
    })
  })
})
