/**
 * Reading a sweep's stored chunks in slices bounded by bytes (src/sweep/read.ts): the event
 * loop gets a turn between slices, and no slice holds much more than READ_SLICE_BYTES however
 * large the chunks are, while sweeps of many small chunks still read 64 at a time.
 */
import { describe, expect, it } from 'vitest'
import { readChunks, READ_SLICE_BYTES, READ_SLICE_CHUNKS, type StoredChunk } from '../../src/sweep/index.js'

function storeOf (sizes: number[]): { store: { chunksBetween: (id: string, from: number, count: number) => Promise<StoredChunk[]> }, slices: number[][] } {
  const slices: number[][] = []
  const chunks = sizes.map((size, index) => ({ index, body: new Uint8Array(size) }))
  return {
    slices,
    store: {
      chunksBetween: async (_id, from, count) => {
        const slice = chunks.slice(from, from + count)
        slices.push(slice.map((chunk) => chunk.body.byteLength))
        return slice
      }
    }
  }
}

describe('readChunks', () => {
  it('keeps slices of large chunks near the byte budget', async () => {
    const size = 3 * 1024 * 1024
    const { store, slices } = storeOf(Array.from({ length: 20 }, () => size))
    const chunks = await readChunks(store, 's', 20)
    expect(chunks.map((chunk) => chunk.index)).toEqual(Array.from({ length: 20 }, (_, i) => i))
    expect(slices[0]).toHaveLength(1)
    for (const slice of slices) expect(slice.reduce((a, b) => a + b, 0)).toBeLessThanOrEqual(READ_SLICE_BYTES)
    expect(slices.length).toBe(1 + Math.ceil(19 / Math.floor(READ_SLICE_BYTES / size)))
  })

  it('reads small chunks 64 at a time after the first', async () => {
    const { store, slices } = storeOf(Array.from({ length: 1000 }, () => 200))
    const chunks = await readChunks(store, 's', 1000)
    expect(chunks).toHaveLength(1000)
    expect(slices.slice(1, -1).every((slice) => slice.length === READ_SLICE_CHUNKS)).toBe(true)
  })

  it('passes over chunks not stored and still covers the plan', async () => {
    const { store } = storeOf([])
    expect(await readChunks(store, 's', 300)).toEqual([])
  })
})
