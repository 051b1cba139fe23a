import type { NativeSweeps, Network, SyncOutcome, ThermalSampling, ThermalTotals } from './network.js'
import type { RandomSource } from '../random/source.js'
import { OverlapKernel } from '../kernels/overlap-kernel.js'
import { areFastPathsEnabled } from '../kernels/wasm.js'

/**
 * Hebbian network held in overlap space: no coupling matrix at all.
 *
 * ## Method
 * With J_ij = (1/N) Σ_μ ξ_i^μ ξ_j^μ (Hopfield 1982), the raw field is
 *   N·h_i = Σ_μ ξ_i^μ m_μ − P s_i,   m_μ = Σ_j ξ_j^μ s_j,
 * the −P s_i term removing the self-coupling J_ii = P/N (kept when `selfCoupling`).
 * A visit costs O(P) and a change O(P), against O(N) for a coupling row, and memory is
 * about 2·N·P bytes instead of N² words. All arithmetic is on small integers, so it is exact.
 * Patterns are also stored neuron-major (ξ_i^· contiguous, int8, rows padded to a multiple
 * of 16) because a visit reads one neuron's entries for every pattern.
 *
 * Whole sweeps and steps run in the WebAssembly SIMD kernel (`fastPath` names it) when the
 * host supports it and the size suits it; the per-neuron methods below are the plain path
 * and give the same integers.
 */
export class OverlapSpaceNetwork implements Network {
  readonly representation = 'overlap-space' as const
  readonly fastPath: string
  readonly neurons: number
  readonly patternCount: number
  readonly patterns: Int8Array
  readonly fieldScale: number
  readonly state: Int8Array
  readonly bytes: number
  readonly native: NativeSweeps | null
  private readonly byNeuron: Int8Array
  private readonly stride: number
  private readonly overlaps: Int32Array
  private readonly selfTerm: number
  private readonly kernel: OverlapKernel | null

  /**
   * `onlyWholeAsync`: the network will run whole zero-temperature asynchronous trials only (no
   * trajectories), so the fast path compiles the kernels of other dynamics only if asked.
   */
  constructor (patterns: Int8Array, neurons: number, patternCount: number, selfCoupling: boolean, private readonly onlyWholeAsync = false, thermal = false) {
    this.neurons = neurons
    this.patternCount = patternCount
    this.patterns = patterns
    this.fieldScale = 1 / neurons
    this.selfTerm = selfCoupling ? 0 : patternCount
    this.kernel = areFastPathsEnabled() ? OverlapKernel.create(neurons, patternCount, this.selfTerm, onlyWholeAsync, thermal) : null
    this.fastPath = this.kernel?.name ?? 'js'
    if (this.kernel !== null) {
      this.stride = this.kernel.stride
      this.byNeuron = this.kernel.xi
      this.kernel.loadPatterns(patterns)
    } else {
      this.stride = patternCount
      this.byNeuron = new Int8Array(neurons * patternCount)
      transposeToNeuronMajor(patterns, neurons, patternCount, this.byNeuron)
    }
    this.overlaps = new Int32Array(patternCount)
    this.state = new Int8Array(neurons)
    this.bytes = patterns.byteLength + this.byNeuron.byteLength + 4 * patternCount + neurons + (this.kernel === null ? 0 : OverlapKernel.signBitBytes(neurons, patternCount))
    this.native = this.kernel === null ? null : new KernelSweeps(this.kernel, this.state, this.overlaps)
  }

  /** Whether this network was built for these sizes and options (so `reloadPatterns` may reuse it). */
  hasShape (neurons: number, patternCount: number, selfCoupling: boolean, onlyWholeAsync: boolean): boolean {
    return neurons === this.neurons && patternCount === this.patternCount && (selfCoupling ? 0 : patternCount) === this.selfTerm &&
      onlyWholeAsync === this.onlyWholeAsync && (this.kernel !== null) === areFastPathsEnabled()
  }

  /**
   * Takes up new patterns written into `patterns` in place: the network is then the one the
   * constructor builds from them, in the all-zero state with zero overlaps (the overlaps of
   * the old state would be stale).
   */
  reloadPatterns (): void {
    if (this.kernel !== null) this.kernel.loadPatterns(this.patterns)
    else transposeToNeuronMajor(this.patterns, this.neurons, this.patternCount, this.byNeuron)
    this.state.fill(0)
    this.overlaps.fill(0)
  }

  load (state: Int8Array): void {
    if (this.kernel !== null) {
      this.state.set(state)
      this.kernel.overlaps(this.state, this.overlaps)
      return
    }
    if (this.loadChanges(state)) return
    this.state.set(state)
    const p = this.patternCount
    const n = this.neurons
    const m = this.overlaps
    for (let mu = 0; mu < p; mu++) {
      let sum = 0
      const base = mu * n
      for (let i = 0; i < n; i++) sum += this.patterns[base + i]! * state[i]!
      m[mu] = sum
    }
  }

  field (i: number): number {
    const p = this.patternCount
    const xi = this.byNeuron
    const m = this.overlaps
    const base = i * this.stride
    // Four independent sums break the add-latency chain; every term is a small integer, so
    // the regrouping is exact.
    let h0 = 0
    let h1 = 0
    let h2 = 0
    let h3 = 0
    let mu = 0
    for (; mu + 3 < p; mu += 4) {
      const o = base + mu
      h0 += xi[o]! * m[mu]!
      h1 += xi[o + 1]! * m[mu + 1]!
      h2 += xi[o + 2]! * m[mu + 2]!
      h3 += xi[o + 3]! * m[mu + 3]!
    }
    for (; mu < p; mu++) h0 += xi[base + mu]! * m[mu]!
    return (h0 + h1) + (h2 + h3) - this.selfTerm * this.state[i]!
  }

  /**
   * When the new state differs from the current one in few neurons (synchronous steps
   * near a fixed point), update the overlaps from the differences: O(changes·P), not O(N·P).
   */
  private loadChanges (state: Int8Array): boolean {
    const n = this.neurons
    let changes = 0
    const limit = n >> 3
    for (let i = 0; i < n; i++) {
      if (state[i] !== this.state[i] && ++changes > limit) return false
    }
    for (let i = 0; i < n; i++) {
      if (state[i] !== this.state[i]) this.set(i, state[i]!)
    }
    return true
  }

  set (i: number, v: number): void {
    const delta = v - this.state[i]!
    if (delta === 0) return
    this.state[i] = v
    const p = this.patternCount
    const xi = this.byNeuron
    const m = this.overlaps
    const base = i * this.stride
    for (let mu = 0; mu < p; mu++) m[mu] = m[mu]! + delta * xi[base + mu]!
  }

  energyPerNeuron (): number {
    // Σ_{i≠j} J_ij s_i s_j = (1/N)(Σ_μ m_μ² − P Σ_i s_i²)
    // The kernel sums natively (the same exact integer): a JavaScript loop of P steps costs more
    // than the rest of a short trial's measures until the JIT has optimised it.
    let sumSq = this.kernel?.sumSquares(this.overlaps) ?? null
    if (sumSq === null) {
      sumSq = 0
      const m = this.overlaps
      const p = this.patternCount
      for (let mu = 0; mu < p; mu++) sumSq += m[mu]! * m[mu]!
    }
    // Σ_i s_i² is N less the erased (0) entries; indexOf finds them natively, so the common
    // all-±1 state costs no JavaScript loop over the neurons.
    let active = this.neurons
    for (let at = this.state.indexOf(0); at !== -1; at = this.state.indexOf(0, at + 1)) active--
    const n = this.neurons
    return -(sumSq - this.patternCount * active) / (2 * n * n)
  }

  rawOverlaps (out: Float64Array): void {
    // A native copy (int32 to double, exact), no JavaScript loop.
    out.set(this.overlaps)
  }

  readonly rawOverlapWith = (mu: number): number => this.overlaps[mu]!
}

/**
 * The kernel's whole sweeps and trials on this network's state and overlaps (a class, not a
 * bundle of closures: W2-style points build a network per trial).
 */
class KernelSweeps implements NativeSweeps {
  constructor (private readonly kernel: OverlapKernel, private readonly state: Int8Array, private readonly overlaps: Int32Array) {}

  runZeroTemperature (order: Int32Array, maxSweeps: number, shuffle: boolean, rng: RandomSource): { sweeps: number, ending: 'fixed' | 'max' } | null {
    const run = this.kernel.runAsync(this.state, this.overlaps, order, maxSweeps, shuffle, rng)
    return run === null ? null : { sweeps: run.sweeps, ending: run.changedLast ? 'max' : 'fixed' }
  }

  runSynchronous (previous: Int8Array, maxSteps: number): { sweeps: number, ending: 'fixed' | 'cycle2' | 'max' } {
    const run = this.kernel.runSync(this.state, this.overlaps, previous, maxSteps)
    return { sweeps: run.steps, ending: run.ending }
  }

  runGlauber (order: Int32Array, sweeps: number, shuffle: boolean, factor: number, rng: RandomSource, afterSweep: (sweep: number) => void): boolean {
    return this.kernel.runGlauber(this.state, this.overlaps, order, sweeps, shuffle, factor, rng, afterSweep)
  }

  runGlauberSampled (order: Int32Array, sweeps: number, shuffle: boolean, factor: number, rng: RandomSource, sampling: ThermalSampling): ThermalTotals | null {
    return this.kernel.runGlauberSampled(this.state, this.overlaps, order, sweeps, shuffle, factor, rng, sampling)
  }

  sweepZeroTemperature (order: Int32Array): boolean {
    return this.kernel.sweep(this.state, this.overlaps, order)
  }

  stepZeroTemperature (previous: Int8Array, checkPrevious: boolean): SyncOutcome {
    const outcome = this.kernel.sync(this.state, this.overlaps, previous, checkPrevious)
    return outcome === 1 ? 'fixed' : outcome === 2 ? 'cycle2' : 'changed'
  }

  sweepGlauber (order: Int32Array, noise: Float64Array, factor: number): void {
    this.kernel.glauber(this.state, this.overlaps, order, noise, factor)
  }

  stepGlauber (noise: Float64Array, factor: number): void {
    this.kernel.glauberSync(this.state, this.overlaps, noise, factor)
  }
}

function transposeToNeuronMajor (patterns: Int8Array, n: number, p: number, out: Int8Array): void {
  for (let mu = 0; mu < p; mu++) {
    for (let i = 0; i < n; i++) out[i * p + mu] = patterns[mu * n + i]!
  }
}
