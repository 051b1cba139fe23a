import { spawn } from 'node:child_process'
import { createRequire } from 'node:module'
import { createInterface } from 'node:readline'
import { fileURLToPath, pathToFileURL } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { corridorSweepSpec, makeDataDir, openQueue, resultBytes, waitForRecord, waitForTerminal } from './helpers.js'

const spec = corridorSweepSpec()

/** The reference: the same sweep run without interruption, on one thread instead of two. */
async function uninterruptedRun (): Promise<ReturnType<typeof resultBytes>> {
  const data = makeDataDir()
  const queue = await openQueue(data.dir, { threads: 1 })
  try {
    const sweep = await queue.submit({ spec, owner: null })
    expect((await waitForTerminal(queue, sweep.id)).status).toBe('succeeded')
    return resultBytes((await queue.results(sweep.id))!)
  } finally {
    await queue.close()
    data.remove()
  }
}

/** Runs the queue in a child process and SIGKILLs it once `chunks` chunks are stored. */
async function runAndKill (dataDir: string, chunks: number): Promise<{ id: string, chunksDone: number }> {
  const tsx = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href
  const entry = fileURLToPath(new URL('./fixtures/queue-child.ts', import.meta.url))
  const child = spawn(process.execPath, ['--import', tsx, entry, dataDir, JSON.stringify(spec)], { stdio: ['ignore', 'pipe', 'inherit'] })
  const exited = new Promise<NodeJS.Signals | null>(resolve => child.once('exit', (_code, signal) => resolve(signal)))
  let seen: { id: string, status: string, chunksDone: number } | undefined
  for await (const line of createInterface({ input: child.stdout })) {
    seen = JSON.parse(line) as { id: string, status: string, chunksDone: number }
    if (seen.status !== 'queued' && seen.status !== 'running') throw new Error(`the child finished (${seen.status}) before it could be killed`)
    if (seen.chunksDone >= chunks) {
      child.kill('SIGKILL')
      break
    }
  }
  expect(await exited).toBe('SIGKILL')
  if (seen === undefined) throw new Error('the child printed nothing')
  return seen
}

describe('embedded queue: resume after an interruption', () => {
  let reference: ReturnType<typeof resultBytes>

  beforeAll(async () => {
    reference = await uninterruptedRun()
  })

  const cleanups: Array<() => void> = []
  afterAll(() => cleanups.forEach(cleanup => cleanup()))

  it('after close and reopen mid-sweep, keeps the stored chunks and gives byte-identical results', async () => {
    const data = makeDataDir()
    cleanups.push(data.remove)
    const first = await openQueue(data.dir)
    const sweep = await first.submit({ spec, owner: null })
    const partial = await waitForRecord(first, sweep.id, record => record.progress.chunksDone >= 2)
    expect(partial.status).toBe('running')
    await first.close()

    const second = await openQueue(data.dir)
    try {
      const reopened = await second.get(sweep.id)
      expect(reopened?.status).toBe('running')
      expect(reopened?.progress.chunksDone).toBeGreaterThanOrEqual(2)
      expect(reopened?.progress.chunksDone).toBeLessThan(reopened!.progress.chunksTotal)
      expect((await waitForTerminal(second, sweep.id)).status).toBe('succeeded')
      const bytes = resultBytes((await second.results(sweep.id))!)
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
    const killed = await runAndKill(data.dir, 2)

    const restarted = await openQueue(data.dir)
    try {
      const reopened = await restarted.get(killed.id)
      expect(reopened?.status).toBe('running')
      expect(reopened?.progress.chunksDone).toBeGreaterThanOrEqual(killed.chunksDone)
      expect((await waitForTerminal(restarted, killed.id)).status).toBe('succeeded')
      const bytes = resultBytes((await restarted.results(killed.id))!)
      expect(bytes.json).toBe(reference.json)
      expect(bytes.pointCsv).toBe(reference.pointCsv)
      expect(bytes.trialCsv).toBe(reference.trialCsv)
    } finally {
      await restarted.close()
    }
  })
})
