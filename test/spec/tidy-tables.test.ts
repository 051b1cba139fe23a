/**
 * Tidy, self-describing tables: every row says which sweep, spec and seed it comes from and
 * every model parameter, in one column order whatever the sweep varies; measures at the
 * published precision, grid values as the spec wrote them. Scenario: place-cell rooms.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { DERIVED_COLUMNS, IDENTITY_COLUMNS, MEASURE_SIGNIFICANT_DIGITS, PARAMETER_COLUMNS, resultToCsv, resultToJson, roundMeasure, trajectoryCsv } from '../../src/results/index.js'
import { runSweep } from '../figures/helpers.js'

const table = (csv: string): string[][] => csv.trimEnd().split('\r\n').map((line) => line.split(','))
const LEADING = [...IDENTITY_COLUMNS, 'point', ...PARAMETER_COLUMNS, ...DERIVED_COLUMNS]

/** Significant digits of a number's shortest decimal form. */
function significantDigits (text: string): number {
  const mantissa = text.replace(/^-/, '').replace(/e.*$/, '').replace('.', '').replace(/^0+/, '')
  return mantissa.replace(/0+$/, '').length
}

describe('tidy tables', () => {
  const cueNoise = runSweep({ label: 'lobby, cue noise', neurons: 60, load: 0.1, cue: { kind: 'flip', fraction: { values: [0.1, 0.3] } }, trials: 7, seed: 11 })
  const capacity = runSweep({ label: 'lobby, capacity', neurons: 60, load: { values: [0.05, 0.1] }, cue: { kind: 'flip', fraction: 0.1 }, trials: 7, seed: 11 })

  it('lead every table with the same columns in the same order, whatever is varied', () => {
    for (const csv of [
      resultToCsv(cueNoise, { perTrial: false }), resultToCsv(capacity, { perTrial: false }),
      resultToCsv(cueNoise, { perTrial: true }), resultToCsv(capacity, { perTrial: true })
    ]) expect(table(csv)[0]!.slice(0, LEADING.length)).toEqual(LEADING)
    // Same model, different axis: the whole point header is the same.
    expect(table(resultToCsv(cueNoise, { perTrial: false }))[0]).toEqual(table(resultToCsv(capacity, { perTrial: false }))[0])
  })

  it('state fixed parameters, the seed, the spec hash and the sweep on every row', () => {
    const [head, ...rows] = table(resultToCsv(capacity, { perTrial: true, sweepId: 'sw_lobby' }))
    const col = (name: string): number => head!.indexOf(name)
    expect(rows).toHaveLength(2 * 7)
    for (const row of rows) {
      expect(row[col('sweepId')]).toBe('sw_lobby')
      expect(row[col('specHash')]).toBe(capacity.specHash)
      expect(row[col('seed')]).toBe('11')
      expect(row[col('cue.kind')]).toBe('flip')
      expect(row[col('cue.fraction')]).toBe('0.1')
      expect(row[col('rule.kind')]).toBe('hebbian')
      expect(row[col('rule.selfCoupling')]).toBe('false')
      expect(row[col('rule.degree')]).toBe('')
      expect(row[col('dilution.kind')]).toBe('none')
      expect(row[col('dynamics.temperature')]).toBe('0')
      expect(row[col('successThreshold')]).toBe('0.9')
      expect(row[col('neurons')]).toBe('60')
    }
    expect(rows.map((row) => row[col('load')])).toEqual([...Array(7).fill('0.05'), ...Array(7).fill('0.1')])
    expect(rows.map((row) => row[col('patterns')])).toEqual([...Array(7).fill('3'), ...Array(7).fill('6')])
  })

  it('give the trajectory series the same leading columns', () => {
    const withTrajectory = runSweep({ neurons: 40, patterns: 2, measures: { overlapTrajectory: true }, trials: 3 })
    expect(table(trajectoryCsv(withTrajectory, 'sw_t'))[0]!.slice(0, LEADING.length)).toEqual(LEADING)
    expect(table(trajectoryCsv(withTrajectory, 'sw_t'))[1]![0]).toBe('sw_t')
  })

  it(`write measures with at most ${MEASURE_SIGNIFICANT_DIGITS} significant digits in CSV and JSON, grid values as written`, () => {
    const csv = resultToCsv(cueNoise, { perTrial: false })
    const numbers = table(csv).slice(1).flat().filter((cell) => /^-?[\d.]+(e-?\d+)?$/.test(cell))
    expect(numbers.length).toBeGreaterThan(50)
    for (const cell of numbers) expect(significantDigits(cell), cell).toBeLessThanOrEqual(MEASURE_SIGNIFICANT_DIGITS)
    const json = resultToJson(cueNoise, { perTrial: true })
    for (const match of json.matchAll(/(?<=[:,[])-?\d+\.\d+(e-?\d+)?/g)) expect(significantDigits(match[0]), match[0]).toBeLessThanOrEqual(MEASURE_SIGNIFICANT_DIGITS)
    const parsed = JSON.parse(json) as { rows: Array<{ values: Record<string, number>, summary: { overlap: { mean: number } } }> }
    expect(parsed.rows.map((row) => row.values['cue.fraction'])).toEqual([0.1, 0.3])
    expect(parsed.rows[0]!.summary.overlap.mean).toBe(roundMeasure(cueNoise.rows[0]!.summary.overlap.mean))
  })

  it('round a measure to the nearest 10-digit decimal, leaving integers and non-finite numbers alone', () => {
    expect(roundMeasure(0.09279999999999998)).toBe(0.0928)
    expect(roundMeasure(-0.30000000000000004)).toBe(-0.3)
    expect(roundMeasure(1 / 3)).toBe(0.3333333333)
    expect(roundMeasure(123456789012.5)).toBe(123456789000)
    expect(roundMeasure(4e-300 / 3)).toBe(1.333333333e-300)
    expect(roundMeasure(7)).toBe(7)
    expect(roundMeasure(Number.NaN)).toBeNaN()
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
      const r = roundMeasure(x)
      if (Number.isInteger(x)) return r === x
      const unit = 10 ** (Math.floor(Math.log10(Math.abs(x))) - MEASURE_SIGNIFICANT_DIGITS + 1)
      return significantDigits(String(r)) <= MEASURE_SIGNIFICANT_DIGITS && Math.abs(r - x) <= 0.5000001 * unit
    }))
  })
})
