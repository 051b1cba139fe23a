/**
 * A chunk's estimated CPU time, for whoever must decide whether it can run before a limit
 * (a worker inside a batch allocation, a worker draining on shutdown). The same cost model
 * that cuts sweeps into chunks (plan.ts), in seconds of one core of the measured machine.
 */
import { estimatePointCost } from '../engine/index.js'
import { countPoints, estimateWork, ENGINE_OPS_PER_CPU_SECOND, pointAt, pointOps } from '../spec/index.js'
import type { NormalisedSpec } from '../spec/index.js'
import type { Chunk } from './plan.js'

/**
 * Estimated CPU seconds of one chunk. A grid chunk costs its trials at its point; a search
 * chunk is a whole search, its share of the sweep's bound (every step at the costlier end of
 * its range, as the work estimate bounds it); the canonical stream's one chunk is the whole sweep.
 */
export function chunkCpuSeconds (spec: NormalisedSpec, chunk: Chunk): number {
  if (spec.streams === 'canonical') return estimateWork(spec).cpuSeconds
  if (spec.analysis !== undefined) return estimateWork(spec).cpuSeconds / countPoints(spec)
  const { params } = pointAt(spec, chunk.point)
  return pointOps(estimatePointCost(params), chunk.count, params.trialsPerNetwork) / ENGINE_OPS_PER_CPU_SECOND
}
