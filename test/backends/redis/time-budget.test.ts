import { describe, expect, it } from 'vitest'
import { createTimeBudgetBuffer, TimeBudgetReader, TimeBudgetWriter } from '../../../src/backends/redis/worker/time-budget.js'

describe('a worker\'s time budget, shared with its sandbox threads', () => {
  it('lets every chunk through without a limit', () => {
    const reader = new TimeBudgetReader(createTimeBudgetBuffer())
    expect(reader.fits(1e9, 0)).toBe(true)
  })

  it('refuses a chunk whose estimate ends after the limit, at the measured speed', () => {
    const buffer = createTimeBudgetBuffer()
    const writer = new TimeBudgetWriter(buffer)
    const reader = new TimeBudgetReader(buffer)
    writer.limitTo(100_000)
    expect(reader.fits(10, 90_000)).toBe(true)
    expect(reader.fits(10.001, 90_000)).toBe(false)
    // This machine ran chunks at half the model's speed: a 10 s estimate takes 20 s here.
    reader.recordRun(2, 4000)
    reader.recordRun(1, 2000)
    expect(writer.slowness()).toBe(2)
    expect(reader.fits(5, 90_000)).toBe(true)
    expect(reader.fits(5.001, 90_000)).toBe(false)
    // Tiny chunks (fixed costs dominate) do not move the scale.
    reader.recordRun(0.001, 500)
    expect(writer.slowness()).toBe(2)
  })

  it('only ever moves the limit earlier', () => {
    const buffer = createTimeBudgetBuffer()
    const writer = new TimeBudgetWriter(buffer)
    const reader = new TimeBudgetReader(buffer)
    writer.limitTo(50_000)
    writer.limitTo(80_000)
    expect(reader.fits(10, 40_000)).toBe(true)
    expect(reader.fits(10, 40_001)).toBe(false)
  })
})
