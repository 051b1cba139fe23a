import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { buildNetwork, createPointRunner, createScratch, Xoshiro256StarStar, type PointParams } from '../../../src/engine/index.js'
import { runDynamics } from '../../../src/engine/dynamics/run.js'
import { DenseMemoryNetwork, type Interaction } from '../../../src/engine/network/dense-memory.js'
import erfc from '@stdlib/math-base-special-erfc'
import { denseCrosstalkErrorGaussian, exponentialCapacityExponent, oddDoubleFactorial } from '../../../src/engine/theory/index.js'
import { bisect } from '../../../src/engine/theory/bisect.js'
import { mean, pointParams, sampleSd } from '../../helpers/point.js'

const quiet = { overlapTrajectory: false, energyTrajectory: false, stability: false }

/** E = −Σ_μ F(ξ^μ·σ) computed from scratch, for F = xⁿ or eˣ (no scaling). */
function bruteEnergy (patterns: Int8Array, n: number, s: Int8Array, interaction: Interaction): number {
  let e = 0
  for (let mu = 0; mu < patterns.length / n; mu++) {
    let m = 0
    for (let i = 0; i < n; i++) m += patterns[mu * n + i]! * s[i]!
    e -= interaction.kind === 'polynomial' ? m ** interaction.degree : Math.exp(m)
  }
  return e
}

const measured = new Map<string, number[]>()

/** Per-network unstable fractions of a dense memory sitting on its stored patterns (memoised: two tests share N = 100, K = 400). */
function unstableFractions (neurons: number, patterns: number, degree: number, networks: number, seed: number): number[] {
  const key = [neurons, patterns, degree, networks, seed].join(',')
  const known = measured.get(key)
  if (known !== undefined) return known
  const p = pointParams({ neurons, patterns, rule: { kind: 'dense-polynomial', degree }, measures: { ...quiet, stability: true }, dynamics: { update: 'async-random', temperature: 0, maxSweeps: 1, burnIn: 0 } })
  const runner = createPointRunner(p, seed, 0)
  const rates = Array.from({ length: networks }, (_, t) => runner.runTrial(t).stability!.unstableFraction)
  measured.set(key, rates)
  return rates
}

describe('dense associative memories (Krotov & Hopfield 2016; Demircigil et al. 2017)', () => {
  it('updates each neuron to the sign of F(ξ_i + r) − F(−ξ_i + r), the lower-energy choice', () => {
    // The update rule as stated by Krotov & Hopfield (NeurIPS 29, 2016), checked against the
    // energy computed from scratch: the field's sign says which value of σ_i has lower E.
    for (const interaction of [{ kind: 'polynomial', degree: 3 }, { kind: 'polynomial', degree: 4 }, { kind: 'exponential' }] as Interaction[]) {
      const n = 24
      const rng = Xoshiro256StarStar.fromSeed(4n)
      const count = 30
      const patterns = Int8Array.from({ length: n * count }, () => (rng.uniform() < 0.5 ? 1 : -1))
      const net = new DenseMemoryNetwork(patterns, n, count, interaction)
      const s = Int8Array.from({ length: n }, () => (rng.uniform() < 0.5 ? 1 : -1))
      net.load(s)
      for (let i = 0; i < n; i++) {
        const up = Int8Array.from(s)
        up[i] = 1
        const down = Int8Array.from(s)
        down[i] = -1
        const drop = bruteEnergy(patterns, n, down, interaction) - bruteEnergy(patterns, n, up, interaction)
        expect(Math.sign(net.field(i))).toBe(Math.sign(drop))
      }
    }
  })

  it('energy never increases under asynchronous updates, for xⁿ and eˣ (property)', () => {
    // Krotov & Hopfield 2016; CHECK_VALUES §11 [D]: each update picks the σ_i of lower energy.
    // energyPerNeuron is an increasing function of E (network/dense-memory.ts), so it must not
    // rise either; tolerance 1e-12 relative for floating sums.
    const cases = fc.record({
      n: fc.integer({ min: 4, max: 40 }),
      count: fc.integer({ min: 1, max: 60 }),
      degree: fc.integer({ min: 0, max: 6 }),
      seed: fc.integer({ min: 0, max: 2 ** 31 }),
      update: fc.constantFrom('async-random' as const, 'async-sequential' as const)
    })
    fc.assert(fc.property(cases, ({ n, count, degree, seed, update }) => {
      const rng = Xoshiro256StarStar.fromSeed(BigInt(seed))
      const interaction: Interaction = degree < 2 ? { kind: 'exponential' } : { kind: 'polynomial', degree }
      const patterns = Int8Array.from({ length: n * count }, () => (rng.uniform() < 0.5 ? 1 : -1))
      const net = new DenseMemoryNetwork(patterns, n, count, interaction)
      net.load(Int8Array.from({ length: n }, () => (rng.uniform() < 0.5 ? 1 : -1)))
      const before = net.energyPerNeuron()
      const out = runDynamics(net, { update, temperature: 0, maxSweeps: 100, burnIn: 0 }, rng, createScratch(n, count), { targetOverlap: () => 0, recordOverlap: false, recordEnergy: true })
      const energies = [before, ...out.energyTrajectory!]
      for (let k = 1; k < energies.length; k++) expect(energies[k]!).toBeLessThanOrEqual(energies[k - 1]! + 1e-12 * Math.abs(energies[k - 1]!))
      expect(out.ending).toBe('fixed')
    }), { numRuns: 120 })
  })

  it('with n = 2 runs exactly the Hebbian dynamics (J_ii = 0), at T = 0 and T > 0', () => {
    // F(x) = x² gives F(r + 1) − F(r − 1) = 4r: the Hebbian field with J_ii = 0 (Hopfield 1982),
    // and the field scale makes it equal in physical units, so Glauber dynamics agree too.
    // Same streams: records must agree exactly, energies up to the self-coupling constant
    // P·Σσ²/(2N²) = α/2 here (no erased bits).
    for (const temperature of [0, 0.4]) {
      const dynamics = { update: 'async-random' as const, temperature, maxSweeps: 12, burnIn: 4 }
      const base = { neurons: 150, patterns: 18, cue: { kind: 'flip' as const, fraction: 0.2 }, dynamics, measures: { ...quiet, overlapTrajectory: true } }
      const hebb = createPointRunner(pointParams(base), 3, 0)
      const dense = createPointRunner(pointParams({ ...base, rule: { kind: 'dense-polynomial', degree: 2 } }), 3, 0)
      for (let t = 0; t < 8; t++) {
        const a = hebb.runTrial(t)
        const b = dense.runTrial(t)
        // At T > 0 the energy is a time average and the last sweep's value is kept as finalEnergy.
        const withoutEnergies = (r: typeof a) => ({ ...r, energy: 0, ...(r.finalEnergy === undefined ? {} : { finalEnergy: 0 }) })
        expect(withoutEnergies(b)).toStrictEqual(withoutEnergies(a))
        expect(b.energy).toBeCloseTo(a.energy - 18 / 300, 12)
        if (temperature > 0) expect(b.finalEnergy!).toBeCloseTo(a.finalEnergy! - 18 / 300, 12)
      }
    }
  })

  it('n = 3: one-step bit error within ±30 % of ½ erfc(√(N²/(6K))) at N = 100, K = 400', () => {
    // CHECK_VALUES §6: P_err ≈ ½ erfc(√(N^{n−1}/(2K(2n−3)!!))) (signal-to-noise, derived there;
    // Krotov & Hopfield 2016 capacity constant recalled from memory) = 1.95e-3 here; the tails
    // are not Gaussian at N ≈ 100, so ±30 % is allowed (a Monte-Carlo reference there gives
    // 2.30e-3 ± 0.28e-3, not a published number). Also within 4 SE of that reference.
    const gaussian = denseCrosstalkErrorGaussian(100, 400, 3)
    expect(gaussian).toBeCloseTo(1.95e-3, 5)
    const rates = unstableFractions(100, 400, 3, 10, 21)
    const m = mean(rates)
    expect(Math.abs(m / gaussian - 1)).toBeLessThan(0.3)
    expect(Math.abs(m - 2.30e-3)).toBeLessThan(4 * Math.hypot(sampleSd(rates) / Math.sqrt(rates.length), 0.28e-3 / 4))
  })

  it('n = 3 capacity scales as N²: the error at fixed K/N² does not depend on N, unlike at fixed K/N', () => {
    // K_max ∝ N^{n−1} (Krotov & Hopfield 2016; CHECK_VALUES §6, test trends not constants).
    // K = N²/25 gives the same Gaussian error at N = 50 and 100; both measured errors lie
    // within ±30 % of it. Doubling N with K only doubled (the n = 2 scaling) lowers the
    // error by more than an order of magnitude (Gaussian: 1.95e-3 → 2.4e-5).
    const small = mean(unstableFractions(50, 100, 3, 12, 31))
    const large = mean(unstableFractions(100, 400, 3, 10, 21))
    const target = denseCrosstalkErrorGaussian(50, 100, 3)
    expect(denseCrosstalkErrorGaussian(100, 400, 3)).toBeCloseTo(target, 12)
    expect(Math.abs(small / target - 1)).toBeLessThan(0.3)
    expect(Math.abs(large / target - 1)).toBeLessThan(0.3)
    const linear = mean(unstableFractions(100, 200, 3, 6, 33))
    expect(linear).toBeLessThan(small / 10)
  })

  it('n = 3 vs n = 2: the load giving the same one-step error grows by N/3 (ratio test)', () => {
    // K_max ∝ N^{n−1}/(2n − 3)!! (Krotov & Hopfield 2016, constant recalled from memory;
    // CHECK_VALUES §6 says to test ratios): the Gaussian law makes K₃/K₂ = N/3 at equal error.
    // Each measured error is turned into the K the Gaussian law would need for it; at N = 100
    // the two tails deviate in opposite directions (lighter for n = 2, heavier for n = 3), and
    // K moves only as ≈ 0.26·ln p near p ≈ 5e-3, so the effective ratio must lie within ±30 %
    // of N/3 = 33.3. A capacity growing like N for both would give a ratio near 3.
    const n = 100
    const effectiveK = (rate: number, degree: number): number => {
      const x = bisect((y) => 0.5 * erfc(y) - rate, 0.1, 6)
      return n ** (degree - 1) / (2 * oddDoubleFactorial(degree) * x * x)
    }
    const k2 = effectiveK(mean(unstableFractions(n, 15, 2, 40, 41)), 2)
    const k3 = effectiveK(mean(unstableFractions(n, 500, 3, 6, 42)), 3)
    expect(Math.abs(k3 / k2 / (n / 3) - 1)).toBeLessThan(0.3)
  })

  it('eˣ stores 2000 patterns in 32 neurons and retrieves them from a 10 % cue', () => {
    // Demircigil, Heusel, Löwe, Upgang & Vermet, J. Stat. Phys. 168, 288 (2017): e^{αN}
    // patterns with α < I(1 − 2ρ)/2 (bound recalled from memory, CHECK_VALUES §6) — asymptotic;
    // at N = 32 we check the regime: K = 2000 = 62.5 N, α = ln K / N = 0.238 < ln 2/2 = 0.347,
    // retrieved exactly from cues with 3 wrong bits, where xⁿ memories of degree 2 and 3
    // (K_max ≈ 5 and ≈ 50 here) fail.
    expect(exponentialCapacityExponent(0)).toBeCloseTo(Math.LN2 / 2, 12)
    expect(Math.log(2000) / 32).toBeLessThan(exponentialCapacityExponent(0))
    const run = (rule: PointParams['rule']): number => {
      const runner = createPointRunner(pointParams({ neurons: 32, patterns: 2000, rule, cue: { kind: 'flip', fraction: 0.1 }, successThreshold: 1, trialsPerNetwork: 40 }), 8, 0)
      let exact = 0
      for (let t = 0; t < 80; t++) if (runner.runTrial(t).overlap === 1) exact++
      return exact / 80
    }
    expect(run({ kind: 'dense-exponential' })).toBeGreaterThanOrEqual(0.95)
    expect(run({ kind: 'dense-polynomial', degree: 3 })).toBeLessThan(0.2)
    expect(run({ kind: 'dense-polynomial', degree: 2 })).toBeLessThan(0.05)
  })

  it('eˣ stays finite far beyond e^709: N = 1500 retrieves from a 30 % cue', () => {
    // Raw fields are taken relative to the largest exponent (network/dense-memory.ts), so the
    // e^{1500} of the plain formula never appears; energies are −ln(−E)/N, finite.
    const runner = createPointRunner(pointParams({ neurons: 1500, patterns: 40, rule: { kind: 'dense-exponential' }, cue: { kind: 'flip', fraction: 0.3 }, measures: { ...quiet, energyTrajectory: true } }), 2, 0)
    const r = runner.runTrial(0)
    expect(r.overlap).toBe(1)
    expect(r.energy).toBeCloseTo(-1, 6)
    expect(r.energyTrajectory!.every(Number.isFinite)).toBe(true)
    expect(runner.representation).toBe('dense-memory')
  })

  it('builds from the network stream like every other rule (patterns first)', () => {
    const p = pointParams({ neurons: 30, patterns: 5, rule: { kind: 'dense-polynomial', degree: 4 } })
    const a = buildNetwork(p, Xoshiro256StarStar.fromSeed(6n))
    const b = buildNetwork(pointParams({ neurons: 30, patterns: 5 }), Xoshiro256StarStar.fromSeed(6n))
    expect(a.patterns).toStrictEqual(b.patterns)
    // Its WebAssembly fast path (bit-identical to the plain loops: test/engine/kernels/dense-memory.test.ts).
    expect(a.fastPath).toBe('wasm-simd128-dense-memory-poly')
  })
})
