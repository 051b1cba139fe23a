/**
 * One result never mixes two engine releases: a chunk records the release that computed it,
 * and assembly refuses a chunk of another release (a sweep that ran across an upgrade), so
 * such a sweep fails with a system failure that says why, instead of silently mixing records.
 */
import { describe, expect, it } from 'vitest'
import { ENGINE_VERSION } from '../../src/engine/index.js'
import { normaliseSpec } from '../../src/spec/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'
import {
  assembleStored, decodeValue, encodeValue, EngineMixError, makeProvenance, planSweep, runChunk, systemCauseOf, systemFailure, type StoredChunk
} from '../../src/sweep/index.js'

const spec = normaliseSpec({ label: 'room codes across an upgrade', neurons: 60, load: { values: [0.05, 0.1] }, trials: 6, seed: 12 })

function storedChunks (): StoredChunk[] {
  return planSweep(spec).chunks.map((chunk) => {
    const outcome = runChunk(spec, chunk, { shouldStop: () => false })
    if (outcome.kind !== 'done') throw new Error('chunk did not run')
    return { index: chunk.index, body: outcome.body }
  })
}

describe('engine releases never mix', () => {
  const provenance = makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 })

  it('records the engine release with every chunk', () => {
    for (const chunk of storedChunks()) expect(decodeValue<{ engine?: string }>(chunk.body).engine).toBe(ENGINE_VERSION)
  })

  it('assembles chunks of this release, and of releases that did not record one', () => {
    const chunks = storedChunks()
    const unrecorded = chunks.map((chunk) => {
      const { engine: _engine, ...rest } = decodeValue<Record<string, unknown>>(chunk.body)
      return { index: chunk.index, body: encodeValue(rest) }
    })
    expect(assembleStored(spec, planSweep(spec).chunks, unrecorded, provenance).rows).toEqual(assembleStored(spec, planSweep(spec).chunks, chunks, provenance).rows)
  })

  it('refuses a chunk of another release, and the failure says why', () => {
    const chunks = storedChunks()
    const older = { index: chunks[1]!.index, body: encodeValue({ ...decodeValue<Record<string, unknown>>(chunks[1]!.body), engine: '0.0.9' }) }
    let caught: unknown
    try {
      assembleStored(spec, planSweep(spec).chunks, [chunks[0]!, older, ...chunks.slice(2)], provenance)
    } catch (error) {
      caught = error
    }
    expect(caught).toBeInstanceOf(EngineMixError)
    expect((caught as Error).message).toContain('0.0.9')
    const failure = systemFailure({ chunkIndex: null, chunksTotal: chunks.length }, 1, systemCauseOf((caught as Error).name))
    expect(failure.message).toContain('two engine releases')
  })
})
