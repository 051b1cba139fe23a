import { describe, expect, it } from 'vitest'
import { countPoints, gridAxes, normaliseSpec, pointAt, specHash } from '../../src/spec/index.js'

describe('grid order', () => {
  it('orders axes canonically whatever the input key order, first axis slowest', () => {
    const spec = normaliseSpec({
      dynamics: { temperature: { values: [0, 0.5] } },
      load: { values: [0.05, 0.1, 0.15] },
      neurons: { values: [40, 80] }
    })
    expect(gridAxes(spec).map((axis) => axis.path)).toEqual(['neurons', 'load', 'dynamics.temperature'])
    expect(countPoints(spec)).toBe(12)
    const seen = Array.from({ length: 12 }, (_, i) => pointAt(spec, i).values)
    expect(seen[0]).toEqual({ neurons: 40, load: 0.05, 'dynamics.temperature': 0 })
    expect(seen[1]).toEqual({ neurons: 40, load: 0.05, 'dynamics.temperature': 0.5 })
    expect(seen[2]).toEqual({ neurons: 40, load: 0.1, 'dynamics.temperature': 0 })
    expect(seen[6]).toEqual({ neurons: 80, load: 0.05, 'dynamics.temperature': 0 })
    expect(seen[11]).toEqual({ neurons: 80, load: 0.15, 'dynamics.temperature': 0.5 })
    expect(Object.keys(seen[5]!)).toEqual(['neurons', 'load', 'dynamics.temperature'])
  })

  it('has one point and no values when nothing varies', () => {
    const spec = normaliseSpec({ neurons: 50, patterns: 3 })
    expect(countPoints(spec)).toBe(1)
    expect(pointAt(spec, 0).values).toEqual({})
    expect(() => pointAt(spec, 1)).toThrow(RangeError)
    expect(() => pointAt(spec, -1)).toThrow(RangeError)
    expect(() => pointAt(spec, 0.5)).toThrow(RangeError)
  })

  it('resolves P = round(α·N) per point and keeps the requested load in the values', () => {
    const spec = normaliseSpec({ neurons: { values: [100, 200] }, load: { values: [0.145, 0.05] } })
    const points = Array.from({ length: 4 }, (_, i) => pointAt(spec, i))
    expect(points.map((p) => p.params.patterns)).toEqual([15, 5, 29, 10])
    expect(points[0]!.values).toEqual({ neurons: 100, load: 0.145 })
  })

  it('fills a point\'s parameters from constants and axes', () => {
    const spec = normaliseSpec({
      neurons: 60,
      patterns: 4,
      rule: { kind: 'covariance', threshold: { values: [0, 0.1] } },
      coding: 'binary',
      family: { kind: 'random', activity: 0.2 },
      cue: { kind: 'erase', fraction: 0.3, fill: 'random' },
      dilution: { keep: 0.8, symmetric: false },
      dynamics: { update: 'sync', maxSweeps: 20 }
    })
    expect(pointAt(spec, 1).params).toEqual({
      neurons: 60,
      patterns: 4,
      coding: 'binary',
      family: { kind: 'random', activity: 0.2 },
      rule: { kind: 'covariance', selfCoupling: false, threshold: 0.1 },
      dilution: { keep: 0.8, symmetric: false },
      cue: { kind: 'erase', fraction: 0.3, fill: 'random' },
      dynamics: { update: 'sync', temperature: 0, maxSweeps: 20, burnIn: 0 },
      measures: { overlapTrajectory: false, energyTrajectory: false, stability: false },
      successThreshold: 0.9,
      trialsPerNetwork: 1
    })
  })

  it('stores the first P supplied patterns when patterns varies', () => {
    const data = [[1, -1, 1, 1], [-1, 1, 1, -1], [1, 1, -1, -1]]
    const spec = normaliseSpec({ family: { kind: 'supplied', data }, patterns: { values: [1, 3] } })
    const first = pointAt(spec, 0).params.family
    expect(first).toEqual({ kind: 'supplied', data: [data[0]] })
    expect(pointAt(spec, 1).params.family).toEqual({ kind: 'supplied', data })
  })

  it('resolves a huge grid lazily', () => {
    const spec = normaliseSpec({ neurons: { from: 50, to: 149, step: 1 }, load: { from: 0.01, to: 0.1, count: 10 }, cue: { kind: 'flip', fraction: { from: 0, to: 0.45, step: 0.05 } }, trials: 1 })
    expect(countPoints(spec)).toBe(10_000)
    expect(pointAt(spec, 9_999).values).toEqual({ neurons: 149, load: 0.1, 'cue.fraction': 0.45 })
  })
})

describe('spec hash', () => {
  const base = { neurons: 100, load: { from: 0.05, to: 0.15, step: 0.05 }, seed: 7 }

  it('is the SHA-256 of the canonical spec without its label', () => {
    const spec = normaliseSpec(base)
    expect(specHash(spec)).toMatch(/^[0-9a-f]{64}$/)
    expect(specHash(normaliseSpec({ ...base, label: 'lab notebook p. 12' }))).toBe(specHash(spec))
  })

  it('does not depend on key order, defaults written out, or how an axis was written', () => {
    const spelled = normaliseSpec({ seed: 7, load: { values: [0.05, 0.1, 0.15] }, neurons: 100, coding: 'pm1', trials: 100, rule: { kind: 'hebbian' } })
    expect(specHash(spelled)).toBe(specHash(normaliseSpec(base)))
  })

  it('changes with anything that changes the work', () => {
    const hash = specHash(normaliseSpec(base))
    expect(specHash(normaliseSpec({ ...base, seed: 8 }))).not.toBe(hash)
    expect(specHash(normaliseSpec({ ...base, trials: 101 }))).not.toBe(hash)
    expect(specHash(normaliseSpec({ ...base, load: { values: [0.15, 0.1, 0.05] } }))).not.toBe(hash)
  })

  // A regression anchor: stored results are found again by this hash, so a change in the
  // canonical form must be deliberate (and come with a SPEC_FORMAT_VERSION bump).
  it('stays the same across releases for a fixed spec', () => {
    expect(specHash(normaliseSpec(base))).toBe(GOLDEN_HASH)
  })

  it('keeps the hash of a format-1 spec through the format-2 release (new members left out at their defaults)', () => {
    expect(specHash(normaliseSpec({ ...base, version: 1 }))).toBe(GOLDEN_HASH_FORMAT_1)
    expect(specHash(normaliseSpec({ ...base, version: 1, streams: 'keyed', measures: { patternOverlaps: false } }))).toBe(GOLDEN_HASH_FORMAT_1)
  })
})

// Cross-checked with Python: hashlib.sha256(json.dumps(spec_without_label, sort_keys=True, separators=(',', ':')))
const GOLDEN_HASH = '7a7949bfba44105a09e65cdb4f081048e65e550c47bc3c2b1c64c1273feb1ca0'
/** The same spec's hash in format 1 (the golden hash of the releases before format 2). */
const GOLDEN_HASH_FORMAT_1 = '4dd59b6e4c6c5c9402b5fc860b5991d452e96ec543dd454ed9c673b10bb9fd66'
