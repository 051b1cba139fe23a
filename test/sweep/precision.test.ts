/**
 * Precision targets: the stopping rule after each block, on trials simulated for real. The
 * success interval is Wilson's score interval (Wilson 1927, J. Am. Stat. Assoc. 22:209,
 * eq. for the two-sided interval), recomputed here from its closed form; the overlap interval
 * is the normal one, mean ± 1.96·se (common practice).
 */
import { describe, expect, it } from 'vitest'
import { normaliseSpec } from '../../src/spec/index.js'
import { computeChunk, decidePoint, precisionOutcome } from '../../src/sweep/index.js'
import { aggregatePoint, type TrialRecord } from '../../src/engine/index.js'
import { pointAt } from '../../src/spec/index.js'

const Z = 1.959963984540054

function wilsonHalfWidth (successes: number, n: number): number {
  const p = successes / n
  return (Z / (1 + Z * Z / n)) * Math.sqrt(p * (1 - p) / n + Z * Z / (4 * n * n))
}

/** A place-cell network holding room codes: far below capacity (load 0.03) and beyond it (0.2). */
const spec = normaliseSpec({
  label: 'room codes, precision',
  neurons: 100,
  load: { values: [0.03, 0.2] },
  trials: 100,
  precision: { measure: 'success', halfWidth: 0.08, block: 40 },
  seed: 41
})

function records (point: number, count: number): TrialRecord[] {
  return computeChunk(spec, { index: 0, point, firstTrial: 0, count }).trials
}

describe('precision targets', () => {
  it('closes a point whose Wilson interval is already narrow enough after its first block', () => {
    const easy = records(0, 40)
    const successes = easy.filter((t) => t.overlap >= (spec.successThreshold as number)).length
    expect(successes).toBe(40)
    const decision = decidePoint(spec, 0, easy)
    expect(decision.kind).toBe('close')
    if (decision.kind !== 'close') return
    expect(decision.halfWidth).toBeCloseTo(wilsonHalfWidth(40, 40), 12)
    expect(decision.met).toBe(true)
  })

  it('gives a point with a wide interval the next block, cut at the ceiling, then closes it unmet at the ceiling', () => {
    const hard = records(1, 100)
    const first = decidePoint(spec, 1, hard.slice(0, 40))
    const successes = hard.slice(0, 40).filter((t) => t.overlap >= (spec.successThreshold as number)).length
    expect(wilsonHalfWidth(successes, 40)).toBeGreaterThan(0.08)
    expect(first).toEqual({ kind: 'extend', fromTrial: 40, pieces: expect.any(Array) })
    if (first.kind !== 'extend') return
    expect(first.pieces[0]!.firstTrial).toBe(40)
    expect(first.pieces.reduce((sum, piece) => sum + piece.count, 0)).toBe(40)

    const second = decidePoint(spec, 1, hard.slice(0, 80))
    if (second.kind === 'extend') {
      // The last block is cut at the ceiling of 100 trials.
      expect(second.pieces.reduce((sum, piece) => sum + piece.count, 0)).toBe(20)
      const last = decidePoint(spec, 1, hard)
      expect(last.kind).toBe('close')
      if (last.kind === 'close') expect(last.met).toBe(last.halfWidth <= 0.08)
    }
  })

  it('decides on the data alone: the same records give the same decision, and a result row reports it', () => {
    const hard = records(1, 40)
    expect(decidePoint(spec, 1, hard)).toEqual(decidePoint(spec, 1, records(1, 40)))
    const summary = aggregatePoint(pointAt(spec, 1).params, hard)
    const outcome = precisionOutcome(spec, summary)
    expect(outcome).toEqual({ measure: 'success', target: 0.08, halfWidth: expect.any(Number), met: false })
    expect(outcome!.halfWidth).toBeCloseTo(wilsonHalfWidth(summary.success.count, 40), 12)
  })

  it('uses mean ± 1.96·se of the final overlap for the overlap measure', () => {
    const overlapSpec = normaliseSpec({ ...spec, precision: { measure: 'overlap', halfWidth: 0.01, block: 40 } })
    const hard = computeChunk(overlapSpec, { index: 0, point: 1, firstTrial: 0, count: 40 }).trials
    const summary = aggregatePoint(pointAt(overlapSpec, 1).params, hard)
    const decision = decidePoint(overlapSpec, 1, hard)
    const halfWidth = Z * summary.overlap.se
    if (decision.kind === 'close') expect(decision.halfWidth).toBeCloseTo(halfWidth, 12)
    else expect(halfWidth).toBeGreaterThan(0.01)
  })

  it('refuses precision targets the planner cannot honour, naming the field', () => {
    expect(() => normaliseSpec({ ...spec, precision: { measure: 'success', halfWidth: 0.05, block: 200 } })).toThrow(/precision\.block/)
    expect(() => normaliseSpec({ ...spec, streams: 'canonical' })).toThrow(/precision/)
  })
})
