import { afterEach, describe, expect, it } from 'vitest'
import { buildNetwork, createPointRunner, createScratch, runTrialOn, SeedrandomSource, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../../../src/engine/index.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'
import { DenseNetwork } from '../../../src/engine/network/dense.js'
import { setOverlapPrivateBytes } from '../../../src/engine/kernels/overlap-kernel.js'
import { setDensePrivateBytes } from '../../../src/engine/kernels/dense-kernel.js'
import { setDenseIntPrivateBytes } from '../../../src/engine/kernels/dense-int-kernel.js'

// The fast paths must reproduce the plain per-neuron path bit for bit on the same stream:
// every test runs the same trials twice, fast paths off and on, and compares whole records.

function params (overrides: Omit<Partial<PointParams>, 'dynamics'> & { dynamics?: Partial<PointParams['dynamics']> } = {}): PointParams {
  const base: PointParams = {
    neurons: 300,
    patterns: 30,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'hebbian', selfCoupling: false },
    dilution: null,
    cue: { kind: 'flip', fraction: 0.15 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 30, burnIn: 0 },
    measures: { overlapTrajectory: true, energyTrajectory: true, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 3
  }
  return { ...base, ...overrides, dynamics: { ...base.dynamics, ...overrides.dynamics } }
}

function trials (p: PointParams, fast: boolean, count: number, seed = 7): { records: TrialRecord[], fastPath: string } {
  setFastPathsEnabled(fast)
  const runner = createPointRunner(p, seed, 2)
  const records: TrialRecord[] = []
  for (let t = 0; t < count; t++) records.push(runner.runTrial(t))
  const fastPath = buildNetwork(p, Xoshiro256StarStar.fromSeed(1n)).fastPath
  return { records, fastPath }
}

function expectSame (p: PointParams, count = 6, expectedPath: string | RegExp = 'wasm-simd128-overlap-i16'): TrialRecord[] {
  const plain = trials(p, false, count)
  const fast = trials(p, true, count)
  expect(plain.fastPath).toBe('js')
  expect(fast.fastPath).toMatch(expectedPath)
  expect(fast.records).toStrictEqual(plain.records)
  return fast.records
}

afterEach(() => setFastPathsEnabled(true))

describe('overlap-space fast path is bit-identical to the plain path', () => {
  it('asynchronous zero-temperature recall near capacity (W1-like), with trajectories', () => {
    const records = expectSame(params({ patterns: 40 }))
    // Near α = 0.13 some trials must fail or wander, so the comparison covers real dynamics.
    expect(new Set(records.map((r) => r.sweeps)).size).toBeGreaterThan(1)
  })

  it('whole trials in one call (no trajectories): random and sequential orders, erased cues, sweep limit', () => {
    const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }
    expectSame(params({ patterns: 40, measures: quiet }), 8)
    expectSame(params({ neurons: 203, patterns: 30, cue: { kind: 'erase', fraction: 0.4, fill: 'zero' }, measures: quiet }))
    expectSame(params({ neurons: 150, rule: { kind: 'hebbian', selfCoupling: true }, dynamics: { update: 'async-sequential' }, measures: quiet }))
    // At most two sweeps: trials that need a third end at the limit.
    const limited = expectSame(params({ patterns: 30, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { maxSweeps: 2 }, measures: quiet }), 8)
    expect(limited.some((r) => r.ending === 'max')).toBe(true)
    expect(limited.some((r) => r.ending === 'fixed')).toBe(true)
    expectSame(params({ neurons: 1, patterns: 1, cue: { kind: 'random' }, measures: quiet }), 3)
  })

  it('whole trials that skip fields whose sign is settled: few patterns (a flip moves a field by the full bound), many trials', () => {
    // With P ≤ 3 a flip changes another neuron's field by 2|ξ_i·ξ_j|, often the whole bound 2P,
    // so any slack in the bound would change a decision somewhere in these trials.
    const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }
    for (const patterns of [1, 2, 3]) {
      for (const update of ['async-random', 'sync'] as const) {
        expectSame(params({ neurons: 120, patterns, cue: { kind: 'random' }, dynamics: { update, maxSweeps: 12 }, measures: quiet }), 12)
        expectSame(params({ neurons: 97, patterns, cue: { kind: 'erase', fraction: 0.5, fill: 'zero' }, dynamics: { update }, measures: quiet }), 12)
        // Tiny networks: fields of a few units, so a bound off by any factor meets a real flip of the sign.
        expectSame(params({ neurons: 12, patterns, cue: { kind: 'random' }, dynamics: { update, maxSweeps: 12 }, measures: quiet, trialsPerNetwork: 1 }), 60)
      }
    }
  })

  it('whole synchronous trials in one call (no trajectories): fixed points, 2-cycles, step limit, int32 overlaps', () => {
    const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }
    const records = expectSame(params({ patterns: 45, cue: { kind: 'random' }, dynamics: { update: 'sync', maxSweeps: 40 }, measures: quiet }), 8)
    expect(new Set(records.map((r) => r.ending))).toStrictEqual(new Set(['fixed', 'cycle2']))
    const limited = expectSame(params({ patterns: 45, cue: { kind: 'random' }, dynamics: { update: 'sync', maxSweeps: 3 }, measures: quiet }), 8)
    expect(limited.some((r) => r.ending === 'max')).toBe(true)
    expectSame(params({ neurons: 33_000, patterns: 5, cue: { kind: 'flip', fraction: 0.3 }, dynamics: { update: 'sync', maxSweeps: 4 }, measures: quiet }), 2, 'wasm-simd128-overlap-i32')
  })

  it('synchronous zero-temperature dynamics with fixed points and 2-cycles', () => {
    const records = expectSame(params({ patterns: 45, cue: { kind: 'random' }, dynamics: { update: 'sync', maxSweeps: 40 } }), 8)
    // Random starts at α = 0.15 end in both kinds of attractor, so both kernel exits are compared.
    expect(new Set(records.map((r) => r.ending))).toStrictEqual(new Set(['fixed', 'cycle2']))
  })

  it('Glauber dynamics, asynchronous and synchronous', () => {
    expectSame(params({ dynamics: { temperature: 0.4, maxSweeps: 6, burnIn: 2 } }), 4)
    expectSame(params({ dynamics: { update: 'sync', temperature: 0.7, maxSweeps: 6, burnIn: 2 } }), 4)
  })

  it('erased cues (zero and random fill), fixed sequential order', () => {
    expectSame(params({ cue: { kind: 'erase', fraction: 0.4, fill: 'zero' } }))
    expectSame(params({ cue: { kind: 'erase', fraction: 0.4, fill: 'random' }, dynamics: { update: 'async-sequential' } }))
  })

  it('self-coupling kept, mixture cues and the stability measure', () => {
    expectSame(params({ rule: { kind: 'hebbian', selfCoupling: true }, cue: { kind: 'mixture', components: 3 }, measures: { overlapTrajectory: false, energyTrajectory: true, stability: true } }))
  })

  it('pattern counts that are not multiples of 16 or 64, sizes that are not multiples of 64', () => {
    expectSame(params({ neurons: 203, patterns: 17 }))
    expectSame(params({ neurons: 410, patterns: 70, dynamics: { update: 'sync' } }), 4)
  })

  it('int32 overlaps when N exceeds the int16 range; patterns staged in several chunks', () => {
    const p = params({ neurons: 33_000, patterns: 40, cue: { kind: 'flip', fraction: 0.3 }, dynamics: { maxSweeps: 3 }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: false } })
    expectSame(p, 2, 'wasm-simd128-overlap-i32')
  })

  it('networks sharing the kernel workspace do not disturb each other', () => {
    const a = params({ neurons: 256, patterns: 20 })
    const b = params({ neurons: 500, patterns: 50, dynamics: { update: 'sync' } })
    setFastPathsEnabled(true)
    const alone = [trials(a, true, 4).records, trials(b, true, 4).records]
    const ra = createPointRunner(a, 7, 2)
    const rb = createPointRunner(b, 7, 2)
    const interleaved: TrialRecord[][] = [[], []]
    for (let t = 0; t < 4; t++) {
      interleaved[0]!.push(ra.runTrial(t))
      interleaved[1]!.push(rb.runTrial(t))
    }
    expect(interleaved).toStrictEqual(alone)
  })

  it('networks with a private kernel memory (big networks) match too', () => {
    setOverlapPrivateBytes(0)
    setDensePrivateBytes(0)
    try {
      expectSame(params({ neurons: 150, patterns: 20 }), 3)
      expectSame(params({ neurons: 150, patterns: 20, dynamics: { update: 'sync' } }), 3)
      expectSame(params({ neurons: 100, patterns: 10, dilution: { keep: 0.3, symmetric: true } }), 3, 'wasm-simd128-dense-f64')
      expectSame(params({ neurons: 100, patterns: 10, dilution: { keep: 0.3, symmetric: false }, dynamics: { update: 'sync' } }), 3, 'wasm-simd128-dense-f64')
      expectSame(params({ neurons: 100, patterns: 10, dilution: { keep: 0.5, symmetric: true } }), 3, 'wasm-simd128-dense-i16')
      expectSame(params({ neurons: 100, patterns: 10, dilution: { keep: 0.5, symmetric: false }, dynamics: { update: 'sync' } }), 3, 'wasm-simd128-dense-i16')
    } finally {
      setOverlapPrivateBytes(8 * 1024 * 1024)
      setDensePrivateBytes(1024 * 1024)
      setDenseIntPrivateBytes(1024 * 1024)
    }
  })

  it('an injected non-xoshiro source shuffles in JavaScript and still matches (also where the network was built for whole native trials only)', () => {
    const quiet = params({ measures: { overlapTrajectory: false, energyTrajectory: false, stability: false } })
    const runQuiet = (fast: boolean): TrialRecord[] => {
      setFastPathsEnabled(fast)
      const rng = new SeedrandomSource('rooms', 'alea')
      const net = buildNetwork(quiet, rng)
      const scratch = createScratch(quiet.neurons, quiet.patterns)
      return [0, 1, 2].map((t) => runTrialOn(net, quiet, t, t, rng, scratch))
    }
    expect(runQuiet(true)).toStrictEqual(runQuiet(false))
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
})

describe('dense fast path is bit-identical to the plain path', () => {
  const dense = 'wasm-simd128-dense-f64'
  const small = { neurons: 120, patterns: 12, trialsPerNetwork: 2 }

  it('diluted Hebbian couplings, symmetric and asymmetric, asynchronous and synchronous', () => {
    // Survivors scaled by 1/0.3 are not integers: float64 kernel.
    expectSame(params({ ...small, dilution: { keep: 0.3, symmetric: true } }), 4, dense)
    expectSame(params({ ...small, dilution: { keep: 0.3, symmetric: false }, dynamics: { update: 'sync' } }), 4, dense)
    // Keeping one in two doubles the survivors: integer couplings, int16 kernel.
    expectSame(params({ ...small, dilution: { keep: 0.5, symmetric: true } }), 4, 'wasm-simd128-dense-i16')
    expectSame(params({ ...small, dilution: { keep: 0.5, symmetric: false }, dynamics: { update: 'sync' } }), 4, 'wasm-simd128-dense-i16')
    expectSame(params({ ...small, dilution: { keep: 0.5, symmetric: false }, cue: { kind: 'erase', fraction: 0.3, fill: 'zero' } }), 4, 'wasm-simd128-dense-i16')
  })

  it('Hebbian networks of 0/1 neurons (integer couplings and bias), all dynamics', () => {
    const binary = { ...small, coding: 'binary' as const }
    expectSame(params({ ...binary }), 4, 'wasm-simd128-dense-i16')
    expectSame(params({ ...binary, cue: { kind: 'erase', fraction: 0.3, fill: 'zero' }, dynamics: { update: 'sync' } }), 4, 'wasm-simd128-dense-i16')
    expectSame(params({ ...binary, dynamics: { temperature: 0.5, maxSweeps: 5, burnIn: 1 } }), 3, 'wasm-simd128-dense-i16')
    expectSame(params({ ...binary, dilution: { keep: 0.5, symmetric: false }, dynamics: { update: 'sync', temperature: 0.5, maxSweeps: 5, burnIn: 1 } }), 3, 'wasm-simd128-dense-i16')
  })

  it('pseudo-inverse, Storkey and covariance rules', () => {
    // The numerical pseudo-inverse may be symmetric only up to rounding (fields then built row by row).
    expectSame(params({ ...small, rule: { kind: 'pseudo-inverse', selfCoupling: false }, patterns: 30 }), 4, /^wasm-simd128-dense-f64/)
    expectSame(params({ ...small, rule: { kind: 'pseudo-inverse', selfCoupling: false }, patterns: 30, dynamics: { update: 'sync' } }), 4, /^wasm-simd128-dense-f64/)
    expectSame(params({ ...small, rule: { kind: 'storkey', selfCoupling: false } }), 4, dense)
    expectSame(params({ ...small, family: { kind: 'random', activity: 0.2 }, rule: { kind: 'covariance', selfCoupling: false, threshold: null }, dynamics: { update: 'sync' } }), 4, dense)
  })

  it('Glauber dynamics on a diluted network, asynchronous and synchronous', () => {
    expectSame(params({ ...small, dilution: { keep: 0.7, symmetric: true }, dynamics: { temperature: 0.5, maxSweeps: 5, burnIn: 1 } }), 3, dense)
    expectSame(params({ ...small, dilution: { keep: 0.5, symmetric: true }, dynamics: { temperature: 0.5, maxSweeps: 5, burnIn: 1 } }), 3, 'wasm-simd128-dense-i16')
    expectSame(params({ ...small, dilution: { keep: 0.7, symmetric: false }, dynamics: { update: 'sync', temperature: 0.5, maxSweeps: 5, burnIn: 1 } }), 3, dense)
  })

  it('a matrix declared symmetric that is not so bit for bit builds fields row by row, as the plain path does', () => {
    const n = 90
    const p = params({ neurons: n, patterns: 5, rule: { kind: 'pseudo-inverse', selfCoupling: false }, cue: { kind: 'random' } })
    const run = (fast: boolean, update: 'async-random' | 'sync'): { path: string, records: TrialRecord[] } => {
      setFastPathsEnabled(fast)
      const rng = Xoshiro256StarStar.fromSeed(5n)
      const couplings = new Float64Array(n * n)
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < i; j++) {
          const v = rng.uniform() - 0.5
          couplings[i * n + j] = v
          couplings[j * n + i] = v * (1 + 1e-15)
        }
      }
      const net = new DenseNetwork({ patterns: new Int8Array(5 * n).fill(1), neurons: n, patternCount: 5, couplings, bias: new Float64Array(n), fieldScale: 1, symmetric: true })
      const q = { ...p, dynamics: { ...p.dynamics, update } }
      const scratch = createScratch(n, 5)
      return { path: net.fastPath, records: [0, 1, 2].map((t) => runTrialOn(net, q, t, 0, rng, scratch)) }
    }
    for (const update of ['async-random', 'sync'] as const) {
      const fast = run(true, update)
      expect(fast.path).toBe('wasm-simd128-dense-f64-rows')
      expect(fast.records).toStrictEqual(run(false, update).records)
    }
  })

  it('the per-neuron API (load, set, field, energy) gives the plain values on the int16 kernel', () => {
    const n = 70
    const fields = (fast: boolean): number[] => {
      setFastPathsEnabled(fast)
      const rng = Xoshiro256StarStar.fromSeed(9n)
      const couplings = new Float64Array(n * n)
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (i !== j) couplings[i * n + j] = rng.below(41) - 20
      const net = new DenseNetwork({ patterns: new Int8Array(n), neurons: n, patternCount: 1, couplings, bias: new Float64Array(n).fill(3), fieldScale: 0.5, symmetric: false })
      expect(net.fastPath).toBe(fast ? 'wasm-simd128-dense-i16' : 'js')
      const state = Int8Array.from({ length: n }, (_, i) => (i % 3 === 0 ? -1 : i % 3 === 1 ? 1 : 0))
      net.load(state)
      for (const [j, v] of [[4, -1], [5, 1], [4, 1], [9, 0]] as const) net.set(j, v)
      return [...Array.from({ length: n }, (_, i) => net.field(i)), net.energyPerNeuron()]
    }
    expect(fields(true)).toStrictEqual(fields(false))
  })
})
