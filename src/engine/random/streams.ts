import { MASK64, mix64 } from './splitmix64.js'
import { Xoshiro256StarStar } from './xoshiro256.js'

/**
 * Independent random streams addressed by *what* is computed, never by who computes it
 * or when: a stream key is a chain of SplitMix64 mixes of (master seed, domain, grid
 * point, index). Any trial can therefore be re-run alone and draw exactly the numbers it
 * drew inside the full sweep, whatever the chunking, worker count or order.
 */
export const STREAM_DOMAIN = {
  /** Pattern set and couplings of one network. */
  network: 0x6e6574n,
  /** Cue, update order and thermal noise of one trial. */
  trial: 0x747269n
} as const

export type StreamDomain = keyof typeof STREAM_DOMAIN

export function streamKey (masterSeed: number | bigint, domain: StreamDomain, point: number, index: number): bigint {
  let k = mix64((BigInt(masterSeed) & MASK64) ^ 0x6d656d7377656570n)
  k = mix64(k ^ STREAM_DOMAIN[domain])
  k = mix64(k ^ BigInt(point))
  return mix64(k ^ BigInt(index))
}

export function openStream (masterSeed: number | bigint, domain: StreamDomain, point: number, index: number): Xoshiro256StarStar {
  return Xoshiro256StarStar.fromSeed(streamKey(masterSeed, domain, point, index))
}

/** Generator and seeding recorded in provenance. */
export const RNG_ALGORITHM = 'xoshiro256**-1.0; per-stream keys by SplitMix64 mixing of (seed, domain, point, index)'
