import { afterEach, describe, it, expect } from 'vitest'
import { aggregatePoint, buildNetwork, createPointRunner, createScratch, openStream, runTrialOn, type PointParams } from '../../src/engine/index.js'
import { setFastPathsEnabled } from '../../src/engine/kernels/wasm.js'
import { pointParams } from '../helpers/point.js'

const variants: Array<[string, PointParams]> = [
  ['Hebbian async, flip cue', pointParams({ neurons: 300, patterns: 36, cue: { kind: 'flip', fraction: 0.15 }, trialsPerNetwork: 7 })],
  ['Glauber, erased cue', pointParams({ neurons: 200, patterns: 8, cue: { kind: 'erase', fraction: 0.3, fill: 'random' }, dynamics: { update: 'async-random', temperature: 0.5, maxSweeps: 12, burnIn: 4 } })],
  ['Storkey sync, diluted', pointParams({ neurons: 120, patterns: 12, rule: { kind: 'storkey', selfCoupling: false }, dilution: { keep: 0.5, symmetric: false }, dynamics: { update: 'sync', temperature: 0, maxSweeps: 30, burnIn: 0 }, cue: { kind: 'flip', fraction: 0.2 }, trialsPerNetwork: 25 })]
]

describe('determinism', () => {
  it.each(variants)('same seed gives bit-identical trials (%s)', (_name, p) => {
    const a = createPointRunner(p, 2024, 3)
    const b = createPointRunner(p, 2024, 3)
    const ra = Array.from({ length: 30 }, (_, t) => a.runTrial(t))
    const rb = Array.from({ length: 30 }, (_, t) => b.runTrial(t))
    expect(JSON.stringify(rb)).toBe(JSON.stringify(ra))
    expect(JSON.stringify(aggregatePoint(p, rb))).toBe(JSON.stringify(aggregatePoint(p, ra)))
  })

  it.each(variants)('trials 50–99 alone equal the same trials inside the full run (%s)', (_name, p) => {
    const full = createPointRunner(p, 77, 1)
    const all = Array.from({ length: 100 }, (_, t) => full.runTrial(t))
    const part = createPointRunner(p, 77, 1)
    const tail = Array.from({ length: 50 }, (_, k) => part.runTrial(50 + k))
    expect(JSON.stringify(tail)).toBe(JSON.stringify(all.slice(50)))
    // Reversed order too: nothing depends on which trial ran before.
    const reversed = createPointRunner(p, 77, 1)
    const back = Array.from({ length: 50 }, (_, k) => reversed.runTrial(99 - k)).reverse()
    expect(JSON.stringify(back)).toBe(JSON.stringify(all.slice(50)))
  })

  it('a different seed or grid point gives different trials', () => {
    const p = variants[0]![1]
    const base = JSON.stringify(createPointRunner(p, 1, 0).runTrial(0))
    expect(JSON.stringify(createPointRunner(p, 2, 0).runTrial(0))).not.toBe(base)
    expect(JSON.stringify(createPointRunner(p, 1, 1).runTrial(0))).not.toBe(base)
  })
})

describe('a network per trial, redrawn in the memory of the one before', () => {
  afterEach(() => setFastPathsEnabled(true))

  /** What the runner must reproduce: a network built afresh for every trial, on the runner's streams. */
  function builtAfresh (p: PointParams, seed: number, point: number, trials: number): string {
    const scratch = createScratch(p.neurons, p.patterns)
    return JSON.stringify(Array.from({ length: trials }, (_, t) => {
      const net = buildNetwork(p, openStream(seed, 'network', point, t))
      return runTrialOn(net, p, t, t % p.patterns, openStream(seed, 'trial', point, t), scratch)
    }))
  }

  const perTrial: Array<[string, PointParams]> = [
    ['whole asynchronous trials', pointParams({ neurons: 300, patterns: 45, cue: { kind: 'flip', fraction: 0.2 } })],
    ['synchronous, with trajectories', pointParams({ neurons: 200, patterns: 30, dynamics: { update: 'sync', temperature: 0, maxSweeps: 30, burnIn: 0 }, measures: { overlapTrajectory: true, energyTrajectory: true, stability: false } })],
    ['Glauber', pointParams({ neurons: 200, patterns: 10, dynamics: { update: 'async-random', temperature: 0.4, maxSweeps: 8, burnIn: 3 } })],
    ['int32 overlaps', pointParams({ neurons: 40_000, patterns: 2, cue: { kind: 'flip', fraction: 0.1 } })]
  ]

  it.each(perTrial)('gives the trials of networks built afresh, fast paths on and off (%s)', (_name, p) => {
    for (const fast of [true, false]) {
      setFastPathsEnabled(fast)
      const trials = p.neurons > 10_000 ? 3 : 12
      const runner = createPointRunner(p, 31, 2)
      const redrawn = JSON.stringify(Array.from({ length: trials }, (_, t) => runner.runTrial(t)))
      expect(redrawn, `fast paths ${fast ? 'on' : 'off'}`).toBe(builtAfresh(p, 31, 2, trials))
    }
  })

  it('starts each redrawn network from the zero state, so a cue close to the last state cannot reuse stale overlaps', () => {
    // One pattern, a cue flipping nothing: the plain path loads the cue by updating the
    // overlaps of the changed neurons only when few changed since the last state.
    const p = pointParams({ neurons: 64, patterns: 1, cue: { kind: 'flip', fraction: 0 }, dynamics: { update: 'sync', temperature: 0, maxSweeps: 5, burnIn: 0 } })
    setFastPathsEnabled(false)
    const runner = createPointRunner(p, 8, 0)
    const redrawn = JSON.stringify(Array.from({ length: 20 }, (_, t) => runner.runTrial(t)))
    expect(redrawn).toBe(builtAfresh(p, 8, 0, 20))
  })
})

describe('aggregation', () => {
  it('counts successes, endings and end states and gives a Wilson interval', () => {
    const p = pointParams({ neurons: 200, patterns: 40, cue: { kind: 'flip', fraction: 0.2 } })
    const runner = createPointRunner(p, 5, 0)
    const trials = Array.from({ length: 40 }, (_, t) => runner.runTrial(t))
    const s = aggregatePoint(p, trials)
    const successes = trials.filter((t) => t.overlap >= p.successThreshold).length
    expect(s.trials).toBe(40)
    expect(s.success.count).toBe(successes)
    expect(s.success.low).toBeLessThanOrEqual(s.success.rate)
    expect(s.success.high).toBeGreaterThanOrEqual(s.success.rate)
    expect(Object.values(s.endStates).reduce((a, b) => a + b, 0)).toBe(40)
    expect(Object.values(s.endings).reduce((a, b) => a + b, 0)).toBe(40)
    expect(s.overlap.se).toBeCloseTo(s.overlap.sd / Math.sqrt(40), 12)
  })
})
