/**
 * Compute threads started from the TypeScript source, as `npm run memsweep` and vitest's watch
 * mode start them (src/runtime/thread-from-source.mjs), rather than from the prebuilt bundles
 * the rest of the suite uses. The thread's entry loads its chunk code with a dynamic import
 * (src/runtime/engine-compilation.ts), which only tsx's scoped loader serves in a Node 20
 * thread: a sweep must run there and give the bundled threads' bytes.
 */
import { afterAll, describe, expect, it } from 'vitest'
import { THREAD_BUNDLES_VARIABLE, workerEntryFor } from '../../../src/runtime/worker-entry.js'
import { fullResult, makeDataDir, openQueue, resultBytes, roomCodesSpec, waitForTerminal } from './helpers.js'

function entryFromSource (): ReturnType<typeof workerEntryFor> {
  const bundles = process.env[THREAD_BUNDLES_VARIABLE]
  process.env[THREAD_BUNDLES_VARIABLE] = ''
  try {
    return workerEntryFor(new URL('../../../src/backends/embedded/chunk-worker.ts', import.meta.url))
  } finally {
    if (bundles === undefined) delete process.env[THREAD_BUNDLES_VARIABLE]
    else process.env[THREAD_BUNDLES_VARIABLE] = bundles
  }
}

describe('compute threads started from the TypeScript source', () => {
  const data = makeDataDir()
  afterAll(() => data.remove())

  it('start through thread-from-source.mjs and run a sweep with the same bytes as bundled threads', { timeout: 60_000 }, async () => {
    const entry = entryFromSource()
    expect(entry.filename).toMatch(/\/src\/runtime\/thread-from-source\.mjs$/)
    expect(entry.argv).toEqual([new URL('../../../src/backends/embedded/chunk-worker.ts', import.meta.url).href])
    const spec = roomCodesSpec({ seed: 73 })
    const bytes = []
    for (const [name, workerEntry] of [['source', entry], ['bundle', undefined]] as const) {
      const queue = await openQueue(`${data.dir}/${name}`, { threads: 1, ...(workerEntry === undefined ? {} : { workerEntry }) })
      try {
        const sweep = await queue.submit({ spec, owner: null })
        expect((await waitForTerminal(queue, sweep.id)).status).toBe('succeeded')
        bytes.push(resultBytes(await fullResult(queue, sweep.id)))
      } finally {
        await queue.close()
      }
    }
    expect(bytes[0]!.trialCsv).toBe(bytes[1]!.trialCsv)
    expect(bytes[0]!.pointCsv).toBe(bytes[1]!.pointCsv)
  })
})
