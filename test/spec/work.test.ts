import { describe, expect, it } from 'vitest'
import { estimatePointCost } from '../../src/engine/index.js'
import { checkLimits, DEFAULT_LIMITS, ENGINE_OPS_PER_CPU_SECOND, estimateWork, normaliseSpec, pointAt, WorkLimitError } from '../../src/spec/index.js'

function limitError (run: () => unknown): WorkLimitError {
  try {
    run()
  } catch (error) {
    if (error instanceof WorkLimitError) return error
    throw error
  }
  throw new Error('expected a WorkLimitError')
}

describe('estimateWork', () => {
  it('adds up the engine\'s per-point costs over the grid', () => {
    const spec = normaliseSpec({ neurons: { values: [100, 300] }, load: { values: [0.05, 0.1] }, trials: 30, trialsPerNetwork: 3 })
    const estimate = estimateWork(spec)
    const costs = [0, 1, 2, 3].map((i) => ({ cost: estimatePointCost(pointAt(spec, i).params) }))
    const updates = costs.reduce((sum, { cost }) => sum + 30 * cost.neuronUpdatesPerTrial, 0)
    const ops = costs.reduce((sum, { cost }) => sum + 30 * cost.neuronUpdatesPerTrial * cost.opsPerVisit + 10 * cost.buildOpsPerNetwork, 0)
    expect(estimate).toEqual({
      points: 4,
      trialsPerPoint: 30,
      trials: 120,
      neuronUpdates: updates,
      peakBytes: Math.max(...costs.map(({ cost }) => cost.bytes)),
      cpuSeconds: ops / ENGINE_OPS_PER_CPU_SECOND
    })
  })
})

describe('checkLimits', () => {
  it('passes work within the limits and returns its estimate', () => {
    const spec = normaliseSpec({ neurons: 100, load: 0.1, trials: 10 })
    expect(checkLimits(spec, DEFAULT_LIMITS)).toEqual(estimateWork(spec))
  })

  it('names the limit, the value and the maximum', () => {
    const limits = { maxNeurons: 500, maxPoints: 10, maxTrials: 1000, maxBytes: 1e9 }
    expect(limitError(() => checkLimits(normaliseSpec({ neurons: { values: [100, 600] }, patterns: 5 }), limits)))
      .toMatchObject({ limit: 'maxNeurons', value: 600, max: 500 })
    expect(limitError(() => checkLimits(normaliseSpec({ neurons: 100, patterns: { from: 1, to: 11, step: 1 } }), limits)))
      .toMatchObject({ limit: 'maxPoints', value: 11, max: 10 })
    expect(limitError(() => checkLimits(normaliseSpec({ neurons: 100, patterns: { values: [2, 4] }, trials: 600 }), limits)))
      .toMatchObject({ limit: 'maxTrials', value: 1200, max: 1000 })
    expect(limitError(() => checkLimits(normaliseSpec({ neurons: 100, patterns: 5 }), { ...limits, maxCpuSeconds: 0 })))
      .toMatchObject({ limit: 'maxCpuSeconds', max: 0 })
  })

  it('refuses a network too big for memory before allocating it', () => {
    // A dense 60 000-neuron pseudo-inverse network needs tens of gigabytes; allocating it
    // would throw or exhaust memory, so reaching the WorkLimitError proves nothing was.
    const spec = normaliseSpec({ neurons: 60_000, patterns: 3_000, rule: { kind: 'pseudo-inverse' }, trials: 1 })
    const before = process.memoryUsage().arrayBuffers
    const error = limitError(() => checkLimits(spec, { ...DEFAULT_LIMITS, maxNeurons: 100_000 }))
    expect(error.limit).toBe('maxBytes')
    expect(error.value).toBeGreaterThan(8 * 60_000 * 60_000)
    expect(process.memoryUsage().arrayBuffers - before).toBeLessThan(16 * 1024 * 1024)
  })

  it('checks counts before estimating: an oversized grid is refused without visiting its points', () => {
    const spec = normaliseSpec({ neurons: { from: 100, to: 1099, step: 1 }, load: { from: 0.01, to: 0.1, count: 100 }, trials: 1 })
    // With a one-byte memory limit, any estimate made before the count check would answer maxBytes.
    expect(limitError(() => checkLimits(spec, { ...DEFAULT_LIMITS, maxBytes: 1 })).limit).toBe('maxPoints')
  })
})
