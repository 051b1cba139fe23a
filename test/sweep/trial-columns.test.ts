import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { normaliseSpec } from '../../src/spec/index.js'
import { assembleStored, computeChunk, decodeChunkValue, encodeChunkValue, encodeValue, makeProvenance, planSweep, type ChunkResult } from '../../src/sweep/index.js'
import { fromColumns, toColumns } from '../../src/sweep/trial-columns.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

/** Equal values (−0 told from 0, NaN equal to NaN), and records with their keys in the same order. */
function expectIdentical (actual: unknown, expected: unknown): void {
  expect(actual).toStrictEqual(expected)
  const trialsOf = (value: unknown): unknown => Array.isArray(value) ? value : (value as { trials?: unknown }).trials
  expect(JSON.stringify(trialsOf(actual))).toBe(JSON.stringify(trialsOf(expected)))
}

/** Chunk results of real sweeps whose records hold every optional member the engine writes. */
function engineChunks (): Array<{ name: string, result: ChunkResult }> {
  const specs = {
    plain: { seed: 3, neurons: 60, patterns: 4, trials: 40 },
    thermal: { seed: 3, neurons: 60, patterns: 4, trials: 40, dynamics: { temperature: 0.5, maxSweeps: 12, burnIn: 4 } },
    measures: { seed: 3, neurons: 60, patterns: 4, trials: 40, trialsPerNetwork: 4, measures: { stability: true, patternOverlaps: true, overlapTrajectory: true, energyTrajectory: true } },
    mixture: { seed: 3, neurons: 60, patterns: 6, trials: 40, cue: { kind: 'mixture', components: 3 } }
  }
  return Object.entries(specs).map(([name, raw]) => {
    const spec = normaliseSpec(raw)
    return { name, result: computeChunk(spec, planSweep(spec).chunks[0]!) }
  })
}

describe('trial records stored by column', () => {
  it.each(engineChunks())('gives back the engine\'s records exactly, in a third of the bytes or less ($name)', ({ result }) => {
    expectIdentical(decodeChunkValue<ChunkResult>(encodeChunkValue(result)), result)
    expect(encodeChunkValue(result).byteLength).toBeLessThan(encodeValue(result).byteLength / 1.4)
  })

  it('reads chunks stored with their records as they are (before columns)', () => {
    for (const { result } of engineChunks()) expectIdentical(decodeChunkValue<ChunkResult>(encodeValue(result)), result)
  })

  it('assembles the same result from chunks stored either way', () => {
    const spec = normaliseSpec({ seed: 8, neurons: 50, load: { from: 0.04, to: 0.12, step: 0.04 }, trials: 30, dynamics: { temperature: 0.3, maxSweeps: 10, burnIn: 3 } })
    const plan = planSweep(spec).chunks
    const results = plan.map((chunk) => computeChunk(spec, chunk))
    const provenance = makeProvenance(spec, runtimeFacts(), { wallSeconds: 1, cpuSeconds: 1 })
    const byColumn = assembleStored(spec, plan, results.map((r, k) => ({ index: plan[k]!.index, body: encodeChunkValue(r) })), provenance)
    const asTheyAre = assembleStored(spec, plan, results.map((r, k) => ({ index: plan[k]!.index, body: encodeValue(r) })), provenance)
    expectIdentical(byColumn, asTheyAre)
    expect(byColumn.rows).toHaveLength(3)
  })

  it('keeps −0, NaN, infinities, absent members, explicit undefined and values of mixed kinds', () => {
    const records = [
      { trial: 0, overlap: -0, energy: Number.NaN, ending: 'fixed', shares: { a: 1, b: 0 }, path: [1, -0, 0.5] },
      { trial: 1, overlap: Infinity, energy: -Infinity, ending: 'limit', path: [] },
      { trial: 2, overlap: 0.25, energy: 1e-300, ending: 'fixed', shares: { a: 0.5, b: 0.5 }, path: [2], extra: undefined },
      { trial: 3.5, overlap: 1, energy: 2, ending: 7, shares: { b: 1, a: 0 }, path: ['x'] }
    ]
    const stored = toColumns(records)
    expect(stored).not.toBeNull()
    expectIdentical(fromColumns(stored!), records)
  })

  it('leaves records whose keys follow no common order as they are', () => {
    const records = [{ a: 1, b: 2 }, { b: 3, a: 4 }]
    expect(toColumns(records)).toBeNull()
    expect(toColumns([JSON.parse('{"__proto__": 1, "a": 2}')])).toBeNull()
    const chunk = { chunk: 0, point: 0, trials: records }
    expectIdentical(decodeChunkValue(encodeChunkValue(chunk)), chunk)
  })

  it('gives back any array of plain records exactly (property)', () => {
    const value = fc.oneof(
      fc.double(),
      fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }),
      fc.constantFrom('target', 'mixture', 'spin-glass'),
      fc.array(fc.double(), { maxLength: 4 }),
      fc.dictionary(fc.constantFrom('x', 'y'), fc.double(), { noNullPrototype: true }),
      fc.constant(undefined),
      fc.boolean()
    )
    const record = fc.dictionary(fc.constantFrom('trial', 'overlap', 'ending', 'shares', 'path', 'energy'), value, { noNullPrototype: true })
    fc.assert(fc.property(fc.array(record, { maxLength: 12 }), (records) => {
      const chunk = { chunk: 2, point: 1, trials: records }
      expectIdentical(decodeChunkValue(encodeChunkValue(chunk)), chunk)
    }), { numRuns: 300 })
  })
})
