import { bisect } from '../theory/bisect.js'

/** Grid cells a scan of the whole range is cut into; a search's final bracket spans a few of them. */
const GRID_CELLS = 400

/** Golden-section iterations: shrink a grid cell by 0.618⁸⁰, far below double resolution of the range. */
const GOLDEN_ITERATIONS = 80

export interface ProfileScan {
  best: { tau: number, value: number }
}

// MAIN //

/**
 * The maximum of f on [lo, hi]: the best of GRID_CELLS + 1 evenly spaced values, refined by
 * golden-section search between that value's neighbours. The coarse grid guards against a
 * second, lower hump (possible for a profile likelihood far from the data); the refinement
 * assumes f is unimodal within one cell either side of the best grid value.
 *
 * @example
 * maximiseOnGrid((t) => -(t - 0.3) ** 2, -1, 1).best.tau
 * // returns ~0.3
 */
export function maximiseOnGrid (f: (tau: number) => number, lo: number, hi: number): ProfileScan {
  const step = (hi - lo) / GRID_CELLS
  let bestIndex = 0
  let bestValue = -Infinity
  for (let j = 0; j <= GRID_CELLS; j++) {
    const value = f(lo + j * step)
    if (value > bestValue) {
      bestValue = value
      bestIndex = j
    }
  }
  let a = lo + Math.max(0, bestIndex - 1) * step
  let b = lo + Math.min(GRID_CELLS, bestIndex + 1) * step
  const ratio = (Math.sqrt(5) - 1) / 2
  let c = b - ratio * (b - a)
  let d = a + ratio * (b - a)
  let fc = f(c)
  let fd = f(d)
  for (let k = 0; k < GOLDEN_ITERATIONS; k++) {
    if (fc >= fd) {
      b = d
      d = c
      fd = fc
      c = b - ratio * (b - a)
      fc = f(c)
    } else {
      a = c
      c = d
      fc = fd
      d = a + ratio * (b - a)
      fd = f(d)
    }
  }
  const tau = fc >= fd ? c : d
  const value = Math.max(fc, fd)
  return value >= bestValue ? { best: { tau, value } } : { best: { tau: lo + bestIndex * step, value: bestValue } }
}

/**
 * The first τ beyond `start` (towards −1 when `towards` is −1, towards +1 when +1) where the
 * rising function `deviance` passes `cut`, or null when it stays at or below `cut` up to the
 * end of [−1, 1]. Steps of one grid cell outward, then bisects the cell where it passes.
 */
export function boundaryOf (deviance: (tau: number) => number, start: number, towards: -1 | 1, cut: number): number | null {
  const step = 2 / GRID_CELLS
  let inside = start
  for (;;) {
    const next = towards < 0 ? Math.max(-1, inside - step) : Math.min(1, inside + step)
    if (deviance(next) > cut) return bisect((tau) => deviance(tau) - cut, Math.min(inside, next), Math.max(inside, next))
    if (next === inside || Math.abs(next) >= 1) return null
    inside = next
  }
}
