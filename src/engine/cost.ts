import type { PointParams } from './params.js'
import { chooseRepresentation, type Representation } from './network/build.js'
import { OverlapKernel } from './kernels/overlap-kernel.js'
import { glauberTableBytes } from './kernels/glauber-table.js'
import { denseMemoryKernelExtraBytes, polynomialKernelFits } from './kernels/dense-memory-kernel.js'
import { softmaxKernelExtraBytes } from './kernels/softmax-kernel.js'
import { sparseKernelExtraBytes, sparseKernelFits } from './kernels/sparse-kernel.js'

export interface PointCost {
  /** Peak bytes one runner holds for this point (network, patterns, scratch). */
  bytes: number
  /** Expected neuron visits per trial (upper bound: maxSweeps·N at T = 0 is rarely reached; we use a typical settle count). */
  neuronUpdatesPerTrial: number
  /** Arithmetic operations to build one network. */
  buildOpsPerNetwork: number
  /** Operations per neuron visit (O(P) in overlap space, O(1) amortised with dense fields). */
  opsPerVisit: number
}

/**
 * The overlap-space SIMD kernel runs a visit's P multiply-adds eight int16 lanes at a time,
 * four fields per pass: against the cost unit (one scalar operation of the plain path) a
 * visit costs about 2 + P/16. Fitted with test/spec/measure-throughput.ts.
 */
const OVERLAP_VISIT_FIXED_OPS = 2
const OVERLAP_KERNEL_LANES = 16

/** A Glauber visit's uniform draw and exponential, in cost units (measure-throughput.ts). */
const GLAUBER_OPS_PER_VISIT = 20

/**
 * Memory and work estimate of one grid point, computed from the parameters alone so
 * oversized work can be refused before anything is allocated.
 */
export function estimatePointCost (p: PointParams): PointCost {
  const cost = representationCost(p)
  // The stored patterns' overlaps are measured once per network: N·P(P − 1)/2 multiply-adds.
  if (p.measures.patternOverlaps !== true) return cost
  return { ...cost, buildOpsPerNetwork: cost.buildOpsPerNetwork + p.neurons * p.patterns * (p.patterns - 1) / 2 }
}

function representationCost (p: PointParams): PointCost {
  const n = p.neurons
  const count = p.patterns
  const representation = chooseRepresentation(p)
  const patternBytes = n * count
  // Scratch: order, indices, three states, fields; the overlaps and their T > 0 sums (8 bytes each per pattern).
  const scratchBytes = n * (4 + 4 + 1 + 1 + 1 + 8) + 16 * count + generationBytes(p)
  const thermal = p.dynamics.temperature > 0
  const sweeps = thermal ? p.dynamics.maxSweeps : Math.min(p.dynamics.maxSweeps, 10)
  const neuronUpdatesPerTrial = sweeps * n
  // A Glauber visit also draws a uniform and evaluates an exponential.
  const noiseOps = thermal ? GLAUBER_OPS_PER_VISIT : 0
  if (representation === 'overlap-space') {
    return {
      // Both pattern layouts, the overlaps and the fast path's sign bits (8·⌈N/64⌉ bytes a
      // pattern) and per-neuron bounds (12 bytes); the block where Glauber trials take their
      // samples (two doubles a pattern); at T > 0 the table of Glauber's 1 + exp(factor·h)
      // over the integer fields.
      bytes: 2 * patternBytes + OverlapKernel.signBitBytes(n, count) + scratchBytes + 4 * count + 16 * count + 12 * n + (thermal ? glauberTableBytes(count * (n + 1)) : 0),
      neuronUpdatesPerTrial,
      buildOpsPerNetwork: n * count,
      opsPerVisit: OVERLAP_VISIT_FIXED_OPS + count / OVERLAP_KERNEL_LANES + noiseOps
    }
  }
  const model = modelCost(p, representation, patternBytes + scratchBytes, neuronUpdatesPerTrial)
  if (model !== null) return model
  let buildOps = n * n * count
  if (p.rule.kind === 'pseudo-inverse') buildOps += n * count * count + count * count * count
  if (p.rule.kind === 'storkey') buildOps *= 2
  return {
    // At T > 0 integer couplings also tabulate Glauber's 1 + exp(factor·h) (counted at its largest).
    bytes: denseBuildPeakBytes(p) + patternBytes + scratchBytes + (thermal ? glauberTableBytes(Number.MAX_SAFE_INTEGER) : 0),
    neuronUpdatesPerTrial,
    buildOpsPerNetwork: buildOps,
    // A visit reads one field; a change (a fraction of visits) adds a column of N.
    opsPerVisit: 1 + n / Math.max(1, sweeps) + noiseOps
  }
}

/** Below this many bytes a kernel's large array lives in a shared instance as a second copy. */
const KERNEL_PRIVATE_BYTES = 8 * 1024 * 1024
const align16 = (x: number): number => (x + 15) & ~15
/** The copy a shared kernel instance keeps of a small network's large array (counted while it is resident). */
const sharedCopy = (bytes: number): number => bytes < KERNEL_PRIVATE_BYTES ? bytes : 0

/**
 * How many times faster the model kernels run a visit (or an update) than the plain loops the
 * operation counts below describe: the smallest fast ÷ plain ratio measured on D4–D7
 * (bench/RESULTS.md, rounded down), so estimates stay on the safe side.
 */
const MODEL_KERNEL_SPEEDUP = { denseMemory: 4, softmax: 4, inDegree: 2 } as const

/**
 * The representations without a coupling matrix: dense memories and the softmax network
 * hold the patterns twice (O(P) per visit or per state component), the fixed in-degree
 * network its N·K lists (O(K) per visit at most). Their WebAssembly kernels add their layouts
 * (kernels/*-kernel.ts). Null for the others.
 */
function modelCost (p: PointParams, representation: Representation, baseBytes: number, neuronUpdatesPerTrial: number): PointCost | null {
  const n = p.neurons
  const count = p.patterns
  switch (representation) {
    case 'dense-memory': {
      const kernel = p.rule.kind === 'dense-exponential' || (p.rule.kind === 'dense-polynomial' && polynomialKernelFits(n, count, p.rule.degree))
      // The neuron-major copy (rows padded to 16 in the kernel), the plain table, the overlaps.
      const byNeuron = kernel ? n * align16(count) : n * count
      const kernelBytes = kernel ? denseMemoryKernelExtraBytes(n, count) + sharedCopy(byNeuron) : 0
      const plainOps = p.rule.kind === 'dense-exponential' ? 2 * count : count
      return { bytes: baseBytes + byNeuron + 4 * count + 16 * n + kernelBytes, neuronUpdatesPerTrial, buildOpsPerNetwork: 2 * n * count, opsPerVisit: kernel ? plainOps / MODEL_KERNEL_SPEEDUP.denseMemory : plainOps }
    }
    case 'softmax-continuous':
      return { bytes: baseBytes + 8 * count + 16 * n + softmaxKernelExtraBytes(n, count) + sharedCopy(n * count), neuronUpdatesPerTrial, buildOpsPerNetwork: n * count, opsPerVisit: 2 * count / MODEL_KERNEL_SPEEDUP.softmax }
    case 'sparse-in-degree': {
      const k = p.dilution?.kind === 'fixed-in-degree' ? p.dilution.inDegree : n
      // While the network is built, the rule's int32 rows (8·N·K) and the out-lists (8·N·K, or the
      // kernel's compact rows and out-lists, 8·N·K in all) are both alive. Hebbian couplings are at
      // most P in magnitude, clipped ones 1.
      const kernel = sparseKernelFits(n, p.rule.kind === 'clipped' ? 1 : count)
      const kernelBytes = kernel ? sparseKernelExtraBytes(n, count) + sharedCopy(8 * n * k) : 0
      return { bytes: baseBytes + n * count + 16 * n * k + 12 * n + kernelBytes, neuronUpdatesPerTrial, buildOpsPerNetwork: n * k * (count + 8), opsPerVisit: kernel ? k / MODEL_KERNEL_SPEEDUP.inDegree : k }
    }
    default:
      return null
  }
}

/** Workspace of the native pattern generator: rows are drawn in blocks of at most 4 MiB. */
function generationBytes (p: PointParams): number {
  return Math.min(p.neurons * p.patterns, 4 * 1024 * 1024)
}

/**
 * Peak bytes of a coupling matrix while the network is built, as measured (bench/memory.ts):
 * the rule's float64 matrices (Storkey keeps two) and its temporaries are still resident
 * when the fast path copies the couplings into its own memory, float64 columns or, for
 * integer couplings, int16 columns padded to a multiple of 8. The rule's arrays become
 * garbage after the build, but they are counted: the peak is what the limit must cover.
 */
function denseBuildPeakBytes (p: PointParams): number {
  const n = p.neurons
  const count = p.patterns
  const matrix = 8 * n * n
  let bytes = p.rule.kind === 'storkey' ? 2 * matrix : matrix
  if (p.rule.kind === 'pseudo-inverse') bytes += 8 * (count * n + 2 * count * count)
  if (p.rule.kind === 'covariance') bytes += 8 * count * n
  const keep = p.dilution !== null && p.dilution.kind !== 'fixed-in-degree' ? p.dilution.keep : 1
  const integer = (p.rule.kind === 'hebbian' || p.rule.kind === 'clipped') && Number.isInteger(1 / keep) && count < 32767
  return bytes + (integer ? 2 * n * ((n + 7) & ~7) : matrix)
}
