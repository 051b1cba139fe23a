import type { WasmMemory } from './wasm.js'

/**
 * The kernels come as several WebAssembly modules, one per kind of network (plus the native
 * draws), each compiled when first used: a process pays the optimising compiler only for the
 * kernels it runs, and adding a kernel for one model costs the others nothing. The overlap-space
 * kernels are split in two: `overlap` holds what a zero-temperature asynchronous trial needs
 * (the common case, and a network per trial in capacity curves), `overlapMore` the other
 * dynamics; it imports the memory of an `overlap` instance (`env.memory`) and is compiled only
 * by processes that run those dynamics.
 */
export const KERNEL_MODULES = ['random', 'overlap', 'overlapMore', 'dense', 'memory', 'softmax', 'sparse'] as const
export type KernelModule = (typeof KERNEL_MODULES)[number]

/**
 * The one table of the kernel modules' exported functions: for each, the modules that carry
 * it, its parameters in order (`name` is an i32, `name:f64` a float64) and its result, if any.
 * scripts/gen-kernels.ts writes every function header of the WebAssembly text from this table
 * (the names become the parameters' `$` names the bodies use), and the TypeScript types the
 * kernel classes call through (`KernelExports`) are derived from it below, so the two cannot
 * disagree. test/engine/kernels/generated.test.ts checks the compiled modules against it.
 * Every module imports the host's `exp` (Math.exp, the plain path's exponential) and
 * `sweepDone(sweep)` (the hook a whole-trial kernel calls after each sweep); `overlapMore`
 * also imports `classifySample()` (the end-state class of a Glauber sample the kernel took).
 */
export const KERNEL_SIGNATURES = {
  // Overlap space, int16 overlaps (N ≤ 32767).
  dot16: { modules: ['overlapMore'], params: ['xi', 'm', 'pp', 'i'], result: 'i32' },
  flip16: { modules: ['overlapMore'], params: ['xi', 'm', 'pp', 'i', 'd0'] },
  overlaps16: { modules: ['overlap'], params: ['xi', 'm', 's', 'n', 'pp'] },
  sweep16: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self'], result: 'i32' },
  sync16: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'check'], result: 'i32' },
  glauber16: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'order', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  glauberSync16: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'next', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  // Overlap space, int32 overlaps (any N).
  dot32: { modules: ['overlapMore'], params: ['xi', 'm', 'pp', 'i'], result: 'i32' },
  flip32: { modules: ['overlapMore'], params: ['xi', 'm', 'pp', 'i', 'd0'] },
  overlaps32: { modules: ['overlap', 'memory'], params: ['xi', 'm', 's', 'n', 'pp'] },
  sweep32: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self'], result: 'i32' },
  sync32: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'check'], result: 'i32' },
  glauber32: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'order', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  glauberSync32: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'next', 'noise', 'n', 'pp', 'self', 'factor:f64', 'table', 'half'] },
  // Pattern layouts and sign bits.
  transpose: { modules: ['overlap', 'memory'], params: ['src', 'srcStride', 'cols', 'dst', 'stride', 'rows'] },
  packSigns: { modules: ['overlap', 'sparse'], params: ['src', 'n', 'dst', 'words'], result: 'i32' },
  packRows: { modules: ['overlap', 'sparse'], params: ['src', 'n', 'rows', 'dst', 'words'] },
  overlapsBits: { modules: ['overlap', 'sparse'], params: ['bits', 'words', 's', 'sbits', 'n', 'p', 'pp', 'm', 'wide'], result: 'i32' },
  // Native xoshiro256** draws.
  shuffle: { modules: ['random'], params: ['order', 'n', 'state'] },
  partialShuffle: { modules: ['random'], params: ['idx', 'n', 'count', 'state'] },
  markChosen: { modules: ['random'], params: ['idx', 's', 'count', 'zero'] },
  unbiasedRows: { modules: ['random'], params: ['out', 'n', 'count', 'state'] },
  uniforms: { modules: ['random'], params: ['out', 'count', 'state'] },
  // Whole overlap-space trials.
  sumSquares16: { modules: ['overlap'], params: ['m', 'pp'], result: 'f64' },
  runAsync16: { modules: ['overlap'], params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self', 'state', 'max', 'shuffle', 'p', 'hb', 'gb'], result: 'i32' },
  runGlauber16: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'order', 'n', 'pp', 'self', 'state', 'max', 'shuffle', 'factor:f64', 'table', 'half', 'p', 'burnIn', 'target', 'patternLevel:f64', 'block'] },
  runSync16: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'max', 'hb', 'gb', 'mprev'], result: 'i32' },
  runSync32: { modules: ['overlapMore'], params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'self', 'max'], result: 'i32' },
  // Dense float64 couplings.
  denseLoad: { modules: ['dense'], params: ['cols', 'bias', 's', 'h', 'n', 'rowwise'] },
  denseSweep: { modules: ['dense'], params: ['cols', 's', 'h', 'order', 'n'], result: 'i32' },
  denseGlauber: { modules: ['dense'], params: ['cols', 's', 'h', 'order', 'noise', 'n', 'factor:f64'] },
  denseSync: { modules: ['dense'], params: ['cols', 'bias', 's', 'h', 'next', 'prev', 'n', 'check', 'rowwise'], result: 'i32' },
  denseGlauberSync: { modules: ['dense'], params: ['cols', 'bias', 's', 'h', 'next', 'noise', 'n', 'factor:f64', 'rowwise'] },
  // Dense int16 couplings.
  dense16Load: { modules: ['dense'], params: ['cols', 'bias', 's', 's16', 'h', 'n', 'stride', 'rowsAreColumns'] },
  dense16Set: { modules: ['dense'], params: ['cols', 'h', 'stride', 'j', 'delta'] },
  dense16Sweep: { modules: ['dense'], params: ['cols', 's', 'h', 'order', 'n', 'stride'], result: 'i32' },
  dense16Glauber: { modules: ['dense'], params: ['cols', 's', 'h', 'order', 'noise', 'n', 'stride', 'factor:f64', 'table', 'half'] },
  dense16Sync: { modules: ['dense'], params: ['cols', 'bias', 's', 's16', 'h', 'next', 'prev', 'n', 'stride', 'check', 'rowsAreColumns'], result: 'i32' },
  dense16GlauberSync: { modules: ['dense'], params: ['cols', 'bias', 's', 's16', 'h', 'next', 'noise', 'n', 'stride', 'factor:f64', 'rowsAreColumns', 'table', 'half'] },
  // Dense associative memories: polynomial (exact integer fields) and exponential (certified signs).
  memVectorPoly: { modules: ['memory'], params: ['m', 'vec', 'table', 'p', 'off', 'sums'] },
  memSweepPoly: { modules: ['memory'], params: ['xi', 'm', 's', 'order', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums'], result: 'i32' },
  memSyncPoly: { modules: ['memory'], params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums', 'check'], result: 'i32' },
  memGlauberPoly: { modules: ['memory'], params: ['xi', 'm', 's', 'order', 'noise', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums', 'factor:f64'] },
  memGlauberSyncPoly: { modules: ['memory'], params: ['xi', 'm', 's', 'next', 'noise', 'n', 'pp', 'p', 'vec', 'table', 'off', 'sums', 'factor:f64'] },
  memVectorExp: { modules: ['memory'], params: ['m', 'vec', 'table', 'p', 'sums'] },
  memSweepExp: { modules: ['memory'], params: ['xi', 'm', 's', 'order', 'n', 'pp', 'p', 'vec', 'table', 'sums'], result: 'i32' },
  memSyncExp: { modules: ['memory'], params: ['xi', 'm', 's', 'next', 'prev', 'n', 'pp', 'p', 'vec', 'table', 'sums', 'check'], result: 'i32' },
  // The modern softmax network.
  softmaxOverlaps: { modules: ['softmax'], params: ['pat', 'd', 'st', 'out', 'p', 'scale:f64'] },
  softmaxAccumulate: { modules: ['softmax'], params: ['pat', 'd', 'coef', 'out', 'p'] },
  // The fixed in-degree network (adjacency lists, int32 fields).
  sparseLoad: { modules: ['sparse'], params: ['inputs', 'weights', 's', 'h', 'n', 'k'] },
  sparseSweep: { modules: ['sparse'], params: ['outStart', 'targets', 'tw', 's', 'h', 'order', 'n'], result: 'i32' },
  sparseRunAsync: { modules: ['sparse'], params: ['outStart', 'targets', 'tw', 's', 'h', 'order', 'n', 'state', 'max', 'shuffle'], result: 'i32' },
  sparseSync: { modules: ['sparse'], params: ['outStart', 'targets', 'tw', 's', 'h', 'next', 'prev', 'n', 'check'], result: 'i32' },
  sparseGlauber: { modules: ['sparse'], params: ['outStart', 'targets', 'tw', 's', 'h', 'order', 'noise', 'n', 'factor:f64', 'table', 'half'] },
  sparseGlauberSync: { modules: ['sparse'], params: ['outStart', 'targets', 'tw', 's', 'h', 'next', 'noise', 'n', 'factor:f64', 'table', 'half'] }
} as const satisfies Record<string, KernelSignature>

/**
 * Layout of the sample block of a whole Glauber trial that takes its samples in the kernel
 * (runGlauber16 with a block), byte offsets: the running sums of the largest other overlap and
 * of the energy (f64), the measured sweeps counted in each end-state class (7 × i32, END_STATES
 * order), the number of samples (i32), then the current sample's normalised overlaps (pp × f64;
 * the host's classifier reads them) and their running sums (pp × f64).
 */
export const SAMPLE_BLOCK = { otherSum: 0, energySum: 8, classCounts: 16, count: 48, overlaps: 56 } as const

/** Bytes of the sample block for overlaps of stride `pp`. */
export function sampleBlockBytes (pp: number): number {
  return SAMPLE_BLOCK.overlaps + 16 * pp
}

/** A parameter: `name` (i32) or `name:f64`. */
export type KernelParam = string
export interface KernelSignature {
  readonly modules: readonly KernelModule[]
  readonly params: readonly KernelParam[]
  readonly result?: 'i32' | 'f64'
}

export type KernelName = keyof typeof KERNEL_SIGNATURES

/** Every JavaScript value crossing the boundary is a number (no i64 parameters). */
type Args<P extends readonly string[]> = { -readonly [K in keyof P]: number }
type KernelFunction<S extends Pick<KernelSignature, 'params' | 'result'>> = (...args: Args<S['params']>) => S extends { result: string } ? number : void

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
