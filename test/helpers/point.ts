import type { PointParams } from '../../src/engine/index.js'

/** A Hebbian, unbiased, zero-temperature asynchronous point with a clean cue; override what a test varies. */
export function pointParams (overrides: Partial<PointParams> = {}): PointParams {
  return {
    neurons: 200,
    patterns: 10,
    coding: 'pm1',
    family: { kind: 'random', activity: 0.5 },
    rule: { kind: 'hebbian', selfCoupling: false },
    dilution: null,
    cue: { kind: 'flip', fraction: 0 },
    dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50, burnIn: 0 },
    measures: { overlapTrajectory: false, energyTrajectory: false, stability: false },
    successThreshold: 0.95,
    trialsPerNetwork: 1,
    ...overrides
  }
}

export function mean (values: readonly number[]): number {
  let s = 0
  for (const v of values) s += v
  return s / values.length
}

export function sampleSd (values: readonly number[]): number {
  const m = mean(values)
  let s = 0
  for (const v of values) s += (v - m) * (v - m)
  return Math.sqrt(s / (values.length - 1))
}
