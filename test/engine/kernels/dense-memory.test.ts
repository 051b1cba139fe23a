import { afterEach, describe, expect, it } from 'vitest'
import { buildNetwork, createPointRunner, createScratch, runTrialOn, SeedrandomSource, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../../../src/engine/index.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'
import { polynomialKernelFits, setDenseMemoryPrivateBytes } from '../../../src/engine/kernels/dense-memory-kernel.js'

// The dense-memory kernel must take exactly the plain path's decisions: the same trials run
// with the fast paths off and on give identical records (trajectories, energies, endings).

type Overrides = Omit<Partial<PointParams>, 'dynamics'> & { dynamics?: Partial<PointParams['dynamics']> }

function params (overrides: Overrides = {}): PointParams {
  const base: PointParams = {
    neurons: 120,
    patterns: 90,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'dense-polynomial', degree: 3 },
    dilution: null,
    cue: { kind: 'flip', fraction: 0.2 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 20, burnIn: 0 },
    measures: { overlapTrajectory: true, energyTrajectory: true, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 3
  }
  return { ...base, ...overrides, dynamics: { ...base.dynamics, ...overrides.dynamics } }
}

const EXP = { kind: 'dense-exponential' } as const

function trials (p: PointParams, fast: boolean, count: number): { records: TrialRecord[], fastPath: string } {
  setFastPathsEnabled(fast)
  const runner = createPointRunner(p, 21, 1)
  const records: TrialRecord[] = []
  for (let t = 0; t < count; t++) records.push(runner.runTrial(t))
  return { records, fastPath: buildNetwork(p, Xoshiro256StarStar.fromSeed(1n)).fastPath }
}

function expectSame (p: PointParams, expectedPath: string, count = 6): TrialRecord[] {
  const plain = trials(p, false, count)
  const fast = trials(p, true, count)
  expect(plain.fastPath).toBe('js')
  expect(fast.fastPath).toBe(expectedPath)
  expect(fast.records).toStrictEqual(plain.records)
  return fast.records
}

const POLY = 'wasm-simd128-dense-memory-poly'
const EXPO = 'wasm-simd128-dense-memory-exp'

afterEach(() => {
  setFastPathsEnabled(true)
  setDenseMemoryPrivateBytes(8 * 1024 * 1024)
})

describe('dense associative memory kernel is bit-identical to the plain path', () => {
  it('polynomial memories, degrees 2 to 5, asynchronous (random and fixed order) and synchronous, above and below capacity', () => {
    for (const degree of [2, 3, 4, 5]) {
      const records = expectSame(params({ rule: { kind: 'dense-polynomial', degree } }), POLY)
      // The cue flips 20 % of the bits, so the sweeps change many neurons in every trial.
      expect(records.every((r) => r.overlap !== r.initialOverlap), `degree ${degree}: dynamics ran`).toBe(true)
    }
    // Far above capacity for n = 3 (P = 400 ≫ N²/…): recall fails, so many neurons change.
    const overloaded = expectSame(params({ patterns: 400, cue: { kind: 'flip', fraction: 0.35 } }), POLY, 4)
    expect(overloaded.some((r) => r.overlap < 0.95)).toBe(true)
    expectSame(params({ dynamics: { update: 'async-sequential' } }), POLY)
    const sync = expectSame(params({ patterns: 300, cue: { kind: 'random' }, dynamics: { update: 'sync', maxSweeps: 30 } }), POLY, 8)
    expect(new Set(sync.map((r) => r.ending)).size).toBeGreaterThan(1)
  })

  it('exponential memory, asynchronous and synchronous, loads beyond N', () => {
    expectSame(params({ rule: EXP }), EXPO)
    expectSame(params({ rule: EXP, neurons: 40, patterns: 600, cue: { kind: 'flip', fraction: 0.3 } }), EXPO, 4)
    expectSame(params({ rule: EXP, patterns: 300, cue: { kind: 'random' }, dynamics: { update: 'sync', maxSweeps: 30 } }), EXPO, 6)
    // N above the range where e^N is finite: the plain path's largest-term scaling must be matched.
    expectSame(params({ rule: EXP, neurons: 900, patterns: 40, dynamics: { maxSweeps: 4 } }), EXPO, 2)
  })

  it('erased cues: zero states make exact ties, which both take through the plain field', () => {
    // All-zero starts: every overlap is 0, so fields are sums of ±equal terms and many are exactly 0.
    for (const rule of [EXP, { kind: 'dense-polynomial', degree: 3 } as const]) {
      expectSame(params({ rule, patterns: 40, cue: { kind: 'erase', fraction: 1, fill: 'zero' } }), rule.kind === 'dense-exponential' ? EXPO : POLY, 4)
      expectSame(params({ rule, cue: { kind: 'erase', fraction: 0.5, fill: 'zero' }, dynamics: { update: 'sync' } }), rule.kind === 'dense-exponential' ? EXPO : POLY, 4)
    }
  })

  it('polynomial memories under Glauber dynamics, asynchronous and synchronous', () => {
    expectSame(params({ dynamics: { temperature: 0.3, maxSweeps: 6, burnIn: 2 } }), POLY, 4)
    expectSame(params({ rule: { kind: 'dense-polynomial', degree: 2 }, patterns: 12, dynamics: { update: 'sync', temperature: 0.5, maxSweeps: 6, burnIn: 2 } }), POLY, 4)
  })

  it('stability measure, mixture cues, private kernel memories, and an injected random source', () => {
    expectSame(params({ cue: { kind: 'mixture', components: 3 }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: true } }), POLY, 3)
    setDenseMemoryPrivateBytes(0)
    expectSame(params(), POLY, 3)
    expectSame(params({ rule: EXP, dynamics: { update: 'sync' } }), EXPO, 3)
    setDenseMemoryPrivateBytes(8 * 1024 * 1024)
    const p = params({ rule: EXP })
    const run = (fast: boolean): TrialRecord[] => {
      setFastPathsEnabled(fast)
      const rng = new SeedrandomSource('rooms', 'alea')
      const net = buildNetwork(p, rng)
      const scratch = createScratch(p.neurons, p.patterns)
      return [0, 1, 2].map((t) => runTrialOn(net, p, t, t, rng, scratch))
    }
    expect(run(true)).toStrictEqual(run(false))
  })

  it('networks sharing the kernel memory do not disturb each other', () => {
    const a = params()
    const b = params({ rule: EXP, neurons: 80, patterns: 150 })
    const run = (p: PointParams, count: number): TrialRecord[] => {
      const runner = createPointRunner(p, 21, 1)
      return Array.from({ length: count }, (_, t) => runner.runTrial(t))
    }
    setFastPathsEnabled(false)
    const alone = [run(a, 4), run(b, 4)]
    setFastPathsEnabled(true)
    const ra = createPointRunner(a, 21, 1)
    const rb = createPointRunner(b, 21, 1)
    const interleaved: TrialRecord[][] = [[], []]
    for (let t = 0; t < 4; t++) {
      interleaved[0]!.push(ra.runTrial(t))
      interleaved[1]!.push(rb.runTrial(t))
    }
    expect(interleaved).toStrictEqual(alone)
  })

  it('a polynomial whose sums would not be exact keeps the plain path', () => {
    // (N + 2)ⁿ ≥ 2⁵³: the table itself is no longer exact.
    expect(polynomialKernelFits(1000, 100, 6)).toBe(false)
    expect(polynomialKernelFits(1000, 100, 4)).toBe(true)
    // 4·P·max|D| ≥ 2⁵³ although every D is exact.
    expect(polynomialKernelFits(1000, 2_000_000, 4)).toBe(false)
    setFastPathsEnabled(true)
    expect(buildNetwork(params({ neurons: 400, rule: { kind: 'dense-polynomial', degree: 7 } }), Xoshiro256StarStar.fromSeed(1n)).fastPath).toBe('js')
  })
})
