import { describe, expect, it } from 'vitest'
import { estimatePointCost } from '../../src/engine/index.js'
import { checkLimits, DEFAULT_LIMITS, ENGINE_OPS_PER_CPU_SECOND, estimateWork, maxChunkTrials, normaliseSpec, pointAt, TRIAL_OVERHEAD_OPS, trialRecordBytes, trialRecordMemory, WorkLimitError } from '../../src/spec/index.js'
import { computeChunk, encodeChunkValue, planSweep } from '../../src/sweep/index.js'

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
    const ops = costs.reduce((sum, { cost }) => sum + 30 * (cost.neuronUpdatesPerTrial * cost.opsPerVisit + TRIAL_OVERHEAD_OPS) + 10 * cost.buildOpsPerNetwork, 0)
    // Each worker holds a point's network and a chunk of its trial records (here all 30).
    const records = 30 * trialRecordMemory(pointAt(spec, 0).params)
    expect(estimate).toEqual({
      points: 4,
      trialsPerPoint: 30,
      trials: 120,
      neuronUpdates: updates,
      peakBytes: Math.max(...costs.map(({ cost }) => cost.bytes)) + records,
      cpuSeconds: ops / ENGINE_OPS_PER_CPU_SECOND,
      storedBytes: 4 * 4096 + 120 * trialRecordBytes(pointAt(spec, 0).params)
    })
  })
})

describe('checkLimits', () => {
  it('passes work within the limits and returns its estimate', () => {
    const spec = normaliseSpec({ neurons: 100, load: 0.1, trials: 10 })
    expect(checkLimits(spec, DEFAULT_LIMITS)).toEqual(estimateWork(spec))
  })

  it('names the limit, the value and the maximum', () => {
    const limits = { maxNeurons: 500, maxPoints: 10, maxTrials: 1000, maxBytes: 1e9, maxStoredBytes: 1e12 }
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

describe('stored per-trial data is counted before running', () => {
  // Reproductions of a probe: 5 million trials of a 10-neuron network were estimated at 240 B
  // and 1.9 CPU-s, ran 110 s, then failed to store their result; 20 trials with trajectories
  // reached gigabytes. Every such cost is now part of the estimate and of the limits.
  it('refuses five million trials of a tiny network: one point\'s records would not fit one worker', () => {
    const spec = normaliseSpec({ neurons: 10, patterns: 1, trials: 5_000_000, dynamics: { maxSweeps: 3 } })
    const work = estimateWork(spec)
    expect(work.storedBytes).toBeGreaterThan(5_000_000 * 45) // 45 B a plain record as chunks store it (by column)
    expect(work.peakBytes).toBeGreaterThan(1e9)
    expect(limitError(() => checkLimits(spec, DEFAULT_LIMITS))).toMatchObject({ limit: 'maxBytes' })
    // Its CPU time counts every trial's own overhead: at least 10 µs a trial on the measured machine.
    expect(work.cpuSeconds).toBeGreaterThan(5_000_000 * 10e-6)
  })

  it('refuses trajectories that would fill the store', () => {
    const spec = normaliseSpec({
      neurons: 200,
      patterns: 5,
      trials: 400,
      measures: { overlapTrajectory: true, energyTrajectory: true },
      dynamics: { temperature: 0.5, maxSweeps: 1_000_000 }
    })
    const error = limitError(() => checkLimits(spec, DEFAULT_LIMITS))
    expect(['maxBytes', 'maxStoredBytes']).toContain(error.limit)
    expect(limitError(() => checkLimits(spec, { ...DEFAULT_LIMITS, maxBytes: Number.MAX_SAFE_INTEGER }))).toMatchObject({ limit: 'maxStoredBytes' })
  })

  it('estimates the stored size of trial records (by column) above what chunks really hold and within half again', () => {
    const cases = [
      { neurons: 100, patterns: 5, trials: 200 },
      { neurons: 100, patterns: 5, trials: 200, measures: { stability: true } },
      { neurons: 100, patterns: 5, trials: 20, dynamics: { temperature: 0.5, maxSweeps: 200 }, measures: { overlapTrajectory: true, energyTrajectory: true } },
      { neurons: 100, patterns: 5, trials: 200, dynamics: { temperature: 0.5, maxSweeps: 20 } },
      { neurons: 100, patterns: 5, trials: 200, measures: { patternOverlaps: true } },
      { neurons: 100, patterns: 5, trials: 200, cue: { kind: 'mixture', components: 3 } }
    ]
    for (const input of cases) {
      const spec = normaliseSpec({ seed: 4, ...input })
      const encoded = planSweep(spec).chunks.reduce((sum, chunk) => sum + encodeChunkValue(computeChunk(spec, chunk)).byteLength, 0)
      const estimate = spec.trials * trialRecordBytes(pointAt(spec, 0).params)
      expect(estimate / encoded, JSON.stringify(input)).toBeGreaterThan(1)
      expect(estimate / encoded, JSON.stringify(input)).toBeLessThan(1.5)
    }
  })

  it('cuts a point\'s trials into chunks whose records stay small, however cheap the trials', () => {
    const spec = normaliseSpec({ neurons: 10, patterns: 1, trials: 400_000, dynamics: { maxSweeps: 3 } })
    const chunks = planSweep(spec).chunks
    const cap = maxChunkTrials(pointAt(spec, 0).params)
    expect(chunks.length).toBeGreaterThan(1)
    expect(Math.max(...chunks.map((chunk) => chunk.count))).toBeLessThanOrEqual(cap)
    expect(chunks.reduce((sum, chunk) => sum + chunk.count, 0)).toBe(400_000)
  })
})
