/**
 * Glauber dynamics decide s_i ← +1 iff u·(1 + exp(factor·h_i)) < 1, one exponential per visit.
 * Where the raw field h_i is an integer (overlap space, integer couplings), the kernels keep
 * g(h) = 1 + exp(factor·h) in a table over a window of fields [−half, half]: an entry is
 * computed, with the same IEEE operations as the plain path (f64.mul(factor, h), the host's
 * Math.exp, f64.add(1, ·)), the first time its field occurs, and read back afterwards. A
 * table indexed by the integer field therefore gives the very doubles the plain path
 * computes, visit for visit (test/engine/kernels/glauber-table.test.ts reads the table back
 * and compares every entry). Fields outside the window are computed directly.
 *
 * The window stops where the exponential stops mattering: for factor·h ≤ −40, 1 + exp(·)
 * rounds to 1, and for factor·h ≥ 40 it exceeds 2·10¹⁷, so one uniform in 2⁵³ decides; and it
 * never exceeds GLAUBER_TABLE_HALF_MAX (a 512 KiB table) or the largest field possible.
 */
export const GLAUBER_TABLE_HALF_MAX = 32768
const REACH = 40

let halfMax = GLAUBER_TABLE_HALF_MAX

/** Caps the window (tests use it to make fields fall outside it); null restores the default. */
export function setGlauberTableHalfMax (half: number | null): void {
  halfMax = half ?? GLAUBER_TABLE_HALF_MAX
}

/** Half-width of the window for this factor and largest possible |h|. */
export function glauberTableHalf (factor: number, maxAbsField: number): number {
  const reach = Math.ceil(REACH / Math.abs(factor))
  return Math.max(0, Math.min(maxAbsField, Number.isFinite(reach) ? reach : halfMax, halfMax))
}

/** Bytes of the largest table a network with fields up to maxAbsField can hold (memory estimates). */
export function glauberTableBytes (maxAbsField: number): number {
  return 8 * (2 * Math.min(maxAbsField, GLAUBER_TABLE_HALF_MAX) + 1)
}

/**
 * One network's table in its kernel memory at a fixed offset: tells the kernel where it is
 * and how wide, and zeroes it whenever its entries may not belong to the current factor
 * (another factor, or another network used the shared memory meanwhile).
 */
export class GlauberTable {
  private factor = Number.NaN
  private half = -1
  private valid = false

  constructor (readonly at: number, private readonly maxAbsField: number) {}

  /** Bytes the table may need beyond `at`. */
  get bytes (): number {
    return glauberTableBytes(this.maxAbsField)
  }

  /** Half-width of the window last prepared (−1 before the first). */
  get halfWidth (): number {
    return this.half
  }

  /** Another network wrote the memory: the entries are stale. */
  invalidate (): void {
    this.valid = false
  }

  /**
   * Prepares the table for `factor` in `memory` (already large enough); returns its half-width.
   * `pristine`: nothing has written the table's bytes since the memory grew to hold them, so
   * they are zero already (WebAssembly memories grow by zero bytes) and are not zeroed again:
   * zeroing would touch every page of a table whose visits read a few, and the first touch of
   * a page costs the operating system a zeroed page, microseconds in a virtual machine.
   */
  prepare (memory: ArrayBuffer, factor: number, pristine = false): number {
    const half = glauberTableHalf(factor, this.maxAbsField)
    if (!this.valid || this.half !== half || !Object.is(this.factor, factor)) {
      if (!pristine) new Float64Array(memory, this.at, 2 * half + 1).fill(0)
      this.factor = factor
      this.half = half
      this.valid = true
    }
    return half
  }
}
