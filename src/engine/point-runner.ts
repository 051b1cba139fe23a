import type { PointParams } from './params.js'
import type { TrialRecord } from './results.js'
import type { Network } from './network/network.js'
import type { RandomSource } from './random/source.js'
import { openStream, RNG_ALGORITHM } from './random/streams.js'
import { buildNetwork, canRedrawNetwork, chooseRepresentation, redrawNetwork, type Representation } from './network/build.js'
import { createScratch } from './dynamics/scratch.js'
import { runTrialOn } from './trial.js'
import { measureStability } from './measures.js'
import { checkPointParams } from './check.js'
import { estimatePointCost } from './cost.js'
import { measurePatternOverlaps } from './patterns/correlation.js'
import { EngineInputError } from './errors.js'
import { SoftmaxMemory } from './models/softmax/memory.js'
import { createSoftmaxScratch, runSoftmaxTrial, softmaxStability } from './models/softmax/trial.js'

export interface PointRunner {
  /** Runs trial `trial` (0-based within the point); the same (seed, point, trial) always gives the same record. */
  runTrial (trial: number): TrialRecord
  /** The representation the point runs on, for provenance. */
  readonly representation: Representation
  /** The accelerated path of the networks built so far (e.g. `wasm-simd128-overlap-i16`, `js`); null before the first trial. */
  readonly fastPath: string | null
  readonly algorithm: string
}

export interface PointRunnerOptions {
  /**
   * Frees unreachable memory now (a host's explicit garbage collection). Called before each
   * network of at least RECLAIM_BYTES is built, after the runner has let go of the one
   * before: without it, networks no longer in use wait for the collector and a point's peak
   * holds several of them instead of the one the memory estimate counts.
   */
  reclaim?: () => void
  /**
   * One stream for everything, instead of a stream per network and per trial: the canonical
   * stream of the shared benchmark (docs/canonical-stream.md). Network k is drawn from it just
   * before its first trial, then each trial draws its cue and dynamics, so trials must run in
   * order 0, 1, 2, … and the stream may continue into the next point.
   */
  stream?: RandomSource
}

/** Networks estimated at this size or more are built only after `reclaim` (a full collection costs milliseconds; building them costs more). */
export const RECLAIM_BYTES = 32 * 1024 * 1024

/**
 * Runs the trials of one grid point. Trial t uses network ⌊t / trialsPerNetwork⌋, built
 * from the stream (seed, 'network', point, network), and draws its cue and dynamics from
 * (seed, 'trial', point, t); its target is pattern t mod P. Nothing depends on which
 * other trials ran before, so any subset of trials re-runs identically. With
 * `options.stream` everything draws from that one stream instead, in trial order.
 */
export function createPointRunner (p: PointParams, masterSeed: number, pointIndex: number, options: PointRunnerOptions = {}): PointRunner {
  checkPointParams(p)
  const reclaim = options.reclaim !== undefined && estimatePointCost(p).bytes >= RECLAIM_BYTES ? options.reclaim : () => {}
  const streams = streamsFor(masterSeed, pointIndex, options.stream)
  if (p.rule.kind === 'modern-softmax') return createSoftmaxRunner(p, p.rule.beta, streams, reclaim)
  const scratch = createScratch(p.neurons, p.patterns)
  let cachedIndex = -1
  let cached: Network | null = null
  const redrawable = canRedrawNetwork(p)
  // Its own frame, and only for points that can redraw: when networkFor itself passed the old
  // network as an argument, a dense-memory point held two networks at its peak (bench/memory.ts:
  // 167 MB against an 87 MB estimate), the old one apparently still held by that frame when
  // `reclaim` ran.
  const redrawCached = (rng: RandomSource): Network | null => cached !== null && redrawNetwork(cached, p, rng) ? cached : null
  const networkFor = (index: number): Network => {
    if (cached !== null && cachedIndex === index) return cached
    const rng = streams.network(index)
    // The network before is no longer needed: an overlap-space one takes the next in its memory.
    let network = redrawable ? redrawCached(rng) : null
    if (network === null) {
      cached = null
      reclaim()
      network = buildNetwork(p, rng)
    }
    cached = network
    cachedIndex = index
    return network
  }
  return {
    representation: chooseRepresentation(p),
    get fastPath () { return cached === null ? null : cached.fastPath },
    algorithm: RNG_ALGORITHM,
    runTrial (trial: number): TrialRecord {
      streams.check(trial)
      const networkIndex = Math.floor(trial / p.trialsPerNetwork)
      const net = networkFor(networkIndex)
      const record = runTrialOn(net, p, trial, trial % p.patterns, streams.trial(trial), scratch)
      if (trial % p.trialsPerNetwork === 0) {
        if (p.measures.stability) record.stability = measureStability(net, scratch.next)
        if (p.measures.patternOverlaps === true) record.patternOverlaps = measurePatternOverlaps(net.patterns, p.neurons, p.patterns)
      }
      return record
    }
  }
}

interface PointStreams {
  network: (index: number) => RandomSource
  trial: (trial: number) => RandomSource
  /** Refuses a trial out of order when one stream serves every draw. */
  check: (trial: number) => void
}

/** A stream per network and per trial, keyed by (seed, point, index); or one shared stream. */
function streamsFor (masterSeed: number, pointIndex: number, shared: RandomSource | undefined): PointStreams {
  if (shared === undefined) {
    return {
      network: (index) => openStream(masterSeed, 'network', pointIndex, index),
      trial: (trial) => openStream(masterSeed, 'trial', pointIndex, trial),
      check: () => {}
    }
  }
  let next = 0
  return {
    network: () => shared,
    trial: () => shared,
    check: (trial) => {
      if (trial !== next) throw new EngineInputError('trial', trial, `one shared stream runs the trials in order; the next trial is ${next}.`)
      next++
    }
  }
}

/**
 * The modern softmax network's runner: the same streams, network sharing and targets as
 * above; a "network" is the stored pattern set, drawn from the network stream.
 */
function createSoftmaxRunner (p: PointParams, beta: number, streams: PointStreams, reclaim: () => void): PointRunner {
  const scratch = createSoftmaxScratch(p.neurons, p.patterns)
  let cachedIndex = -1
  let cached: SoftmaxMemory | null = null
  const memoryFor = (index: number): SoftmaxMemory => {
    if (cached === null || cachedIndex !== index) {
      cached = null
      reclaim()
      cached = SoftmaxMemory.draw(p, beta, streams.network(index))
      cachedIndex = index
    }
    return cached
  }
  return {
    representation: 'softmax-continuous',
    get fastPath () { return cached === null ? null : cached.fastPath },
    algorithm: RNG_ALGORITHM,
    runTrial (trial: number): TrialRecord {
      streams.check(trial)
      const mem = memoryFor(Math.floor(trial / p.trialsPerNetwork))
      const record = runSoftmaxTrial(mem, p, trial, trial % p.patterns, streams.trial(trial), scratch)
      if (trial % p.trialsPerNetwork === 0) {
        if (p.measures.stability) record.stability = softmaxStability(mem, scratch)
        if (p.measures.patternOverlaps === true) record.patternOverlaps = measurePatternOverlaps(mem.patterns, p.neurons, p.patterns)
      }
      return record
    }
  }
}
