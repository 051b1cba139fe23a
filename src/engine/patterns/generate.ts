import type { PointParams } from '../params.js'
import type { RandomSource } from '../random/source.js'
import { nativeUnbiasedRows } from '../kernels/native-random.js'

/**
 * Draws the P stored patterns of one network as ±1 entries, pattern-major:
 * `out[μ·N + i] = ξ_i^μ`. Binary (0/1) coding is a presentation of the same spins
 * (V = (1 + s)/2), so the engine always works in ±1.
 *
 * ## Method
 * Unbiased entries take one bit each from 64-bit draws, 64 neurons per draw, lowest bit
 * first (bit 1 → +1); each pattern starts a fresh draw. Biased entries are +1 when a
 * uniform double falls below the activity. Correlated families copy parent μ mod K and
 * redraw each entry with probability 1 − q, so the expected child–parent overlap is q.
 * Writes into `into` when given (it must hold P·N entries), else into a new array.
 */
export function generatePatterns (p: PointParams, rng: RandomSource, into?: Int8Array): Int8Array {
  const { neurons: n, patterns: count, family } = p
  // `into` (P·N entries) lets a fast path draw the patterns straight into its own memory.
  const out = into ?? new Int8Array(count * n)
  switch (family.kind) {
    case 'random':
      if (family.activity === 0.5 && nativeUnbiasedRows(out, 0, n, count, rng)) return out
      for (let mu = 0; mu < count; mu++) {
        if (family.activity === 0.5) fillUnbiased(out, mu * n, n, rng)
        else fillBiased(out, mu * n, n, family.activity, rng)
      }
      return out
    case 'correlated': {
      const parents = new Int8Array(family.parents * n)
      for (let k = 0; k < family.parents; k++) fillUnbiased(parents, k * n, n, rng)
      const redraw = 1 - family.parentOverlap
      for (let mu = 0; mu < count; mu++) {
        const parent = (mu % family.parents) * n
        for (let i = 0; i < n; i++) {
          out[mu * n + i] = rng.uniform() < redraw ? (rng.uniform() < 0.5 ? 1 : -1) : parents[parent + i]!
        }
      }
      return out
    }
    case 'supplied':
      for (let mu = 0; mu < count; mu++) {
        const row = family.data[mu]!
        for (let i = 0; i < n; i++) out[mu * n + i] = toSpin(row[i]!, p.coding)
      }
      return out
  }
}

/** ±1 spin of a supplied entry: binary 1 → +1, 0 → −1; ±1 as given. */
export function toSpin (value: number, coding: PointParams['coding']): 1 | -1 {
  if (coding === 'binary') return value === 1 ? 1 : -1
  return value > 0 ? 1 : -1
}

/** Writes n unbiased ±1 entries from 64-bit draws, lowest bit first. */
export function fillUnbiased (out: Int8Array, offset: number, n: number, rng: RandomSource): void {
  const word = rng.word
  for (let i0 = 0; i0 < n; i0 += 64) {
    rng.next64()
    const lo = word[0]!
    const hi = word[1]!
    const base = offset + i0
    const low = Math.min(32, n - i0)
    for (let k = 0; k < low; k++) out[base + k] = (((lo >>> k) & 1) << 1) - 1
    const high = Math.min(64, n - i0)
    for (let k = 32; k < high; k++) out[base + k] = (((hi >>> (k - 32)) & 1) << 1) - 1
  }
}

function fillBiased (out: Int8Array, offset: number, n: number, activity: number, rng: RandomSource): void {
  for (let i = 0; i < n; i++) out[offset + i] = rng.uniform() < activity ? 1 : -1
}

/** Nominal mean b = 2a − 1 of the ±1 entries, used to centre overlaps of biased patterns. */
export function nominalMean (p: PointParams): number {
  return p.family.kind === 'random' ? 2 * p.family.activity - 1 : 0
}
