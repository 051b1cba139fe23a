import { describe, it, expect } from 'vitest'
import { runCapacityWorkload, runSharedNetworkWorkload, summarize, workloadParams } from '../../bench/canonical.js'

/**
 * Bit-for-bit cross-check against the C reference program of the shared benchmark
 * (shared/bench/RESULTS.md, integer variants i16/i16inc/ovl, seed 1): when the engine is fed
 * the canonical xoshiro256** stream it must reproduce those outputs exactly. These are
 * measured regression references of a reference implementation, not published values.
 */
describe('canonical workloads against the C reference outputs', () => {
  it('W1 (N = 1000, P = 100, 200 async trials, 100 flipped bits)', () => {
    const s = summarize(runSharedNetworkWorkload('W1', workloadParams(1000, 100, 100, 'async-random'), 200, 1).trials)
    expect(s.meanOverlap.toFixed(6)).toBe('0.997970')
    expect(s.meanSweeps).toBe(3.055)
    expect(s.fracSuccess).toBe(1)
    expect(s.maxed).toBe(0)
  })

  it('W4 (synchronous, fixed points and 2-cycles)', () => {
    const s = summarize(runSharedNetworkWorkload('W4', workloadParams(1000, 100, 100, 'sync'), 200, 1).trials)
    expect(s.meanOverlap.toFixed(6)).toBe('0.997910')
    expect(s.meanSweeps).toBe(3.57)
    expect([s.fixed, s.cycle2, s.maxed]).toEqual([199, 1, 0])
  })

  it('W2 success curve (a new network per trial, α = 0.02 … 0.24)', () => {
    const c = runCapacityWorkload(1)
    expect(c.success).toEqual([1, 1, 1, 1, 1, 0.98, 0.88, 0.46, 0.26, 0.02, 0, 0.02])
  })
})
