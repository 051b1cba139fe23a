import { afterEach, describe, expect, it } from 'vitest'
import { createPointRunner, type PointParams, type TrialRecord } from '../../../src/engine/index.js'
import { setFastPathsEnabled } from '../../../src/engine/kernels/wasm.js'
import { setSoftmaxPrivateBytes } from '../../../src/engine/kernels/softmax-kernel.js'

// The softmax kernel must compute the plain loops' doubles bit for bit: the same trials run
// with the fast paths off and on give identical records (overlaps, energies, trajectories).

type Overrides = Omit<Partial<PointParams>, 'dynamics'> & { dynamics?: Partial<PointParams['dynamics']> }

function params (overrides: Overrides = {}): PointParams {
  const base: PointParams = {
    neurons: 100,
    patterns: 45,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'modern-softmax', beta: 8 },
    dilution: null,
    cue: { kind: 'flip', fraction: 0.3 },
    dynamics: { update: 'sync', temperature: 0, maxSweeps: 12, burnIn: 0 },
    measures: { overlapTrajectory: true, energyTrajectory: true, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 3
  }
  return { ...base, ...overrides, dynamics: { ...base.dynamics, ...overrides.dynamics } }
}

function trials (p: PointParams, fast: boolean, count: number, point = 2): { records: TrialRecord[], fastPath: string | null } {
  setFastPathsEnabled(fast)
  const runner = createPointRunner(p, 5, point)
  const records: TrialRecord[] = []
  for (let t = 0; t < count; t++) records.push(runner.runTrial(t))
  return { records, fastPath: runner.fastPath }
}

function expectSame (p: PointParams, count = 6): TrialRecord[] {
  const plain = trials(p, false, count)
  const fast = trials(p, true, count)
  expect(plain.fastPath).toBe('js')
  expect(fast.fastPath).toBe('wasm-simd128-softmax')
  expect(fast.records).toStrictEqual(plain.records)
  return fast.records
}

afterEach(() => {
  setFastPathsEnabled(true)
  setSoftmaxPrivateBytes(8 * 1024 * 1024)
})

describe('softmax kernel is bit-identical to the plain path', () => {
  it('sharp and soft β, dimensions and pattern counts off the SIMD block sizes', () => {
    const sharp = expectSame(params())
    expect(sharp.some((r) => r.sweeps > 1)).toBe(true)
    // Small β: metastable averages of many patterns, long iterations with small moves.
    const soft = expectSame(params({ rule: { kind: 'modern-softmax', beta: 0.4 }, dynamics: { maxSweeps: 30 } }))
    expect(soft.some((r) => r.overlap < 0.9)).toBe(true)
    expectSame(params({ neurons: 37, patterns: 13 }))
    expectSame(params({ neurons: 16, patterns: 8 }))
    expectSame(params({ neurons: 1, patterns: 3, cue: { kind: 'random' } }), 3)
    expectSame(params({ neurons: 203, patterns: 130, cue: { kind: 'flip', fraction: 0.45 } }), 4)
  })

  it('erased, mixture and random cues, and the one-update stability measure', () => {
    expectSame(params({ cue: { kind: 'erase', fraction: 0.6, fill: 'zero' } }))
    expectSame(params({ cue: { kind: 'mixture', components: 3 }, rule: { kind: 'modern-softmax', beta: 2 } }))
    expectSame(params({ cue: { kind: 'random' }, measures: { overlapTrajectory: false, energyTrajectory: false, stability: true } }), 4)
  })

  it('a private kernel memory holding the only copy of the patterns, and networks sharing one', () => {
    setSoftmaxPrivateBytes(0)
    expectSame(params({ neurons: 70, patterns: 21 }), 4)
    setSoftmaxPrivateBytes(8 * 1024 * 1024)
    const a = params()
    const b = params({ neurons: 64, patterns: 90, rule: { kind: 'modern-softmax', beta: 3 } })
    setFastPathsEnabled(false)
    const alone = [trials(a, false, 4, 0).records, trials(b, false, 4, 1).records]
    setFastPathsEnabled(true)
    const ra = createPointRunner(a, 5, 0)
    const rb = createPointRunner(b, 5, 1)
    const interleaved: TrialRecord[][] = [[], []]
    for (let t = 0; t < 4; t++) {
      interleaved[0]!.push(ra.runTrial(t))
      interleaved[1]!.push(rb.runTrial(t))
    }
    expect(interleaved).toStrictEqual(alone)
  })
})
