import { afterEach, describe, expect, it } from 'vitest'
import { buildNetwork, createPointRunner, createScratch, runTrialOn, SeedrandomSource, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../../../src/engine/index.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'
import { OverlapKernel, setOverlapPrivateBytes } from '../../../src/engine/kernels/overlap-kernel.js'
import { setDenseIntPrivateBytes } from '../../../src/engine/kernels/dense-int-kernel.js'
import { glauberTableHalf, setGlauberTableHalfMax } from '../../../src/engine/kernels/glauber-table.js'
import { generatePatterns } from '../../../src/engine/patterns/generate.js'

// Glauber's 1 + exp(factor·h) read from a table over the integer field must be the double
// the plain path computes at every visit: the table is checked entry by entry against the
// plain expression, and whole Glauber trials against the plain path.

function params (overrides: Omit<Partial<PointParams>, 'dynamics'> & { dynamics?: Partial<PointParams['dynamics']> } = {}): PointParams {
  const base: PointParams = {
    neurons: 300,
    patterns: 15,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'hebbian', selfCoupling: false },
    dilution: null,
    cue: { kind: 'flip', fraction: 0.15 },
    dynamics: { update: 'async-random', temperature: 0.4, maxSweeps: 8, burnIn: 3 },
    measures: { overlapTrajectory: true, energyTrajectory: true, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 2
  }
  return { ...base, ...overrides, dynamics: { ...base.dynamics, ...overrides.dynamics } }
}

function trials (p: PointParams, fast: boolean, count: number): { records: TrialRecord[], fastPath: string } {
  setFastPathsEnabled(fast)
  const runner = createPointRunner(p, 11, 0)
  const records: TrialRecord[] = []
  for (let t = 0; t < count; t++) records.push(runner.runTrial(t))
  return { records, fastPath: buildNetwork(p, Xoshiro256StarStar.fromSeed(1n)).fastPath }
}

function expectSame (p: PointParams, expectedPath: string, count = 4): void {
  const plain = trials(p, false, count)
  const fast = trials(p, true, count)
  expect(plain.fastPath).toBe('js')
  expect(fast.fastPath).toBe(expectedPath)
  expect(fast.records).toStrictEqual(plain.records)
}

afterEach(() => {
  setFastPathsEnabled(true)
  setGlauberTableHalfMax(null)
})

describe('tabulated Glauber probabilities', () => {
  it('every table entry is the plain path\'s 1 + exp(factor·h) for its field, and a new factor clears the old entries', () => {
    const n = 400
    const p = 20
    const patterns = generatePatterns(params({ neurons: n, patterns: p }), Xoshiro256StarStar.fromSeed(5n))
    const kernel = OverlapKernel.create(n, p, p)!
    kernel.loadPatterns(patterns)
    const state = patterns.slice(0, n)
    const m = new Int32Array(p)
    kernel.overlaps(state, m)
    const rng = Xoshiro256StarStar.fromSeed(9n)
    const order = Int32Array.from({ length: n }, (_, i) => i)
    const noise = new Float64Array(n)
    for (const temperature of [0.3, 1.7]) {
      const factor = -2 / (n * temperature)
      for (let sweep = 0; sweep < 6; sweep++) {
        for (let k = 0; k < n; k++) noise[k] = rng.uniform()
        kernel.glauber(state, m, order, noise, factor)
      }
      const { half, values } = kernel.glauberTableSnapshot()
      expect(half).toBe(glauberTableHalf(factor, p * (n + 1)))
      let filled = 0
      for (let k = 0; k < values.length; k++) {
        if (values[k] === 0) continue
        filled++
        expect(values[k], `field ${k - half}`).toBe(1 + Math.exp(factor * (k - half)))
      }
      // Six sweeps of 400 visits meet many distinct fields: the check is not vacuous.
      expect(filled).toBeGreaterThan(50)
    }
  })

  it('overlap space (int16 and int32 overlaps), asynchronous and synchronous, low and high temperature: identical to the plain path', () => {
    expectSame(params(), 'wasm-simd128-overlap-i16')
    expectSame(params({ dynamics: { temperature: 0.05 } }), 'wasm-simd128-overlap-i16')
    expectSame(params({ dynamics: { temperature: 6 } }), 'wasm-simd128-overlap-i16')
    expectSame(params({ dynamics: { update: 'sync', temperature: 0.6 } }), 'wasm-simd128-overlap-i16')
    expectSame(params({ cue: { kind: 'erase', fraction: 0.3, fill: 'zero' }, dynamics: { update: 'async-sequential' } }), 'wasm-simd128-overlap-i16')
    expectSame(params({ neurons: 33_000, patterns: 4, dynamics: { maxSweeps: 2, burnIn: 1 }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: false } }), 'wasm-simd128-overlap-i32', 1)
  })

  it('integer dense couplings (0/1 neurons), asynchronous and synchronous: identical to the plain path', () => {
    expectSame(params({ coding: 'binary', patterns: 10 }), 'wasm-simd128-dense-i16')
    expectSame(params({ coding: 'binary', patterns: 10, dynamics: { update: 'sync', temperature: 0.8 } }), 'wasm-simd128-dense-i16')
  })

  it('a whole Glauber trial in one call observes every sweep as the plain loop does; another random source runs sweep by sweep', () => {
    // Trajectories on: the kernel stops after every sweep so the energy and overlap are recorded.
    expectSame(params({ dynamics: { maxSweeps: 12, burnIn: 0 } }), 'wasm-simd128-overlap-i16')
    expectSame(params({ dynamics: { maxSweeps: 1, burnIn: 0 }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: false } }), 'wasm-simd128-overlap-i16', 6)
    const p = params()
    const run = (fast: boolean): TrialRecord[] => {
      setFastPathsEnabled(fast)
      const rng = new SeedrandomSource('rooms', 'alea')
      const net = buildNetwork(p, rng)
      const scratch = createScratch(p.neurons, p.patterns)
      return [0, 1, 2].map((t) => runTrialOn(net, p, t, t, rng, scratch))
    }
    expect(run(true)).toStrictEqual(run(false))
  })

  it('private kernel memories keep their patterns readable after the table is placed (stability measure at T > 0)', () => {
    setOverlapPrivateBytes(0)
    setDenseIntPrivateBytes(0)
    try {
      const stability = { overlapTrajectory: false, energyTrajectory: true, stability: true }
      expectSame(params({ measures: stability }), 'wasm-simd128-overlap-i16', 3)
      expectSame(params({ coding: 'binary', patterns: 10, measures: stability }), 'wasm-simd128-dense-i16', 3)
    } finally {
      setOverlapPrivateBytes(8 * 1024 * 1024)
      setDenseIntPrivateBytes(1024 * 1024)
    }
  })

  it('fields outside a narrow window take the direct exponential and still match', () => {
    setGlauberTableHalfMax(3)
    expectSame(params(), 'wasm-simd128-overlap-i16')
    expectSame(params({ coding: 'binary', patterns: 10, dynamics: { update: 'sync' } }), 'wasm-simd128-dense-i16')
  })

  it('a table placed where a larger network kept its patterns is zeroed before use (only memory no network wrote is taken as zero)', () => {
    // A 2000 × 700 network fills the shared kernel memory far past where the small network's table goes.
    const large = params({ neurons: 2000, patterns: 700, dynamics: { temperature: 0, maxSweeps: 3, burnIn: 0 }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: false } })
    const small = params({ dynamics: { temperature: 0.35 } })
    setFastPathsEnabled(false)
    const plain = trials(small, false, 3).records
    setFastPathsEnabled(true)
    createPointRunner(large, 3, 0).runTrial(0)
    const runner = createPointRunner(small, 11, 0)
    expect(Array.from({ length: 3 }, (_, t) => runner.runTrial(t))).toStrictEqual(plain)
  })

  it('networks alternating in the shared kernel memory at different temperatures keep their own tables', () => {
    // Same sizes, so both tables sit at the same place in the shared memory, their windows (half-widths
    // 1800 and 1860) shifted by 60 fields: an entry left by one is read as another field's by the other.
    const a = params({ dynamics: { temperature: 0.3 } })
    const b = params({ dynamics: { temperature: 0.31 } })
    const run = (p: PointParams, point: number, count: number): TrialRecord[] => {
      const runner = createPointRunner(p, 11, point)
      return Array.from({ length: count }, (_, t) => runner.runTrial(t))
    }
    setFastPathsEnabled(false)
    const alone = [run(a, 0, 3), run(b, 1, 3)]
    setFastPathsEnabled(true)
    const ra = createPointRunner(a, 11, 0)
    const rb = createPointRunner(b, 11, 1)
    const interleaved: TrialRecord[][] = [[], []]
    for (let t = 0; t < 3; t++) {
      interleaved[0]!.push(ra.runTrial(t))
      interleaved[1]!.push(rb.runTrial(t))
    }
    expect(interleaved).toStrictEqual(alone)
  })
})
