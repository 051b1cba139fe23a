import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { createScratch, Xoshiro256StarStar } from '../../src/engine/index.js'
import { DenseNetwork } from '../../src/engine/network/dense.js'
import { runDynamics } from '../../src/engine/dynamics/run.js'

function denseFrom (j: number[][], bias = 0): DenseNetwork {
  const n = j.length
  return new DenseNetwork({
    patterns: new Int8Array(n).fill(1),
    neurons: n,
    patternCount: 1,
    couplings: Float64Array.from(j.flat()),
    bias: new Float64Array(n).fill(bias),
    fieldScale: 1,
    symmetric: true
  })
}

const observe = (net: DenseNetwork, recordEnergy: boolean) => ({ targetOverlap: () => 0, recordOverlap: false, recordEnergy })

/** A random symmetric matrix with a non-negative diagonal, from fast-check integers. */
const symmetricMatrix = fc.integer({ min: 2, max: 24 }).chain((n) =>
  fc.tuple(fc.array(fc.integer({ min: -9, max: 9 }), { minLength: n * n, maxLength: n * n }), fc.array(fc.constantFrom(-1, 1), { minLength: n, maxLength: n }), fc.integer({ min: 0, max: 2 ** 31 }))
    .map(([w, s, seed]) => {
      const j = Array.from({ length: n }, (_, a) => Array.from({ length: n }, (_, b) => a === b ? Math.abs(w[a * n + a]!) : w[Math.min(a, b) * n + Math.max(a, b)]!))
      return { j, s: Int8Array.from(s), seed }
    }))

describe('Lyapunov structure', () => {
  it('energy never increases under asynchronous zero-temperature updates (J symmetric, J_ii ≥ 0)', () => {
    // Hopfield, PNAS 79, 2554 (1982); CHECK_VALUES §11: a flip changes E by −2|h_i| − 2J_ii ≤ 0.
    fc.assert(fc.property(symmetricMatrix, ({ j, s, seed }) => {
      const net = denseFrom(j)
      net.load(s)
      const before = net.energyPerNeuron()
      const scratch = createScratch(j.length, 1)
      const out = runDynamics(net, { update: 'async-random', temperature: 0, maxSweeps: 200, burnIn: 0 }, Xoshiro256StarStar.fromSeed(BigInt(seed)), scratch, observe(net, true))
      const energies = [before, ...out.energyTrajectory!]
      for (let k = 1; k < energies.length; k++) expect(energies[k]!).toBeLessThanOrEqual(energies[k - 1]! + 1e-12)
      expect(out.ending).toBe('fixed')
    }), { numRuns: 150 })
  })

  it('synchronous updates end in a fixed point or a 2-cycle (J symmetric)', () => {
    // Goles, Fogelman-Soulié & Pellegrin, Discrete Appl. Math. 12, 261 (1985) [recalled from memory].
    fc.assert(fc.property(symmetricMatrix, ({ j, s, seed }) => {
      const net = denseFrom(j)
      net.load(s)
      const out = runDynamics(net, { update: 'sync', temperature: 0, maxSweeps: 500, burnIn: 0 }, Xoshiro256StarStar.fromSeed(BigInt(seed)), createScratch(j.length, 1), observe(net, false))
      expect(['fixed', 'cycle2']).toContain(out.ending)
    }), { numRuns: 150 })
  })

  it('J = [[0,1],[1,0]] from (+,−) is a 2-cycle under synchronous updates', () => {
    // CHECK_VALUES §11 (Monte-Carlo check of the Goles et al. statement).
    const net = denseFrom([[0, 1], [1, 0]])
    net.load(Int8Array.from([1, -1]))
    const out = runDynamics(net, { update: 'sync', temperature: 0, maxSweeps: 10, burnIn: 0 }, Xoshiro256StarStar.fromSeed(1n), createScratch(2, 1), observe(net, false))
    expect(out.ending).toBe('cycle2')
    expect(out.sweeps).toBe(2)
  })

  it('a negative self-coupling J_11 = −1 flips forever under asynchronous updates', () => {
    // Goles & Martínez, Neural and Automata Networks (book) [CHECK_VALUES §11]: the fixed-point
    // result needs a non-negative diagonal.
    const net = denseFrom([[-1]])
    net.load(Int8Array.from([1]))
    const out = runDynamics(net, { update: 'async-sequential', temperature: 0, maxSweeps: 25, burnIn: 0 }, Xoshiro256StarStar.fromSeed(1n), createScratch(1, 1), observe(net, false))
    expect(out.ending).toBe('max')
    expect(out.sweeps).toBe(25)
  })

  it('the tie rule keeps a neuron whose field is exactly zero', () => {
    // Our documented convention: h_i = 0 leaves s_i unchanged.
    const net = denseFrom([[0, 0], [0, 0]])
    net.load(Int8Array.from([1, -1]))
    const out = runDynamics(net, { update: 'async-random', temperature: 0, maxSweeps: 5, burnIn: 0 }, Xoshiro256StarStar.fromSeed(1n), createScratch(2, 1), observe(net, false))
    expect(out.ending).toBe('fixed')
    expect(Array.from(net.state)).toEqual([1, -1])
  })
})
