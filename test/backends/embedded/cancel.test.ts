import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SweepQueue } from '../../../src/backends/port.js'
import { longChunkSpec, makeDataDir, openQueue, pollUntil, roomCodesSpec, waitForRecord, waitForTerminal } from './helpers.js'

describe('embedded queue: cancel', () => {
  const data = makeDataDir()
  let queue: SweepQueue

  beforeAll(async () => {
    queue = await openQueue(data.dir, { threads: 1 })
  })
  afterAll(async () => {
    await queue.close()
    data.remove()
  })

  it('stops a running chunk within a second and frees its thread for the next sweep', async () => {
    const long = await queue.submit({ spec: longChunkSpec(), owner: 'lab-a' })
    // Queued behind the long one on the single thread.
    const next = await queue.submit({ spec: roomCodesSpec(), owner: 'lab-a' })
    await waitForRecord(queue, long.id, record => record.status === 'running' && record.progress.trialsDone > 0)

    const started = performance.now()
    const canceled = await queue.cancel(long.id)
    expect(canceled?.status).toBe('canceled')
    expect(canceled?.finishedAt).not.toBeNull()
    // The only thread is free again once the chunk has stopped between two trials.
    await pollUntil(async () => (await queue.stats()).chunksActive === 0 || (await queue.get(next.id))?.status !== 'queued', 5000)
    const latencyMs = performance.now() - started
    expect(latencyMs).toBeLessThan(1000)

    expect((await waitForTerminal(queue, next.id)).status).toBe('succeeded')
    const after = await queue.get(long.id)
    expect(after?.status).toBe('canceled')
    expect(after?.progress.chunksDone).toBeLessThan(after!.progress.chunksTotal)
    expect(await queue.results(long.id)).toBeNull()
  })

  it('cancels a queued sweep before any of it runs', async () => {
    const blocker = await queue.submit({ spec: longChunkSpec({ seed: 100 }), owner: 'lab-b' })
    const waiting = await queue.submit({ spec: roomCodesSpec({ seed: 101 }), owner: 'lab-b' })
    expect((await queue.cancel(waiting.id))?.status).toBe('canceled')
    const record = await queue.get(waiting.id)
    expect(record?.startedAt).toBeNull()
    expect(record?.progress.trialsDone).toBe(0)
    await queue.cancel(blocker.id)
    expect((await waitForTerminal(queue, blocker.id)).status).toBe('canceled')
  })

  it('leaves a finished sweep untouched and answers null for an unknown id', async () => {
    const done = await queue.submit({ spec: roomCodesSpec({ seed: 5 }), owner: null })
    await waitForTerminal(queue, done.id)
    const again = await queue.cancel(done.id)
    expect(again?.status).toBe('succeeded')
    expect(await queue.results(done.id)).not.toBeNull()
    expect(await queue.cancel('no-such-sweep')).toBeNull()
  })

  it('sends one state event for the cancellation and no progress after it', async () => {
    const sweep = await queue.submit({ spec: longChunkSpec({ seed: 3 }), owner: null })
    await waitForRecord(queue, sweep.id, record => record.progress.trialsDone > 0)
    const types: string[] = []
    queue.subscribe(sweep.id, event => types.push(`${event.type}:${event.sweep.status}`))
    await queue.cancel(sweep.id)
    await pollUntil(async () => (await queue.stats()).chunksActive === 0, 5000)
    // A progress event still in the throttle when the cancel landed must not follow it.
    await new Promise(resolve => setTimeout(resolve, 300))
    expect(types).toEqual(['state:canceled'])
  })
})

describe('embedded queue: close while a chunk runs', () => {
  it('returns promptly, keeps the sweep active in storage, and resumes it on the next start', async () => {
    const data = makeDataDir()
    const first = await openQueue(data.dir, { threads: 1 })
    const sweep = await first.submit({ spec: longChunkSpec({ trials: 1200 }), owner: null })
    await waitForRecord(first, sweep.id, record => record.progress.trialsDone > 0)
    const started = performance.now()
    await first.close()
    expect(performance.now() - started).toBeLessThan(2000)

    const second = await openQueue(data.dir, { threads: 1 })
    try {
      // Kept active in storage and resumed at once: on a fast machine it may already have finished.
      const resumed = await second.get(sweep.id)
      expect(['running', 'succeeded']).toContain(resumed?.status)
      expect((await waitForTerminal(second, sweep.id)).status).toBe('succeeded')
    } finally {
      await second.close()
      data.remove()
    }
  })
})
