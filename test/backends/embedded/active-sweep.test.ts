/**
 * Dispatch bookkeeping of one sweep with precision targets. A point marked as being decided
 * must be the one handed out: a point marked but never handed out would wait for a decision
 * for ever and keep its sweep running (seen when two points came due between two scheduling
 * rounds, a timing that only heavy load produced).
 */
import { describe, expect, it } from 'vitest'
import { ActiveSweep } from '../../../src/backends/embedded/active-sweep.js'
import { normaliseSpec } from '../../../src/spec/index.js'
import { planSweep } from '../../../src/sweep/index.js'

/** Room codes at three loads, blocks of 30 trials: one first-block chunk per point. */
const spec = normaliseSpec({
  label: 'room codes, decisions one at a time',
  neurons: 100,
  load: { values: [0.03, 0.12, 0.2] },
  trials: 150,
  precision: { measure: 'success', halfWidth: 0.07, block: 30 },
  seed: 7
})

function activeSweep (): ActiveSweep {
  return new ActiveSweep({ id: 'rooms', ownerKey: '', seq: 1, spec, plan: planSweep(spec), doneIndices: [], openPoints: [0, 1, 2], startedMs: null })
}

/** Runs every waiting chunk to the end, as if all threads finished before the next scheduling round. */
function finishAll (sweep: ActiveSweep): void {
  for (let next = sweep.takeNext(); next !== undefined; next = sweep.takeNext()) sweep.finish(next.chunk.index)
}

describe('decisions on points with precision targets', () => {
  it('hands out points due at the same time one by one, each exactly once', () => {
    const sweep = activeSweep()
    expect(sweep.plan.map((chunk) => chunk.point).sort()).toEqual([0, 1, 2])
    finishAll(sweep)
    const first = sweep.takeDuePoint()
    const second = sweep.takeDuePoint()
    const third = sweep.takeDuePoint()
    expect(new Set([first, second, third])).toEqual(new Set([0, 1, 2]))
    expect(sweep.takeDuePoint()).toBeUndefined()
  })

  it('ends only when every point has been closed, whatever order the decisions come in', () => {
    const sweep = activeSweep()
    finishAll(sweep)
    const taken = [sweep.takeDuePoint(), sweep.takeDuePoint()]
    expect(sweep.allDone).toBe(false)
    for (const point of taken) sweep.decided(point!, true)
    expect(sweep.allDone).toBe(false)
    const last = sweep.takeDuePoint()
    expect(last).toBeDefined()
    sweep.decided(last!, true)
    expect(sweep.allDone).toBe(true)
  })

  it('offers a point again after a decision that did not close it, and not while its next block runs', () => {
    const sweep = activeSweep()
    finishAll(sweep)
    const point = sweep.takeDuePoint()!
    sweep.append([{ index: sweep.plan.length, point, firstTrial: 30, count: 30 }])
    sweep.decided(point, false)
    const others = [sweep.takeDuePoint(), sweep.takeDuePoint()]
    expect(others).not.toContain(point)
    expect(sweep.takeDuePoint()).toBeUndefined()
    finishAll(sweep)
    expect(sweep.takeDuePoint()).toBe(point)
  })
})
