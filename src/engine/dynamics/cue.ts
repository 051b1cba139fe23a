import type { Cue } from '../params.js'
import type { RandomSource } from '../random/source.js'
import { fillUnbiased } from '../patterns/generate.js'
import { resetIdentity, type Scratch } from './scratch.js'
import { nativeMarkChosen } from '../kernels/native-random.js'

/**
 * Writes the initial state of a trial into `scratch.initial`.
 *
 * ## Method
 * Exactly F = round(fraction·N) distinct bits are chosen by a partial Fisher–Yates pass
 * (idx = identity; for k < F: j = k + below(N − k), swap idx[k], idx[j]); every F-subset is
 * equally likely. Flip cues negate them, erase cues set them to 0 (no input) or to fresh
 * unbiased values. A mixture cue is sign(Σ_k ξ^{(t+k) mod P}), ties → +1.
 */
export function writeCue (cue: Cue, patterns: Int8Array, n: number, p: number, target: number, rng: RandomSource, scratch: Scratch): void {
  const s = scratch.initial
  switch (cue.kind) {
    case 'flip':
    case 'erase': {
      s.set(patterns.subarray(target * n, target * n + n))
      const count = Math.round(cue.fraction * n)
      const idx = scratch.indices
      // Random erase fills draw between the choices, so only they need the interleaved loop.
      if ((cue.kind === 'flip' || cue.fill === 'zero') && nativeMarkChosen(s, count, cue.kind === 'erase', rng)) return
      resetIdentity(idx)
      for (let k = 0; k < count; k++) {
        const j = k + rng.below(n - k)
        const chosen = idx[j]!
        idx[j] = idx[k]!
        idx[k] = chosen
        if (cue.kind === 'flip') s[chosen] = -s[chosen]!
        else if (cue.fill === 'zero') s[chosen] = 0
        else s[chosen] = rng.uniform() < 0.5 ? 1 : -1
      }
      return
    }
    case 'random':
      fillUnbiased(s, 0, n, rng)
      return
    case 'mixture':
      for (let i = 0; i < n; i++) {
        let sum = 0
        for (let k = 0; k < cue.components; k++) sum += patterns[((target + k) % p) * n + i]!
        s[i] = sum >= 0 ? 1 : -1
      }
  }
}
