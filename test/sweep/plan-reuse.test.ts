/**
 * Plans that take stored trials (planWithReuse): every trial of every point is covered exactly
 * once; a stored chunk is taken whole where it fits and otherwise the part of it the sweep
 * needs (a slice, with the trials to skip); what no stored chunk holds is planned as usual.
 * Scenario: rooms of a model place-cell network at two loads.
 */
import { describe, expect, it } from 'vitest'
import { normaliseSpec } from '../../src/spec/index.js'
import { planWithReuse, type ReusableRange } from '../../src/sweep/plan.js'
import { computeChunk } from '../../src/sweep/compute-chunk.js'

const rooms = (trials: number): ReturnType<typeof normaliseSpec> => normaliseSpec({ label: 'rooms', neurons: 64, load: { values: [0.05, 0.1] }, trials, seed: 3 })

function coverage (plan: ReturnType<typeof planWithReuse>['plan'], point: number): Array<[number, number]> {
  return plan.chunks.filter((chunk) => chunk.point === point).map((chunk) => [chunk.firstTrial, chunk.firstTrial + chunk.count])
}

describe('plans that take stored trials', () => {
  it('take a stored chunk whole where it fits, with no slice', () => {
    const stored: ReusableRange[] = [{ sweepId: 'coarse', chunkIndex: 0, firstTrial: 0, count: 8 }]
    const { plan, inherit } = planWithReuse(rooms(16), (point) => point === 0 ? stored : [])
    expect(inherit).toEqual([{ chunk: plan.chunks[0], from: { sweepId: 'coarse', chunkIndex: 0 } }])
    expect(coverage(plan, 0)[0]).toEqual([0, 8])
    expect(coverage(plan, 0).at(-1)![1]).toBe(16)
  })

  it('take the part of a longer stored chunk a smaller sweep needs', () => {
    const stored: ReusableRange[] = [{ sweepId: 'wide', chunkIndex: 4, firstTrial: 0, count: 240 }]
    const { plan, inherit } = planWithReuse(rooms(100), () => stored)
    expect(inherit.map((entry) => entry.from)).toEqual([{ sweepId: 'wide', chunkIndex: 4, skip: 0 }, { sweepId: 'wide', chunkIndex: 4, skip: 0 }])
    expect(plan.chunks.map((chunk) => chunk.count)).toEqual([100, 100])
  })

  it('continue inside a stored chunk that starts before the trials reached, skipping what is already covered', () => {
    const stored: ReusableRange[] = [
      { sweepId: 'first', chunkIndex: 0, firstTrial: 0, count: 60 },
      { sweepId: 'later', chunkIndex: 2, firstTrial: 30, count: 90 }
    ]
    const { plan, inherit } = planWithReuse(rooms(100), (point) => point === 1 ? stored : [])
    expect(coverage(plan, 1).slice(0, 2)).toEqual([[0, 60], [60, 100]])
    expect(inherit.map((entry) => entry.from)).toEqual([{ sweepId: 'first', chunkIndex: 0 }, { sweepId: 'later', chunkIndex: 2, skip: 30 }])
  })

  it('prefer the range that reaches furthest, then a whole chunk over a slice; cover every trial once', () => {
    const stored: ReusableRange[] = [
      { sweepId: 'a', chunkIndex: 0, firstTrial: 0, count: 20 },
      { sweepId: 'b', chunkIndex: 1, firstTrial: 0, count: 50 },
      { sweepId: 'c', chunkIndex: 0, firstTrial: 70, count: 5 }
    ]
    const { plan, inherit } = planWithReuse(rooms(80), (point) => point === 0 ? stored : [])
    const trials = new Array<number>(80).fill(0)
    for (const chunk of plan.chunks.filter((c) => c.point === 0)) for (let t = chunk.firstTrial; t < chunk.firstTrial + chunk.count; t++) trials[t]!++
    expect(trials.every((n) => n === 1)).toBe(true)
    expect(inherit.map((entry) => entry.from.sweepId)).toEqual(['b', 'c'])
    expect(inherit[0]!.from.skip).toBeUndefined()
  })
})

describe('a slice of stored trials', () => {
  it('holds the records a fresh chunk of the same trials computes, also mid-network and with per-network measures', () => {
    // Several trials share a network (trialsPerNetwork 3) and stability and pattern overlaps are measured per network.
    const spec = normaliseSpec({ label: 'rooms, shared networks', neurons: 64, load: 0.1, trials: 20, trialsPerNetwork: 3, measures: { stability: true, patternOverlaps: true }, seed: 11 })
    const whole = computeChunk(spec, { index: 0, point: 0, firstTrial: 0, count: 20 })
    const middle = computeChunk(spec, { index: 1, point: 0, firstTrial: 5, count: 8 })
    expect(JSON.stringify(middle.trials)).toBe(JSON.stringify(whole.trials.slice(5, 13)))
  })
})
