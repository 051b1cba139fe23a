import { afterEach, describe, expect, it } from 'vitest'
import { buildNetwork, createPointRunner, createScratch, runTrialOn, SeedrandomSource, Xoshiro256StarStar, type PointParams, type TrialRecord } from '../../../src/engine/index.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'
import { setSparsePrivateBytes } from '../../../src/engine/kernels/sparse-kernel.js'

// The fixed in-degree kernel must take exactly the plain path's decisions: the same trials run
// with the fast paths off and on give identical records.

type Overrides = Omit<Partial<PointParams>, 'dynamics'> & { dynamics?: Partial<PointParams['dynamics']> }

function params (overrides: Overrides = {}): PointParams {
  const base: PointParams = {
    neurons: 600,
    patterns: 6,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'hebbian', selfCoupling: false },
    dilution: { kind: 'fixed-in-degree', inDegree: 20 },
    cue: { kind: 'flip', fraction: 0.25 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 25, burnIn: 0 },
    measures: { overlapTrajectory: true, energyTrajectory: true, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 3
  }
  return { ...base, ...overrides, dynamics: { ...base.dynamics, ...overrides.dynamics } }
}

const QUIET = { overlapTrajectory: false, energyTrajectory: false, stability: false }
const PATH = 'wasm-simd128-sparse-in-degree'

function trials (p: PointParams, fast: boolean, count: number): { records: TrialRecord[], fastPath: string } {
  setFastPathsEnabled(fast)
  const runner = createPointRunner(p, 13, 3)
  const records: TrialRecord[] = []
  for (let t = 0; t < count; t++) records.push(runner.runTrial(t))
  return { records, fastPath: buildNetwork(p, Xoshiro256StarStar.fromSeed(1n)).fastPath }
}

function expectSame (p: PointParams, count = 6): TrialRecord[] {
  const plain = trials(p, false, count)
  const fast = trials(p, true, count)
  expect(plain.fastPath).toBe('js')
  expect(fast.fastPath).toBe(PATH)
  expect(fast.records).toStrictEqual(plain.records)
  return fast.records
}

afterEach(() => {
  setFastPathsEnabled(true)
  setSparsePrivateBytes(8 * 1024 * 1024)
})

describe('fixed in-degree kernel is bit-identical to the plain path', () => {
  it('Hebbian and clipped couplings, asynchronous with and without trajectories, fixed order, near and beyond capacity', () => {
    expectSame(params())
    expectSame(params({ measures: QUIET }), 8)
    expectSame(params({ rule: { kind: 'clipped', selfCoupling: false }, measures: QUIET }))
    expectSame(params({ dynamics: { update: 'async-sequential' }, measures: QUIET }))
    // P/K = 0.6, beyond the diluted network's capacity: recall fails and many neurons change.
    const overloaded = expectSame(params({ patterns: 12, measures: QUIET }))
    expect(overloaded.some((r) => r.overlap < 0.95)).toBe(true)
    // A sweep limit of 2: some trials end at the limit.
    const limited = expectSame(params({ patterns: 12, dynamics: { maxSweeps: 2 }, measures: QUIET }), 8)
    expect(limited.some((r) => r.ending === 'max')).toBe(true)
  })

  it('synchronous dynamics, Glauber dynamics and erased cues', () => {
    const sync = expectSame(params({ patterns: 10, cue: { kind: 'random' }, dynamics: { update: 'sync', maxSweeps: 30 } }), 8)
    expect(sync.some((r) => r.ending !== 'fixed')).toBe(true)
    expectSame(params({ dynamics: { temperature: 0.3, maxSweeps: 6, burnIn: 2 } }), 4)
    expectSame(params({ dynamics: { update: 'sync', temperature: 0.5, maxSweeps: 6, burnIn: 2 } }), 4)
    expectSame(params({ cue: { kind: 'erase', fraction: 0.5, fill: 'zero' } }))
    expectSame(params({ cue: { kind: 'erase', fraction: 0.5, fill: 'zero' }, dynamics: { update: 'sync' } }))
  })

  it('private kernel memories, the stability measure, networks sharing one memory, another random source', () => {
    setSparsePrivateBytes(0)
    expectSame(params({ measures: { ...QUIET, stability: true } }), 3)
    expectSame(params({ dynamics: { temperature: 0.4, maxSweeps: 4, burnIn: 1 }, measures: { ...QUIET, stability: true } }), 3)
    setSparsePrivateBytes(8 * 1024 * 1024)
    const a = params()
    const b = params({ neurons: 300, patterns: 4, dilution: { kind: 'fixed-in-degree', inDegree: 30 }, dynamics: { update: 'sync' } })
    const run = (p: PointParams, point: number): TrialRecord[] => {
      const runner = createPointRunner(p, 13, point)
      return Array.from({ length: 4 }, (_, t) => runner.runTrial(t))
    }
    setFastPathsEnabled(false)
    const alone = [run(a, 0), run(b, 1)]
    setFastPathsEnabled(true)
    const ra = createPointRunner(a, 13, 0)
    const rb = createPointRunner(b, 13, 1)
    const interleaved: TrialRecord[][] = [[], []]
    for (let t = 0; t < 4; t++) {
      interleaved[0]!.push(ra.runTrial(t))
      interleaved[1]!.push(rb.runTrial(t))
    }
    expect(interleaved).toStrictEqual(alone)
    const p = params({ measures: QUIET })
    const injected = (fast: boolean): TrialRecord[] => {
      setFastPathsEnabled(fast)
      const rng = new SeedrandomSource('rooms', 'alea')
      const net = buildNetwork(p, rng)
      const scratch = createScratch(p.neurons, p.patterns)
      return [0, 1, 2].map((t) => runTrialOn(net, p, t, t, rng, scratch))
    }
    expect(injected(true)).toStrictEqual(injected(false))
  })
})
