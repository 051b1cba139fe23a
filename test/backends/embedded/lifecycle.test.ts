import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SweepEvent, SweepQueue } from '../../../src/backends/port.js'
import { assembleResult, makeProvenance, planSweep, computeChunk } from '../../../src/sweep/index.js'
import { corridorSweepSpec, makeDataDir, openQueue, fullResult, resultBytes, roomCodesSpec, waitForTerminal } from './helpers.js'
import { runtimeFacts } from '../../../src/runtime/facts.js'

describe('embedded queue: a sweep from submission to results', () => {
  const data = makeDataDir()
  let queue: SweepQueue

  beforeAll(async () => {
    // A shorter throttle than the default 250 ms, so that even a fast machine sees several windows.
    queue = await openQueue(data.dir, { tuning: { progressIntervalMs: 100 } })
  })
  afterAll(async () => {
    await queue.close()
    data.remove()
  })

  it('accepts a sweep as queued, runs it to succeeded, and serves the assembled result', async () => {
    const spec = roomCodesSpec()
    const submitted = await queue.submit({ spec, owner: null })
    expect(submitted.status === 'queued' || submitted.status === 'running').toBe(true)
    expect(submitted.label).toBe('room codes')
    expect(submitted.progress).toMatchObject({ pointsTotal: 3, trialsTotal: 120, chunksTotal: planSweep(spec).chunks.length, chunksDone: 0 })
    expect(await queue.results(submitted.id)).toBeNull()

    const finished = await waitForTerminal(queue, submitted.id)
    expect(finished.status).toBe('succeeded')
    expect(finished.error).toBeNull()
    expect(finished.progress).toMatchObject({ pointsDone: 3, trialsDone: 120, chunksDone: finished.progress.chunksTotal })
    expect(Date.parse(finished.finishedAt ?? '')).toBeGreaterThanOrEqual(Date.parse(finished.startedAt ?? ''))

    const result = await fullResult(queue, submitted.id)
    expect(result).not.toBeNull()
    expect(result?.specHash).toBe(submitted.specHash)
    expect(result?.rows.map(row => row.params.patterns)).toEqual([6, 12, 18])
    expect(result?.trials.map(trials => trials.length)).toEqual([40, 40, 40])
    expect(result?.provenance.workers).toBe(2)

    // The same chunks computed right here, in this thread and in index order, give the same bytes.
    const local = assembleResult(spec, planSweep(spec).chunks.map(chunk => computeChunk(spec, chunk)), makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
    expect(resultBytes(result!)).toEqual(resultBytes(local))
  })

  it('reports progress as it goes, at most one event per throttle interval, then one final state event', async () => {
    // About a second of work on two threads.
    const spec = corridorSweepSpec()
    const events: Array<{ at: number, event: SweepEvent }> = []
    const submitted = await queue.submit({ spec, owner: 'lab-a' })
    queue.subscribe(submitted.id, event => events.push({ at: performance.now(), event }))
    const finished = await waitForTerminal(queue, submitted.id)
    expect(finished.status).toBe('succeeded')

    const progress = events.filter(entry => entry.event.type === 'progress')
    expect(progress.length).toBeGreaterThanOrEqual(2)
    for (let i = 1; i < progress.length; i++) {
      // 100 ms apart, minus timer slack.
      expect(progress[i]!.at - progress[i - 1]!.at).toBeGreaterThan(80)
    }
    const trialCounts = events.map(entry => entry.event.sweep.progress.trialsDone)
    expect(trialCounts).toEqual([...trialCounts].sort((a, b) => a - b))
    const last = events.at(-1)!.event
    expect(last.type).toBe('state')
    expect(last.sweep.status).toBe('succeeded')
    expect(last.sweep.progress.trialsDone).toBe(8 * 600)
  })

  it('counts sweeps by status and reports idle threads in stats()', async () => {
    const stats = await queue.stats()
    expect(stats).toMatchObject({ queued: 0, running: 0, succeeded: 2, failed: 0, canceled: 0, chunksWaiting: 0, chunksActive: 0 })
    expect(await queue.ready()).toEqual({ ok: true })
  })

  it('refuses a second process on the same data directory with a clear message', async () => {
    await expect(openQueue(data.dir)).rejects.toThrow(/in use by another memsweep process/)
  })

  it('answers not ready once closed, and close() may be called twice', async () => {
    const other = makeDataDir()
    const closing = await openQueue(other.dir, { threads: 1 })
    await closing.close()
    await closing.close()
    expect((await closing.ready()).ok).toBe(false)
    await expect(closing.get('anything')).rejects.toThrow(/closed/)
    other.remove()
  })
})
