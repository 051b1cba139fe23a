import { describe, expect, it, vi } from 'vitest'
import fc from 'fast-check'
import { MAX_SPEC_ISSUES, normaliseSpec, SpecValidationError, SweepSpecSchema, type SpecIssue } from '../../src/spec/index.js'

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

describe('defaults', () => {
  it('fills every documented default and keys come out sorted', () => {
    const spec = normaliseSpec({ neurons: 100, patterns: 5 })
    expect(spec).toEqual({
      coding: 'pm1',
      cue: { fraction: 0.1, kind: 'flip' },
      dilution: null,
      dynamics: { burnIn: 0, maxSweeps: 100, temperature: 0, update: 'async-random' },
      family: { activity: 0.5, kind: 'random' },
      label: null,
      measures: { energyTrajectory: false, overlapTrajectory: false, stability: false },
      neurons: 100,
      patterns: 5,
      rule: { kind: 'hebbian', selfCoupling: false },
      seed: 1,
      successThreshold: 0.9,
      trials: 100,
      trialsPerNetwork: 1,
      version: 2
    })
    expect(Object.keys(spec)).toEqual(Object.keys(spec).sort())
  })

  it('fills the defaults inside a chosen variant', () => {
    const spec = normaliseSpec({ neurons: 100, load: 0.05, cue: { kind: 'erase' }, rule: { kind: 'covariance' }, dilution: { keep: 0.5 }, family: { kind: 'random', activity: 0.2 }, coding: 'binary' })
    expect(spec.cue).toEqual({ fill: 'zero', fraction: 0.1, kind: 'erase' })
    expect(spec.rule).toEqual({ kind: 'covariance', selfCoupling: false, threshold: null })
    expect(spec.dilution).toEqual({ keep: 0.5, symmetric: true })
    expect(spec.family).toEqual({ activity: 0.2, kind: 'random' })
  })

  it('expands axes to { values } and keeps constants as numbers', () => {
    const spec = normaliseSpec({ neurons: { values: [50, 100] }, load: { from: 0.05, to: 0.15, step: 0.05 }, dynamics: { temperature: { from: 0, to: 0.4, count: 3 } } })
    expect(spec.neurons).toEqual({ values: [50, 100] })
    expect(spec.load).toEqual({ values: [0.05, 0.1, 0.15] })
    expect(spec.dynamics.temperature).toEqual({ values: [0, 0.2, 0.4] })
    expect(spec.patterns).toBeUndefined()
  })

  it('is a fixed point: a normalised spec normalises to itself', () => {
    const arbitrarySpec = fc.record({
      neurons: fc.oneof(fc.integer({ min: 20, max: 400 }), fc.constant({ from: 40, to: 80, step: 20 })),
      load: fc.oneof(fc.double({ min: 0.05, max: 0.3, noNaN: true }), fc.constant({ values: [0.05, 0.1] })),
      seed: fc.nat(),
      label: fc.option(fc.string({ maxLength: 20 }), { nil: undefined }),
      cue: fc.oneof(
        fc.record({ kind: fc.constant('flip' as const), fraction: fc.double({ min: 0, max: 1, noNaN: true }) }),
        fc.record({ kind: fc.constant('erase' as const), fill: fc.constantFrom('zero' as const, 'random' as const) }),
        fc.constant({ kind: 'random' as const })),
      dynamics: fc.record({ temperature: fc.oneof(fc.constant(0), fc.constant({ from: 0, to: 0.6, count: 4 })) }, { requiredKeys: [] })
    }, { requiredKeys: ['neurons', 'load'] })
    fc.assert(fc.property(arbitrarySpec, (input) => {
      const once = normaliseSpec(input)
      expect(normaliseSpec(JSON.parse(JSON.stringify(once)))).toEqual(once)
    }), { numRuns: 60 })
  })
})

describe('strictness', () => {
  it('names every unknown field by its path', () => {
    expect(paths({ neurons: 100, patterns: 5, colour: 'red', dynamics: { temprature: 0.1 }, cue: { kind: 'flip', fraction: 0.1, extra: 1 }, load2: 1 }))
      .toEqual(expect.arrayContaining(['colour', 'dynamics.temprature', 'cue.extra', 'load2']))
  })

  it('names unknown fields inside an axis', () => {
    expect(paths({ neurons: 100, load: { from: 0.1, to: 0.2, step: 0.05, stepp: 1 } })).toEqual(['load.stepp'])
  })

  it('lists every offending field at once, with reasons', () => {
    const issues = issuesOf({ neurons: -3, patterns: 5, seed: -1, trials: 0, dynamics: { temperature: -0.5, update: 'parallel' }, family: { kind: 'random', activity: 1.5 }, successThreshold: 2 })
    expect(issues.map((i) => i.path).sort()).toEqual(['dynamics.temperature', 'dynamics.update', 'family.activity', 'neurons', 'seed', 'successThreshold', 'trials'])
    for (const issue of issues) expect(issue.message.length).toBeGreaterThan(5)
  })

  it('explains a value that is neither a number nor an axis', () => {
    const [issue] = issuesOf({ neurons: 100, load: '0.1' })
    expect(issue).toEqual({ path: 'load', message: expect.stringMatching(/number or an axis object/) })
  })

  it('says "required" for a missing varied field and names a non-integer count', () => {
    expect(issuesOf({ neurons: 100, patterns: 3, family: { kind: 'correlated' }, dilution: {} })).toEqual([
      { path: 'family.parents', message: 'required' },
      { path: 'family.parentOverlap', message: 'required' },
      { path: 'dilution.keep', message: 'required' }
    ])
    expect(issuesOf({ neurons: 100.5, patterns: 3 })).toEqual([{ path: 'neurons', message: '100.5 is not an integer' }])
  })

  it('reports a bad axis bound once, on the bound itself', () => {
    expect(issuesOf({ neurons: 100, load: { from: -1, to: 0.2, step: 0.1 } })).toEqual([{ path: 'load.from', message: expect.stringMatching(/>0/) }])
    expect(paths({ neurons: 100, load: { from: 0.1, to: 0.2, step: 0 } })).toEqual(['load.step'])
  })

  it('reports an unknown variant at its kind', () => {
    expect(issuesOf({ neurons: 100, patterns: 5, rule: { kind: 'oja' } })).toEqual([{ path: 'rule.kind', message: expect.stringMatching(/hebbian/) }])
  })

  it('refuses a spec that is not an object, and a wrong format version', () => {
    expect(paths(42)).toEqual([''])
    expect(paths({ version: 3, neurons: 100, patterns: 5 })).toEqual(['version'])
    expect(issuesOf({ version: 0, neurons: 100, patterns: 5 })).toEqual([{ path: 'version', message: 'expected a spec format version: 1 or 2' }])
  })
})

describe('patterns or load', () => {
  it('needs exactly one of them', () => {
    expect(paths({ neurons: 100 })).toEqual(['patterns'])
    expect(paths({ neurons: 100, patterns: 5, load: 0.05 })).toEqual(['patterns', 'load'])
    expect(normaliseSpec({ neurons: 100, load: 0.05 }).load).toBe(0.05)
  })

  it('needs neurons unless the patterns are supplied', () => {
    expect(paths({ load: 0.1 })).toEqual(['neurons'])
  })

  it('reports a load that rounds to no pattern at its path', () => {
    expect(issuesOf({ neurons: 10, load: { values: [0.01, 0.1, 0.02] } })).toEqual([{
      path: 'load',
      message: 'load × neurons rounds to 0 patterns; at least 1 is needed (at 2 of 3 grid points; first at load=0.01)'
    }])
  })

  it('maps the engine\'s pattern-count check to load when the spec gives a load', () => {
    const [issue] = issuesOf({ neurons: { values: [20, 40] }, load: { values: [0.5, 1] }, rule: { kind: 'pseudo-inverse' } })
    expect(issue!.path).toBe('load')
    expect(issue!.message).toMatch(/pseudo-inverse.*at 2 of 4 grid points; first at neurons=20, load=1/)
    expect(paths({ neurons: 20, patterns: 20, rule: { kind: 'pseudo-inverse' } })).toEqual(['patterns'])
  })

  it('passes cross-field engine checks through with the field path', () => {
    expect(paths({ neurons: 100, patterns: 3, cue: { kind: 'mixture', components: 5 } })).toEqual(['cue.components'])
    expect(paths({ neurons: 100, patterns: 3, dynamics: { temperature: 0.5, maxSweeps: 10, burnIn: 10 } })).toEqual(['dynamics.burnIn'])
  })
})

describe('supplied patterns', () => {
  const rooms = [[1, -1, 1, -1, 1, 1], [-1, -1, 1, 1, -1, 1], [1, 1, 1, -1, -1, -1]]

  it('takes N and P from the data', () => {
    const spec = normaliseSpec({ family: { kind: 'supplied', data: rooms }, cue: { kind: 'flip', fraction: 0.2 } })
    expect(spec.neurons).toBe(6)
    expect(spec.patterns).toBe(3)
  })

  it('checks lengths, coding and requested counts, listing each offending entry', () => {
    expect(issuesOf({ family: { kind: 'supplied', data: [[1, 0, 1, -1, 1, 1], [1, 1], rooms[2]] }, neurons: 7, patterns: { values: [2, 4] } })).toEqual([
      { path: 'neurons', message: 'is 7 but the supplied patterns have 6 entries' },
      { path: 'family.data.0.1', message: '0 is not a pm1 value (allowed: -1, 1)' },
      { path: 'family.data.1', message: 'has 2 entries but pattern 0 has 6; every pattern needs the same length' },
      { path: 'patterns', message: '4 patterns requested but only 3 are supplied' }
    ])
    const negatives = rooms.flat().filter((v) => v === -1).length
    expect(paths({ family: { kind: 'supplied', data: rooms }, coding: 'binary' })).toHaveLength(negatives)
  })

  it('caps the list of bad entries and counts the rest', () => {
    const data = Array.from({ length: 10 }, () => Array.from({ length: 10 }, () => 7))
    const issues = issuesOf({ family: { kind: 'supplied', data } })
    expect(issues).toHaveLength(21)
    expect(issues[20]).toEqual({ path: 'family.data', message: '80 more entries or rows are invalid (only the first 20 are listed)' })
  })
})

describe('bounded issue lists', () => {
  function refusal (input: unknown): SpecValidationError {
    try {
      normaliseSpec(input)
    } catch (error) {
      if (error instanceof SpecValidationError) return error
      throw error
    }
    throw new Error('expected the spec to be refused')
  }

  /** Issues zod builds while judging `input` (what the work grows with), observed on the real schema. */
  function zodIssuesBuilt (input: unknown): { error: SpecValidationError, built: number } {
    const spy = vi.spyOn(SweepSpecSchema, 'safeParse')
    try {
      const error = refusal(input)
      const built = spy.mock.results.reduce((sum, r) => sum + (r.value.success === true ? 0 : r.value.error.issues.length), 0)
      return { error, built }
    } finally {
      spy.mockRestore()
    }
  }

  it('lists the first 100 of 87 000 bad supplied entries, counts the rest, and never has zod judge them one by one', () => {
    const row = Array.from({ length: 87_000 }, () => ({}))
    const { error, built } = zodIssuesBuilt({ family: { kind: 'supplied', data: [row] }, trials: 'many' })
    expect(error.issues).toHaveLength(MAX_SPEC_ISSUES)
    // The other field's issue comes first, then the first 99 data entries; 86 901 entries are counted, not listed.
    expect(error.issues[0]).toEqual({ path: 'trials', message: expect.any(String) })
    expect(error.issues[1]).toEqual({ path: 'family.data.0.0', message: 'expected a number, received object' })
    expect(error.issues.length + error.omitted).toBe(87_000 + 1)
    expect(built).toBe(1)
    expect(error.message).toContain('and 87000 more issues')
  })

  it('screens rows that are not arrays the same way', () => {
    const { error, built } = zodIssuesBuilt({ family: { kind: 'supplied', data: Array.from({ length: 5000 }, () => 'room') } })
    expect(error.issues).toHaveLength(MAX_SPEC_ISSUES)
    expect(error.issues[0]).toEqual({ path: 'family.data.0', message: 'expected an array (one pattern), received string' })
    expect(error.omitted).toBe(5000 - MAX_SPEC_ISSUES)
    expect(built).toBe(0)
  })

  it('leaves a few bad entries to zod, with its messages, and lists them all', () => {
    const error = refusal({ family: { kind: 'supplied', data: [[1, -1, 'x', 1], [1, null, 1, 1]] } })
    expect(error.issues.map((issue) => issue.path)).toEqual(['family.data.0.2', 'family.data.1.1'])
    expect(error.omitted).toBe(0)
  })

  it('lists at most 100 unknown fields and counts the rest', () => {
    const spec: Record<string, unknown> = { neurons: 64, patterns: 2 }
    for (let i = 0; i < 20_000; i++) spec[`room${i}`] = i
    const error = refusal(spec)
    expect(error.issues).toHaveLength(MAX_SPEC_ISSUES)
    expect(error.issues[0]).toEqual({ path: 'room0', message: 'unknown field' })
    expect(error.omitted).toBe(20_000 - MAX_SPEC_ISSUES)
  })
})

describe('ceilings', () => {
  it('refuses a grid over the format\'s ceiling without visiting its points', () => {
    // 10^8 points: visiting them would outlast the test's timeout, so passing proves they are counted, not visited.
    const issues = issuesOf({ neurons: { from: 100, to: 10099, step: 1 }, load: { from: 0.001, to: 0.5, count: 10000 } })
    expect(issues).toEqual([{ path: '', message: expect.stringMatching(/100000000 points \(neurons 10000 × load 10000\).*at most 100000/) }])
  })
})

describe('schema', () => {
  it('documents fields and defaults for the OpenAPI document', async () => {
    const { z } = await import('zod')
    const json = JSON.stringify(z.toJSONSchema(SweepSpecSchema, { io: 'input' }))
    expect(json).toContain('"additionalProperties":false')
    const schema = z.toJSONSchema(SweepSpecSchema, { io: 'input' }) as unknown as { $defs: { SweepSpec: { properties: Record<string, { default?: unknown, description?: string }> } } }
    const threshold = schema.$defs.SweepSpec.properties.successThreshold!
    expect(threshold.default).toBe(0.9)
    expect(threshold.description).toMatch(/^A trial succeeds .* Default: 0\.9\.$/)
  })
})
