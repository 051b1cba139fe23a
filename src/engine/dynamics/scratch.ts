/** Buffers reused across the trials of one grid point, so the hot loops allocate nothing. */
export interface Scratch {
  /** Visiting order, kept across the sweeps of a trial (reshuffled in place before each sweep). */
  order: Int32Array
  /** Index buffer for choosing cue bits. */
  indices: Int32Array
  initial: Int8Array
  next: Int8Array
  previous: Int8Array
  fields: Float64Array
  overlaps: Float64Array
  /** T > 0: sums of every overlap over the measured sweeps (trial-measures.ts). */
  overlapSums: Float64Array
}

export function createScratch (neurons: number, patterns: number): Scratch {
  return {
    order: new Int32Array(neurons),
    indices: new Int32Array(neurons),
    initial: new Int8Array(neurons),
    next: new Int8Array(neurons),
    previous: new Int8Array(neurons),
    fields: new Float64Array(neurons),
    overlaps: new Float64Array(patterns),
    overlapSums: new Float64Array(patterns)
  }
}

/** 0, 1, 2, …, grown as needed: identity orders are copied from it natively instead of filled in a loop. */
let identity = new Int32Array(0)

export function resetIdentity (a: Int32Array): void {
  if (identity.length < a.length) identity = Int32Array.from({ length: Math.max(a.length, 2 * identity.length) }, (_, i) => i)
  a.set(identity.subarray(0, a.length))
}
