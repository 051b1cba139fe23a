/**
 * The many-workers model of bench/queue-model.ts: closed forms of the M/M/1 wait worked by
 * hand (common practice: the mean wait in queue of an M/M/1 server is ρ·s/(1 − ρ) for
 * service time s and utilisation ρ), and the searches against brute force.
 */
import { describe, expect, it } from 'vitest'
import { chunkSecondsFor, efficiency, fitServiceTime, queueingWait, utilisation, workerCeiling, type QueueModel } from '../../bench/queue-model.js'

const flat = (base: number, overhead: number, chunkSeconds: number): QueueModel => ({ service: { base, perWorker: 0 }, workerOverheadSeconds: overhead, chunkSeconds })

describe('queue model', () => {
  it('fits c(W) = base + perWorker·W exactly through points on a line', () => {
    const fit = fitServiceTime([1, 4, 16].map((workers) => ({ workers, redisCpuPerChunk: 0.002 + 0.0001 * workers })))
    expect(fit.base).toBeCloseTo(0.002, 12)
    expect(fit.perWorker).toBeCloseTo(0.0001, 12)
  })

  it('takes a falling fit as flat at the largest measured cost', () => {
    expect(fitServiceTime([{ workers: 1, redisCpuPerChunk: 0.004 }, { workers: 16, redisCpuPerChunk: 0.003 }])).toEqual({ base: 0.004, perWorker: 0 })
    expect(fitServiceTime([{ workers: 4, redisCpuPerChunk: 0.005 }])).toEqual({ base: 0.005, perWorker: 0 })
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

  it('agrees with a brute-force scan when the service time grows with the workers', () => {
    const model: QueueModel = { service: { base: 0.003, perWorker: 0.00002 }, workerOverheadSeconds: 0.05, chunkSeconds: 3 }
    let brute = 0
    for (let w = 1; w < 5000; w++) if (efficiency(model, w) >= 0.9) brute = w
    expect(workerCeiling(model)).toBe(brute)
    expect(brute).toBeGreaterThan(1)
    expect(workerCeiling({ ...model, service: { base: 0, perWorker: 0 } }, 0.9, 1000)).toBe(1000)
  })

  it('finds the chunk duration that keeps a worker count at the target', () => {
    const rest = { service: { base: 0.01, perWorker: 0 }, workerOverheadSeconds: 0 }
    const seconds = chunkSecondsFor(rest, 291)
    expect(efficiency({ ...rest, chunkSeconds: seconds }, 291)).toBeGreaterThanOrEqual(0.9)
    expect(efficiency({ ...rest, chunkSeconds: seconds - 0.01 }, 291)).toBeLessThan(0.9)
    expect(seconds).toBeGreaterThan(2.9)
    expect(seconds).toBeLessThanOrEqual(3.01)
  })
})
