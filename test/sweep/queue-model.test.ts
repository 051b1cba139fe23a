/**
 * The many-workers model of bench/queue-model.ts: closed forms of the M/M/1 wait worked by
 * hand (common practice: the mean wait in queue of an M/M/1 server is ρ·s/(1 − ρ) for
 * service time s and utilisation ρ), and the searches against brute force.
 */
import { describe, expect, it } from 'vitest'
import { chunkSecondsFor, efficiency, fitServiceTime, queueingWait, utilisation, workerCeiling, type QueueModel } from '../../bench/queue-model.js'

const flat = (base: number, overhead: number, chunkSeconds: number): QueueModel => ({ service: { perChunk: base, perWorkerPerSecond: 0 }, workerOverheadSeconds: overhead, chunkSeconds })

describe('queue model', () => {
  it('separates the per-chunk cost from the per-worker standing cost', () => {
    // Redis CPU rate = 0.002·λ + 0.0005·W, measured as CPU per chunk at each run's own rate.
    const runs = [[1, 30], [4, 20], [16, 12]].map(([workers, chunksPerSecond]) => ({ workers: workers!, chunksPerSecond: chunksPerSecond!, redisCpuPerChunk: 0.002 + 0.0005 * workers! / chunksPerSecond! }))
    const fit = fitServiceTime(runs)
    expect(fit.perChunk).toBeCloseTo(0.002, 12)
    expect(fit.perWorkerPerSecond).toBeCloseTo(0.0005, 12)
  })

  it('never fits a negative cost, and charges a single run to its chunks', () => {
    // Per-chunk CPU falling fast with the workers: the joint fit's per-chunk cost is negative.
    const falling = [{ workers: 1, chunksPerSecond: 10, redisCpuPerChunk: 0.001 }, { workers: 16, chunksPerSecond: 10, redisCpuPerChunk: 0.01 }, { workers: 4, chunksPerSecond: 40, redisCpuPerChunk: 0.0001 }]
    const fit = fitServiceTime(falling)
    expect(fit.perChunk).toBeGreaterThanOrEqual(0)
    expect(fit.perWorkerPerSecond).toBeGreaterThanOrEqual(0)
    expect(fitServiceTime([{ workers: 4, chunksPerSecond: 20, redisCpuPerChunk: 0.005 }])).toEqual({ perChunk: 0.005, perWorkerPerSecond: 0 })
    expect(() => fitServiceTime([])).toThrow(RangeError)
  })

  it('computes utilisation, the M/M/1 wait and efficiency by hand', () => {
    const model = flat(0.01, 0.1, 3)
    expect(utilisation(model, 150)).toBeCloseTo(0.5, 12)
    // ρ = 0.5: wait = 0.5 · 0.01 / 0.5 = 0.01 s.
    expect(queueingWait(model, 150)).toBeCloseTo(0.01, 12)
    expect(efficiency(model, 150)).toBeCloseTo(3 / 3.11, 12)
    expect(queueingWait(model, 300)).toBe(Infinity)
    expect(efficiency(model, 300)).toBe(0)
  })

  it('finds the closed-form ceiling: wait ≤ T/0.9 − T − o', () => {
    // o = 0: ρ·c/(1 − ρ) ≤ 1/3 ⇔ ρ ≤ (1/3)/(0.01 + 1/3) ⇔ W ≤ 291.26.
    expect(workerCeiling(flat(0.01, 0, 3))).toBe(291)
    // o = 0.3: wait ≤ 1/30 ⇔ ρ ≤ (1/30)/(0.01 + 1/30) ⇔ W ≤ 230.77.
    expect(workerCeiling(flat(0.01, 0.3, 3))).toBe(230)
    // The worker's own overhead alone costs more than 10 %: no worker count qualifies.
    expect(workerCeiling(flat(0.01, 0.4, 3))).toBe(0)
  })

  it('agrees with a brute-force scan when workers have a standing cost', () => {
    const model: QueueModel = { service: { perChunk: 0.003, perWorkerPerSecond: 0.0004 }, workerOverheadSeconds: 0.05, chunkSeconds: 3 }
    let brute = 0
    for (let w = 1; w < 5000; w++) if (efficiency(model, w) >= 0.9) brute = w
    expect(workerCeiling(model)).toBe(brute)
    expect(brute).toBeGreaterThan(1)
    expect(workerCeiling({ ...model, service: { perChunk: 0, perWorkerPerSecond: 0 } }, 0.9, 1000)).toBe(1000)
  })

  it('finds the chunk duration that keeps a worker count at the target', () => {
    const rest = { service: { perChunk: 0.01, perWorkerPerSecond: 0 }, workerOverheadSeconds: 0 }
    const seconds = chunkSecondsFor(rest, 291)
    expect(efficiency({ ...rest, chunkSeconds: seconds }, 291)).toBeGreaterThanOrEqual(0.9)
    expect(efficiency({ ...rest, chunkSeconds: seconds - 0.01 }, 291)).toBeLessThan(0.9)
    expect(seconds).toBeGreaterThan(2.9)
    expect(seconds).toBeLessThanOrEqual(3.01)
  })
})
