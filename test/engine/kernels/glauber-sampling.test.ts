import { afterEach, describe, expect, it } from 'vitest'
import { buildNetwork, createPointRunner, createScratch, END_STATES, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../../../src/engine/index.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'
import { classifierFor, ThermalAverages } from '../../../src/engine/trial-measures.js'
import { pointParams } from '../../helpers/point.js'

// Whole asynchronous Glauber trials with nothing observed between sweeps take their thermal
// samples inside the kernel (overlaps, their sums, the largest other overlap, the energy, the
// end-state class). Those samples must equal the plain path's bit for bit: every test runs the
// same trials with fast paths off and on and compares whole records, time averages and the
// shares of sweeps in each end-state class included.

const BASE = pointParams({
  neurons: 300,
  patterns: 30,
  cue: { kind: 'flip', fraction: 0.15 },
  dynamics: { update: 'async-random', temperature: 0.4, maxSweeps: 14, burnIn: 4 },
  trialsPerNetwork: 4
})

function params (overrides: Omit<Partial<PointParams>, 'dynamics'> & { dynamics?: Partial<PointParams['dynamics']> } = {}): PointParams {
  return { ...BASE, ...overrides, dynamics: { ...BASE.dynamics, ...overrides.dynamics } }
}

function trials (p: PointParams, fast: boolean, count: number): TrialRecord[] {
  setFastPathsEnabled(fast)
  const runner = createPointRunner(p, 11, 1)
  return Array.from({ length: count }, (_, t) => runner.runTrial(t))
}

/** Runs the trials both ways, compares them and returns the classes their sweeps were in. */
function expectSame (p: PointParams, count = 8): Set<string> {
  const plain = trials(p, false, count)
  const fast = trials(p, true, count)
  expect(fast).toStrictEqual(plain)
  const classes = new Set<string>()
  for (const r of fast) for (const [state, share] of Object.entries(r.endStateShares ?? {})) if (share > 0) classes.add(state)
  return classes
}

afterEach(() => setFastPathsEnabled(true))

describe('Glauber samples taken in the kernel', () => {
  it('equal the plain path across the end-state classes', () => {
    const seen = new Set<string>()
    const add = (classes: Set<string>): void => { for (const c of classes) seen.add(c) }
    // Retrieval near the pattern level: target and partial target.
    add(expectSame(params({ dynamics: { temperature: 0.5 } })))
    // Cues near the reversed pattern.
    add(expectSame(params({ cue: { kind: 'flip', fraction: 0.92 }, dynamics: { temperature: 0.3 } })))
    // Random starts at a low load fall on other patterns and mixtures.
    add(expectSame(params({ neurons: 400, patterns: 8, cue: { kind: 'random' }, dynamics: { temperature: 0.2 } }), 12))
    // Three-pattern mixture cues at a low temperature.
    add(expectSame(params({ neurons: 600, patterns: 9, cue: { kind: 'mixture', components: 3 }, dynamics: { temperature: 0.1, maxSweeps: 10, burnIn: 2 } })))
    // Past capacity and in the paramagnetic phase.
    add(expectSame(params({ patterns: 90, cue: { kind: 'random' }, dynamics: { temperature: 0.3 } })))
    add(expectSame(params({ dynamics: { temperature: 1.6 } })))
    // The cases above must reach the host's classifier, not only the kernel's "target" test.
    for (const state of ['target', 'reversed', 'otherPattern', 'partialTarget', 'spinGlass']) expect([...seen], state).toContain(state)
    expect(seen.size).toBeGreaterThanOrEqual(6)
  })

  it('equal the plain path for sizes off the SIMD widths, a fixed order, no burn-in and a single sweep', () => {
    expectSame(params({ neurons: 203, patterns: 17 }))
    expectSame(params({ dynamics: { update: 'async-sequential' } }))
    expectSame(params({ cue: { kind: 'erase', fraction: 0.4, fill: 'zero' }, dynamics: { burnIn: 0, maxSweeps: 5 } }))
    expectSame(params({ dynamics: { burnIn: 0, maxSweeps: 1 } }))
  })

  it('are what the overlap-space kernel runs for such trials (not the per-sweep observer)', () => {
    const p = params()
    const net = buildNetwork(p, Xoshiro256StarStar.fromSeed(5n))
    const scratch = createScratch(p.neurons, p.patterns)
    net.load(net.patterns.subarray(0, p.neurons))
    scratch.order.forEach((_, i) => { scratch.order[i] = i })
    const averages = new ThermalAverages(p.patterns, 0, classifierFor(p), scratch.overlapSums)
    const totals = net.native?.runGlauberSampled?.(scratch.order, 12, true, -2 / p.neurons / 0.2, Xoshiro256StarStar.fromSeed(6n), averages.nativeSampling(2))
    expect(totals).not.toBeNull()
    expect(totals!.count).toBe(10)
    expect(totals!.classCounts.reduce((a, b) => a + b, 0)).toBe(10)
    expect(totals!.classCounts.length).toBe(END_STATES.length)
    // Started on pattern 0 at T = 0.2 and α = 0.1: the samples stay near it.
    expect(totals!.sums[0]! / totals!.count).toBeGreaterThan(0.9)
  })
})
