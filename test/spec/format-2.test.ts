import { describe, it, expect } from 'vitest'
import { countPoints, gridAxes, normaliseSpec, pointAt, pointsToCheck, ruleLabel, SpecValidationError, specHash } from '../../src/spec/index.js'

function issuesOf (input: unknown): Array<{ path: string, message: string }> {
  try {
    normaliseSpec(input)
  } catch (error) {
    if (error instanceof SpecValidationError) return error.issues
    throw error
  }
  throw new Error('expected the spec to be refused')
}

describe('spec format versions', () => {
  it('classifies end states at the success threshold in format 2 and at 0.9 in format 1', () => {
    const v2 = pointAt(normaliseSpec({ neurons: 100, patterns: 5, successThreshold: 0.6 }), 0).params
    expect(v2.patternLevel).toBeUndefined()
    const v1 = pointAt(normaliseSpec({ version: 1, neurons: 100, patterns: 5, successThreshold: 0.6 }), 0).params
    expect(v1.patternLevel).toBe(0.9)
  })

  it('writes format-2 members only away from their defaults', () => {
    const spec = normaliseSpec({ neurons: 100, patterns: 5, streams: 'keyed', measures: { patternOverlaps: false } })
    expect('streams' in spec).toBe(false)
    expect('patternOverlaps' in spec.measures).toBe(false)
    const set = normaliseSpec({ neurons: 100, patterns: 5, streams: 'canonical', measures: { patternOverlaps: true } })
    expect(set.streams).toBe('canonical')
    expect(set.measures.patternOverlaps).toBe(true)
    expect(normaliseSpec(JSON.parse(JSON.stringify(set)))).toEqual(set)
  })
})

describe('load per input (fixed in-degree)', () => {
  it('holds P/K fixed along an axis of K: P = round(α_K·K) at every point', () => {
    const spec = normaliseSpec({
      neurons: 2000,
      inDegreeLoad: 0.5,
      rule: { kind: 'hebbian' },
      dilution: { kind: 'fixed-in-degree', inDegree: { values: [20, 40, 80] } },
      dynamics: { update: 'sync' }
    })
    expect(spec.inDegreeLoad).toBe(0.5)
    expect(gridAxes(spec).map((a) => a.path)).toEqual(['dilution.inDegree'])
    const points = [0, 1, 2].map((i) => pointAt(spec, i).params)
    expect(points.map((p) => p.patterns)).toEqual([10, 20, 40])
    expect(points.every((p) => p.neurons === 2000)).toBe(true)
  })

  it('may itself be an axis, and is refused without a fixed in-degree or beside patterns or load', () => {
    const axis = normaliseSpec({ neurons: 1000, inDegreeLoad: { values: [0.2, 0.4] }, dilution: { kind: 'fixed-in-degree', inDegree: 50 } })
    expect([0, 1].map((i) => pointAt(axis, i).params.patterns)).toEqual([10, 20])
    expect(issuesOf({ neurons: 100, inDegreeLoad: 0.5 })).toEqual([{ path: 'inDegreeLoad', message: expect.stringMatching(/fixed in-degree/) }])
    expect(issuesOf({ neurons: 100, load: 0.1, inDegreeLoad: 0.5, dilution: { kind: 'fixed-in-degree', inDegree: 10 } }).map((i) => i.path)).toEqual(['load', 'inDegreeLoad'])
    expect(issuesOf({ neurons: 100, inDegreeLoad: 0.01, dilution: { kind: 'fixed-in-degree', inDegree: 10 } })).toEqual([{ path: 'inDegreeLoad', message: expect.stringMatching(/rounds to 0 patterns/) }])
  })

  it('can be searched by a threshold analysis', () => {
    const spec = normaliseSpec({
      neurons: 1000,
      dilution: { kind: 'fixed-in-degree', inDegree: 40 },
      dynamics: { update: 'sync' },
      trials: 20,
      analysis: { kind: 'threshold', parameter: 'inDegreeLoad', from: 0.3, to: 0.9 }
    })
    const ends = pointsToCheck(spec, 0)
    expect(ends.map((e) => e.params.patterns)).toEqual([12, 36])
    expect(ends.map((e) => e.values.inDegreeLoad)).toEqual([0.3, 0.9])
    expect(issuesOf({ neurons: 1000, trials: 20, analysis: { kind: 'threshold', parameter: 'inDegreeLoad', from: 0.3, to: 0.9 } }))
      .toEqual([{ path: 'analysis.parameter', message: expect.stringMatching(/fixed in-degree/) }])
  })
})

describe('categorical axes: the rule and its self-coupling', () => {
  it('vary the rule (with its own parameters) as the grid\'s rule axis, named by label', () => {
    const spec = normaliseSpec({
      neurons: 200,
      patterns: { values: [10, 20] },
      rule: { values: [{ kind: 'hebbian' }, { kind: 'storkey' }, { kind: 'pseudo-inverse', selfCoupling: true }, { kind: 'dense-polynomial', degree: 3 }] }
    })
    expect(gridAxes(spec).map((a) => [a.path, a.values])).toEqual([
      ['patterns', [10, 20]],
      ['rule', ['hebbian', 'storkey', 'pseudo-inverse(selfCoupling=true)', 'dense-polynomial(degree=3)']]
    ])
    expect(countPoints(spec)).toBe(8)
    const last = pointAt(spec, 7)
    expect(last.values).toEqual({ patterns: 20, rule: 'dense-polynomial(degree=3)' })
    expect(last.params.rule).toEqual({ kind: 'dense-polynomial', degree: 3 })
    expect(pointAt(spec, 2).params.rule).toEqual({ kind: 'pseudo-inverse', selfCoupling: true })
    expect(ruleLabel({ kind: 'covariance', selfCoupling: false, threshold: 0.2 })).toBe('covariance(threshold=0.2)')
    expect(normaliseSpec(JSON.parse(JSON.stringify(spec)))).toEqual(spec)
  })

  it('vary the self-coupling as an axis of flags', () => {
    const spec = normaliseSpec({ neurons: 100, patterns: 10, rule: { kind: 'storkey', selfCoupling: { values: [false, true] } } })
    expect(gridAxes(spec)).toEqual([{ path: 'rule.selfCoupling', values: [false, true] }])
    expect([0, 1].map((i) => pointAt(spec, i).params.rule)).toEqual([{ kind: 'storkey', selfCoupling: false }, { kind: 'storkey', selfCoupling: true }])
    expect(pointAt(spec, 1).values).toEqual({ 'rule.selfCoupling': true })
  })

  it('refuse repeats, axes inside a rule axis, and rules the model cannot run, each at its field', () => {
    expect(issuesOf({ neurons: 100, patterns: 5, rule: { values: [{ kind: 'hebbian' }, { kind: 'hebbian', selfCoupling: false }] } }))
      .toEqual([{ path: 'rule.values', message: expect.stringMatching(/distinct; hebbian/) }])
    expect(issuesOf({ neurons: 100, patterns: 5, rule: { values: [{ kind: 'dense-polynomial', degree: { values: [2, 3] } }] } }).map((i) => i.path))
      .toEqual(['rule.values.0.degree'])
    expect(issuesOf({ neurons: 100, patterns: 5, rule: { values: [{ kind: 'storky' }] } })).toEqual([{ path: 'rule.values.0.kind', message: expect.stringMatching(/hebbian/) }])
    expect(issuesOf({ neurons: 100, patterns: 5, rule: { kind: 'hebbian', selfCoupling: { values: [true, true] } } }).map((i) => i.path)).toEqual(['rule.selfCoupling.values'])
    expect(issuesOf({ neurons: 100, patterns: 5, rule: { kind: 'hebbian', selfCoupling: 'yes' } }))
      .toEqual([{ path: 'rule.selfCoupling', message: 'expected true, false or an axis { "values": [false, true] }' }])
    // A dense memory cannot be diluted: reported once at the rule axis, with the first point.
    expect(issuesOf({ neurons: 100, patterns: 5, dilution: { keep: 0.5 }, rule: { values: [{ kind: 'hebbian' }, { kind: 'dense-polynomial', degree: 3 }] } }))
      .toEqual([{ path: 'dilution', message: expect.stringMatching(/first at rule=dense-polynomial\(degree=3\)/) }])
    expect(issuesOf({ neurons: 100, patterns: 120, rule: { values: [{ kind: 'hebbian' }, { kind: 'pseudo-inverse' }] } }))
      .toEqual([{ path: 'patterns', message: expect.stringMatching(/pseudo-inverse/) }])
  })

  it('change the hash with the rules compared, but not with how a default is spelled', () => {
    const a = normaliseSpec({ neurons: 100, patterns: 5, rule: { values: [{ kind: 'hebbian' }, { kind: 'storkey' }] } })
    const b = normaliseSpec({ neurons: 100, patterns: 5, rule: { values: [{ kind: 'hebbian', selfCoupling: false }, { kind: 'storkey' }] } })
    const c = normaliseSpec({ neurons: 100, patterns: 5, rule: { values: [{ kind: 'storkey' }, { kind: 'hebbian' }] } })
    expect(specHash(a)).toBe(specHash(b))
    expect(specHash(a)).not.toBe(specHash(c))
  })
})

describe('canonical streams', () => {
  it('are a grid option: refused with an analysis', () => {
    expect(issuesOf({ neurons: 100, streams: 'canonical', trials: 10, analysis: { kind: 'threshold', parameter: 'load', from: 0.05, to: 0.2 } }))
      .toEqual([{ path: 'streams', message: expect.stringMatching(/grid sweeps only/) }])
    expect(issuesOf({ neurons: 100, patterns: 5, streams: 'plain' }).map((i) => i.path)).toEqual(['streams'])
  })
})
