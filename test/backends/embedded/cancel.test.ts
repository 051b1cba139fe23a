/**
 * Canceling and closing while chunks run. A test gate in front of every chunk
 * (test/helpers/chunk-gate.ts) holds a sweep in progress, so no test depends on how fast
 * this machine computes.
 */
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import type { SweepQueue } from '../../../src/backends/port.js'
import { installChunkGate, type ChunkGate } from '../../helpers/chunk-gate.js'
import { corridorSweepSpec, makeDataDir, openQueue, pollUntil, roomCodesSpec, waitForRecord, waitForTerminal } from './helpers.js'

describe('embedded queue: cancel', () => {
  const data = makeDataDir()
  let queue: SweepQueue
  let gate: ChunkGate

  beforeAll(async () => {
    gate = installChunkGate()
    queue = await openQueue(data.dir, { threads: 1, tuning: { progressIntervalMs: 50 } })
  })
  afterEach(() => gate.open())
  afterAll(async () => {
    await queue.close()
    gate.remove()
    data.remove()
  })

  it('stops a chunk in progress and frees its thread for the next sweep', async () => {
    gate.hold()
    const long = await queue.submit({ spec: roomCodesSpec({ seed: 1 }), owner: 'lab-a' })
    // Queued behind the first one on the single thread.
    const next = await queue.submit({ spec: roomCodesSpec({ seed: 2 }), owner: 'lab-a' })
    await gate.untilWaiting()
    expect((await queue.get(long.id))?.status).toBe('running')

    const canceled = await queue.cancel(long.id)
    expect(canceled?.status).toBe('canceled')
    expect(canceled?.finishedAt).not.toBeNull()
    // The only thread is free once the held chunk has noticed the stop: the next sweep's chunk arrives at the gate.
    await waitForRecord(queue, next.id, (record) => record.status === 'running')
    await gate.untilWaiting()
    gate.open()

    expect((await waitForTerminal(queue, next.id)).status).toBe('succeeded')
    const after = await queue.get(long.id)
    expect(after?.status).toBe('canceled')
    expect(after?.progress).toMatchObject({ chunksDone: 0, trialsDone: 0 })
    expect(await queue.results(long.id)).toBeNull()
  })

  it('cancels a queued sweep before any of it runs', async () => {
    gate.hold()
    const blocker = await queue.submit({ spec: roomCodesSpec({ seed: 100 }), owner: 'lab-b' })
    await gate.untilWaiting()
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

  it('sends one state event for the cancellation and no progress after it; the progress shown stays', async () => {
    gate.hold()
    // Eight points, one chunk each: two run, the third waits at the gate.
    const sweep = await queue.submit({ spec: corridorSweepSpec({ neurons: 120, trials: 40 }), owner: null })
    gate.release(2)
    await waitForRecord(queue, sweep.id, (record) => record.progress.chunksDone === 2)
    await gate.untilWaiting()
    const types: string[] = []
    queue.subscribe(sweep.id, (event) => types.push(`${event.type}:${event.sweep.status}`))
    const shown = (await queue.get(sweep.id))!.progress.trialsDone
    await queue.cancel(sweep.id)
    await pollUntil(async () => (await queue.stats()).chunksActive === 0, 30_000)
    // A progress event still in the throttle when the cancel landed would fire within one interval (50 ms).
    await new Promise((resolve) => setTimeout(resolve, 200))
    expect(types).toEqual(['state:canceled'])
    expect((await queue.get(sweep.id))!.progress.trialsDone).toBe(shown)
  })
})

describe('embedded queue: close while a chunk runs', () => {
  let gate: ChunkGate
  beforeEach(() => { gate = installChunkGate() })
  afterEach(() => gate.remove())

  it('returns, keeps the sweep active in storage, and resumes it on the next start', async () => {
    const data = makeDataDir()
    gate.hold()
    const first = await openQueue(data.dir, { threads: 1 })
    const sweep = await first.submit({ spec: roomCodesSpec({ seed: 9 }), owner: null })
    await gate.untilWaiting()
    await first.close()
    gate.open()

    const second = await openQueue(data.dir, { threads: 1 })
    try {
      expect((await second.get(sweep.id))?.status).toBe('running')
      expect((await waitForTerminal(second, sweep.id)).status).toBe('succeeded')
    } finally {
      await second.close()
      data.remove()
    }
  })
})
