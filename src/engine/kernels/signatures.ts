import type { WasmMemory } from './wasm.js'

/**
 * The one table of the kernel module's exported functions: for each, its parameters in order
 * (`name` is an i32, `name:f64` a float64) and its result, if any. scripts/gen-kernels.ts writes
 * every function header of the WebAssembly text from this table (the names become the
 * parameters' `$` names the bodies use), and the TypeScript types the kernel classes call
 * through (`KernelExports`) are derived from it below, so the two cannot disagree.
 * test/engine/kernels/generated.test.ts checks the compiled module against it.
 */
export const KERNEL_SIGNATURES = {
  // Overlap space, int16 overlaps (N ≤ 32767).
  dot16: { params: ['xi', 'm', 'pp', 'i'], result: 'i32' },
  flip16: { params: ['xi', 'm', 'pp', 'i', 'd0'] },
  overlaps16: { params: ['xi', 'm', 's', 'n', 'pp'] },
  sweep16: { params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self'], result: 'i32' },
  sync16: { params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'check'], result: 'i32' },
  glauber16: { params: ['xi', 'm', 's', 'order', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  glauberSync16: { params: ['xi', 'm', 's', 'next', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  // Overlap space, int32 overlaps (any N).
  dot32: { params: ['xi', 'm', 'pp', 'i'], result: 'i32' },
  flip32: { params: ['xi', 'm', 'pp', 'i', 'd0'] },
  overlaps32: { params: ['xi', 'm', 's', 'n', 'pp'] },
  sweep32: { params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self'], result: 'i32' },
  sync32: { params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'check'], result: 'i32' },
  glauber32: { params: ['xi', 'm', 's', 'order', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  glauberSync32: { params: ['xi', 'm', 's', 'next', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  // Pattern layouts and sign bits.
  transpose: { params: ['src', 'srcStride', 'cols', 'dst', 'stride', 'rows'] },
  packSigns: { params: ['src', 'n', 'dst', 'words'], result: 'i32' },
  packRows: { params: ['src', 'n', 'rows', 'dst', 'words'] },
  overlapsBits: { params: ['bits', 'words', 's', 'sbits', 'n', 'p', 'pp', 'm', 'wide'], result: 'i32' },
  // Native xoshiro256** draws.
  shuffle: { params: ['order', 'n', 'state'] },
  partialShuffle: { params: ['idx', 'n', 'count', 'state'] },
  unbiasedRows: { params: ['out', 'n', 'count', 'state'] },
  uniforms: { params: ['out', 'count', 'state'] },
  // Whole overlap-space trials.
  runAsync16: { params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self', 'state', 'max', 'shuffle'], result: 'i32' },
  runGlauber16: { params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self', 'state', 'max', 'shuffle', 'factor:f64', 'table', 'half'] },
  runSync16: { params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'max'], result: 'i32' },
  runSync32: { params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'max'], result: 'i32' },
  // Dense float64 couplings.
  denseLoad: { params: ['cols', 'bias', 's', 'h', 'n', 'rowwise'] },
  denseSweep: { params: ['cols', 's', 'h', 'order', 'n'], result: 'i32' },
  denseGlauber: { params: ['cols', 's', 'h', 'order', 'noise', 'n', 'factor:f64'] },
  denseSync: { params: ['cols', 'bias', 's', 'h', 'next', 'prev', 'n', 'check', 'rowwise'], result: 'i32' },
  denseGlauberSync: { params: ['cols', 'bias', 's', 'h', 'next', 'noise', 'n', 'factor:f64', 'rowwise'] },
  // Dense int16 couplings.
  dense16Load: { params: ['cols', 'bias', 's', 's16', 'h', 'n', 'stride', 'rowsAreColumns'] },
  dense16Set: { params: ['cols', 'h', 'stride', 'j', 'delta'] },
  dense16Sweep: { params: ['cols', 's', 'h', 'order', 'n', 'stride'], result: 'i32' },
  dense16Glauber: { params: ['cols', 's', 'h', 'order', 'noise', 'n', 'stride', 'factor:f64', 'table', 'half'] },
  dense16Sync: { params: ['cols', 'bias', 's', 's16', 'h', 'next', 'prev', 'n', 'stride', 'check', 'rowsAreColumns'], result: 'i32' },
  dense16GlauberSync: { params: ['cols', 'bias', 's', 's16', 'h', 'next', 'noise', 'n', 'stride', 'factor:f64', 'rowsAreColumns', 'table', 'half'] },
  // Dense associative memories: polynomial (exact integer fields) and exponential (certified signs).
  memVectorPoly: { params: ['m', 'vec', 'table', 'p', 'off', 'sums'] },
  memSweepPoly: { params: ['xi', 'm', 's', 'order', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums'], result: 'i32' },
  memSyncPoly: { params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums', 'check'], result: 'i32' },
  memGlauberPoly: { params: ['xi', 'm', 's', 'order', 'noise', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums', 'factor:f64'] },
  memGlauberSyncPoly: { params: ['xi', 'm', 's', 'next', 'noise', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums', 'factor:f64'] },
  memVectorExp: { params: ['m', 'vec', 'table', 'p', 'sums'] },
  memSweepExp: { params: ['xi', 'm', 's', 'order', 'n', 'pp', 'p', 'vec', 'table', 'sums'], result: 'i32' },
  memSyncExp: { params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'p', 'vec', 'table', 'sums', 'check'], result: 'i32' },
  // The modern softmax network.
  softmaxOverlaps: { params: ['pat', 'd', 'st', 'out', 'p', 'scale:f64'] },
  softmaxAccumulate: { params: ['pat', 'd', 'coef', 'out', 'p'] },
  // The fixed in-degree network (adjacency lists, int32 fields).
  sparseLoad: { params: ['inputs', 'weights', 's', 'h', 'n', 'k'] },
  sparseSweep: { params: ['outStart', 'targets', 'tw', 's', 'h', 'order', 'n'], result: 'i32' },
  sparseRunAsync: { params: ['outStart', 'targets', 'tw', 's', 'h', 'order', 'n', 'state', 'max', 'shuffle'], result: 'i32' },
  sparseSync: { params: ['outStart', 'targets', 'tw', 's', 'h', 'next', 'prev', 'n', 'check'], result: 'i32' },
  sparseGlauber: { params: ['outStart', 'targets', 'tw', 's', 'h', 'order', 'noise', 'n', 'factor:f64', 'table', 'half'] },
  sparseGlauberSync: { params: ['outStart', 'targets', 'tw', 's', 'h', 'next', 'noise', 'n', 'factor:f64', 'table', 'half'] }
} as const satisfies Record<string, KernelSignature>

/** A parameter: `name` (i32) or `name:f64`. */
export type KernelParam = string
export interface KernelSignature {
  readonly params: readonly KernelParam[]
  readonly result?: 'i32' | 'f64'
}

export type KernelName = keyof typeof KERNEL_SIGNATURES

/** Every JavaScript value crossing the boundary is a number (no i64 parameters). */
type Args<P extends readonly string[]> = { -readonly [K in keyof P]: number }
type KernelFunction<S extends KernelSignature> = (...args: Args<S['params']>) => S extends { result: string } ? number : void

/** The module's exports as the engine calls them, typed from the table. */
export type KernelExports = { readonly [K in KernelName]: KernelFunction<(typeof KERNEL_SIGNATURES)[K]> } & { memory: WasmMemory }

/** The subset of the exports a kernel class uses, plus the memory. */
export type KernelsUsing<K extends KernelName> = Pick<KernelExports, K | 'memory'>

/** The parameter's name and WebAssembly type. */
export function parseParam (param: KernelParam): { name: string, type: 'i32' | 'f64' } {
  const [name, type = 'i32'] = param.split(':')
  if (type !== 'i32' && type !== 'f64') throw new Error(`kernel parameter ${param}: type must be i32 or f64`)
  return { name: name!, type }
}
