import { describe, expect, it } from 'vitest'
import { createPointRunner, estimatePointCost, RECLAIM_BYTES } from '../../src/engine/index.js'
import { pointParams } from '../helpers/point.js'

/**
 * A point that builds several large networks in turn must not hold them all until the
 * collector runs: the runner redraws the next network in the memory of the one before where
 * the representation allows, and otherwise lets go of it and asks the host to collect before
 * each large build (bench/memory.ts measures the peak this keeps at one network).
 */
describe('point runner and the host collector', () => {
  // 2·N·P bytes in overlap space: about 37 MB, above the 32 MiB threshold.
  const large = pointParams({ neurons: 12_000, patterns: 1536, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { update: 'sync', temperature: 0, maxSweeps: 2, burnIn: 0 }, trialsPerNetwork: 2 })
  const small = pointParams({ neurons: 200, patterns: 10, trialsPerNetwork: 1 })

  // A coupling matrix of 2100² doubles (35 MB) cannot be redrawn in place.
  const largeDense = pointParams({ neurons: 2100, patterns: 5, rule: { kind: 'storkey', selfCoupling: false }, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { update: 'sync', temperature: 0, maxSweeps: 2, burnIn: 0 }, trialsPerNetwork: 2 })

  it('asks to collect once before each large network it builds anew', () => {
    expect(estimatePointCost(largeDense).bytes).toBeGreaterThanOrEqual(RECLAIM_BYTES)
    let calls = 0
    const runner = createPointRunner(largeDense, 9, 0, { reclaim: () => { calls++ } })
    for (let t = 0; t < 4; t++) runner.runTrial(t)
    expect(calls).toBe(2)
  })

  it('builds a large overlap-space network once and redraws the next ones in its memory, with nothing to collect', () => {
    expect(estimatePointCost(large).bytes).toBeGreaterThanOrEqual(RECLAIM_BYTES)
    let calls = 0
    const runner = createPointRunner(large, 9, 0, { reclaim: () => { calls++ } })
    for (let t = 0; t < 6; t++) runner.runTrial(t)
    expect(calls).toBe(1)
  })

  it('never asks for small networks, and gives the same trials with or without a collector', () => {
    let calls = 0
    const withHook = createPointRunner(small, 9, 0, { reclaim: () => { calls++ } })
    const without = createPointRunner(small, 9, 0)
    const a = Array.from({ length: 5 }, (_, t) => withHook.runTrial(t))
    const b = Array.from({ length: 5 }, (_, t) => without.runTrial(t))
    expect(calls).toBe(0)
    expect(JSON.stringify(a)).toBe(JSON.stringify(b))
  })
})
