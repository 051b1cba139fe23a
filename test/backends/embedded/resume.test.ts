import { spawn } from 'node:child_process'
import { createRequire } from 'node:module'
import { createInterface } from 'node:readline'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { SqliteSweepStore } from '../../../src/backends/embedded/store.js'
import { replicateKey, specHash } from '../../../src/spec/index.js'
import { planSweep, runChunk, type Chunk, type SweepPlan } from '../../../src/sweep/index.js'
import { installChunkGate, type ChunkGate } from '../../helpers/chunk-gate.js'
import { corridorSweepSpec, fullResult, makeDataDir, openQueue, resultBytes, waitForRecord, waitForTerminal } from './helpers.js'

/** Eight loads of a corridor map, one short chunk each. */
const spec = corridorSweepSpec({ neurons: 120, trials: 40 })

/** The reference: the same sweep run without interruption, on one thread instead of two. */
async function uninterruptedRun (): Promise<ReturnType<typeof resultBytes>> {
  const data = makeDataDir()
  const queue = await openQueue(data.dir, { threads: 1 })
  try {
    const sweep = await queue.submit({ spec, owner: null })
    expect((await waitForTerminal(queue, sweep.id)).status).toBe('succeeded')
    return resultBytes(await fullResult(queue, sweep.id))
  } finally {
    await queue.close()
    data.remove()
  }
}

/** Runs the queue in a child process (the gate held) and SIGKILLs it once `chunks` chunks are stored and another waits. */
async function runAndKill (dataDir: string, gate: ChunkGate, chunks: number): Promise<{ id: string, chunksDone: number }> {
  const tsx = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href
  const entry = fileURLToPath(new URL('./fixtures/queue-child.ts', import.meta.url))
  const child = spawn(process.execPath, ['--import', tsx, entry, dataDir, JSON.stringify(spec)], { stdio: ['ignore', 'pipe', 'inherit'], env: { ...process.env, ...gate.env } })
  const exited = new Promise<NodeJS.Signals | null>((resolve) => child.once('exit', (_code, signal) => resolve(signal)))
  gate.release(chunks)
  let seen: { id: string, status: string, chunksDone: number } | undefined
  for await (const line of createInterface({ input: child.stdout })) {
    seen = JSON.parse(line) as { id: string, status: string, chunksDone: number }
    if (seen.status !== 'queued' && seen.status !== 'running') throw new Error(`the child finished (${seen.status}) before it could be killed`)
    if (seen.chunksDone >= chunks) {
      await gate.untilWaiting()
      child.kill('SIGKILL')
      break
    }
  }
  expect(await exited).toBe('SIGKILL')
  if (seen === undefined) throw new Error('the child printed nothing')
  return seen
}

/** A plan other than the one this release makes: each point cut into pieces of the given sizes. */
function planCutInto (sizes: readonly number[]): SweepPlan {
  const chunks: Chunk[] = []
  const points = planSweep(spec).chunks.reduce((most, chunk) => Math.max(most, chunk.point + 1), 0)
  for (let point = 0; point < points; point++) {
    let first = 0
    for (const size of sizes) {
      chunks.push({ index: chunks.length, point, firstTrial: first, count: size })
      first += size
    }
  }
  return { version: 1, chunks }
}

describe('embedded queue: resume after an interruption', () => {
  let reference: ReturnType<typeof resultBytes>
  let gate: ChunkGate

  beforeAll(async () => {
    reference = await uninterruptedRun()
  })
  beforeEach(() => { gate = installChunkGate() })
  afterEach(() => gate.remove())

  const cleanups: Array<() => void> = []
  afterAll(() => cleanups.forEach((cleanup) => cleanup()))

  it('after close and reopen mid-sweep, keeps the stored chunks and gives byte-identical results', async () => {
    const data = makeDataDir()
    cleanups.push(data.remove)
    gate.hold()
    const first = await openQueue(data.dir)
    const sweep = await first.submit({ spec, owner: null })
    gate.release(2)
    const partial = await waitForRecord(first, sweep.id, (record) => record.progress.chunksDone >= 2)
    await gate.untilWaiting()
    expect(partial.status).toBe('running')
    await first.close()

    gate.open()
    const second = await openQueue(data.dir)
    try {
      const reopened = await second.get(sweep.id)
      expect(reopened?.status).toBe('running')
      expect(reopened?.progress.chunksDone).toBe(2)
      expect((await waitForTerminal(second, sweep.id)).status).toBe('succeeded')
      const bytes = resultBytes(await fullResult(second, sweep.id))
      expect(bytes.json).toBe(reference.json)
      expect(bytes.pointCsv).toBe(reference.pointCsv)
      expect(bytes.trialCsv).toBe(reference.trialCsv)
    } finally {
      await second.close()
    }
  })

  it('after SIGKILL of the process mid-sweep, completes on restart with byte-identical results', async () => {
    const data = makeDataDir()
    cleanups.push(data.remove)
    gate.hold()
    const killed = await runAndKill(data.dir, gate, 2)

    gate.open()
    const restarted = await openQueue(data.dir)
    try {
      const reopened = await restarted.get(killed.id)
      expect(reopened?.status).toBe('running')
      expect(reopened?.progress.chunksDone).toBeGreaterThanOrEqual(killed.chunksDone)
      const done = await waitForTerminal(restarted, killed.id)
      expect(done.status).toBe('succeeded')
      // The chunks stored before the kill were not computed again: every chunk passed the gate to run once.
      const ran = gate.ranForSeed(spec.seed)
      expect(new Set(ran.labels).size).toBe(ran.chunks)
      expect(ran.chunks).toBe(done.progress.chunksTotal)
      const bytes = resultBytes(await fullResult(restarted, killed.id))
      expect(bytes.json).toBe(reference.json)
      expect(bytes.pointCsv).toBe(reference.pointCsv)
      expect(bytes.trialCsv).toBe(reference.trialCsv)
    } finally {
      await restarted.close()
    }
  })

  // Before plans were stored, a sweep interrupted under one release and resumed under another
  // whose planning constants differed ran the new plan's chunks beside the old ones and never
  // finished (a count compared instead of the set of chunk indices).
  it.each([
    ['finer chunks', [7, 7, 7, 7, 7, 5]],
    ['coarser, uneven chunks', [13, 27]],
    ['halves', [20, 20]]
  ])('resumes with the plan stored at submission, whatever this release would plan now (%s)', async (_name, sizes) => {
    const data = makeDataDir()
    cleanups.push(data.remove)
    const plan = planCutInto(sizes)
    expect(plan.chunks).not.toEqual(planSweep(spec).chunks)
    const store = new SqliteSweepStore(data.dir)
    await store.create({ id: 'stored-earlier', owner: null, label: spec.label, specHash: specHash(spec), spec, createdMs: Date.now(), plan, replicateKey: replicateKey(spec), reuseKeys: [] })
    // Stopped after a third of its chunks, as a restart would find it.
    for (const chunk of plan.chunks.slice(0, Math.ceil(plan.chunks.length / 3))) {
      const outcome = runChunk(spec, chunk, { shouldStop: () => false })
      if (outcome.kind !== 'done') throw new Error(`chunk ${chunk.index} did not run`)
      await store.recordChunk('stored-earlier', chunk, outcome.body, outcome.computeMs, Date.now())
    }
    store.close()

    const queue = await openQueue(data.dir)
    try {
      const final = await waitForTerminal(queue, 'stored-earlier')
      expect(final.status).toBe('succeeded')
      expect(final.progress).toMatchObject({ chunksDone: plan.chunks.length, chunksTotal: plan.chunks.length, trialsDone: final.progress.trialsTotal })
      const bytes = resultBytes(await fullResult(queue, 'stored-earlier'))
      expect(bytes.pointCsv).toBe(reference.pointCsv)
      expect(bytes.trialCsv).toBe(reference.trialCsv)
    } finally {
      await queue.close()
    }
  })
})
