import { describe, expect, it } from 'vitest'
import { estimateWork, normaliseSpec } from '../../src/spec/index.js'
import { chunkCpuSeconds, planSweep } from '../../src/sweep/index.js'

describe('chunkCpuSeconds', () => {
  it('splits a grid sweep\'s CPU estimate exactly over its planned chunks', () => {
    // Room codes at three loads and two sizes: chunks of different points and sizes.
    const spec = normaliseSpec({ label: 'rooms', neurons: { values: [300, 1200] }, load: { values: [0.05, 0.1, 0.14] }, trials: 3000, seed: 3 })
    const plan = planSweep(spec)
    expect(plan.chunks.length).toBeGreaterThan(6)
    const perChunk = plan.chunks.map((chunk) => chunkCpuSeconds(spec, chunk))
    expect(perChunk.reduce((sum, seconds) => sum + seconds, 0)).toBeCloseTo(estimateWork(spec).cpuSeconds, 9)
    // A chunk of the larger network costs more than one of the same trials on the smaller.
    const [small, large] = [plan.chunks.find((chunk) => chunk.point === 0)!, plan.chunks.find((chunk) => chunk.point === 3)!]
    expect(chunkCpuSeconds(spec, large) / large.count).toBeGreaterThan(chunkCpuSeconds(spec, small) / small.count)
  })

  it('counts the canonical stream\'s one chunk as the whole sweep', () => {
    const spec = normaliseSpec({ label: 'one stream', neurons: 500, load: { values: [0.1, 0.12] }, trials: 50, seed: 3, streams: 'canonical' })
    const [only] = planSweep(spec).chunks
    expect(chunkCpuSeconds(spec, only!)).toBe(estimateWork(spec).cpuSeconds)
  })
})
