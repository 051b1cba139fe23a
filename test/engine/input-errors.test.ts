import { describe, it, expect } from 'vitest'
import { checkPointParams, createPointRunner, EngineInputError, type PointParams } from '../../src/engine/index.js'
import { pointParams } from '../helpers/point.js'

const cases: Array<[string, PointParams, string, unknown]> = [
  ['negative size', pointParams({ neurons: -5 }), 'neurons', -5],
  ['activity outside (0, 1)', pointParams({ family: { kind: 'random', activity: 1.2 } }), 'family.activity', 1.2],
  ['more patterns than the pseudo-inverse rule allows', pointParams({ neurons: 50, patterns: 50, rule: { kind: 'pseudo-inverse', selfCoupling: false } }), 'patterns', 50],
  ['supplied patterns of the wrong length', pointParams({ neurons: 4, patterns: 1, family: { kind: 'supplied', data: [[1, -1, 1]] } }), 'family.data.0', 3],
  ['supplied values outside the coding', pointParams({ neurons: 3, patterns: 1, coding: 'binary', family: { kind: 'supplied', data: [[1, -1, 0]] } }), 'family.data.0.1', -1],
  ['a temperature below 0', pointParams({ dynamics: { update: 'sync', temperature: -0.1, maxSweeps: 10, burnIn: 0 } }), 'dynamics.temperature', -0.1],
  ['a cue fraction above 1', pointParams({ cue: { kind: 'flip', fraction: 1.5 } }), 'cue.fraction', 1.5],
  ['non-integer pattern count', pointParams({ patterns: 2.5 }), 'patterns', 2.5]
]

describe('bad input', () => {
  it.each(cases)('%s throws EngineInputError naming the field and value', (_name, p, field, value) => {
    let caught: unknown
    try { createPointRunner(p, 1, 0) } catch (err) { caught = err }
    expect(caught).toBeInstanceOf(EngineInputError)
    const e = caught as EngineInputError
    expect(e.field).toBe(field)
    expect(e.value).toBe(value)
    expect(e.message).toContain(field)
    expect(e.message).toContain(String(value))
  })

  it('accepts a valid point', () => {
    expect(() => checkPointParams(pointParams())).not.toThrow()
  })
})
