/**
 * Restart at the HTTP level: the server process is killed (SIGKILL) mid-sweep and started
 * again on the same data directory; the sweep completes, and its results equal, byte for
 * byte, those of an uninterrupted run of the same spec.
 */
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { installChunkGate } from '../helpers/chunk-gate.js'
import { openEventStream } from './helpers/sse-client.js'
import { startServerProcess, type ServerProcess } from './helpers/server-process.js'
import { withoutSweepId } from '../helpers/tables.js'

/** Six loads, one quick chunk each; the test gate holds chunks so the kill lands with the sweep half done. */
const spec = {
  label: 'rooms of a house, before and after a power cut',
  neurons: 200,
  load: { values: [0.04, 0.06, 0.08, 0.1, 0.12, 0.14] },
  trials: 60,
  seed: 21
}

const gate = installChunkGate()

const running: ServerProcess[] = []
let dataDir = ''

afterAll(async () => {
  gate.remove()
  for (const server of running) if (server.child.exitCode === null) server.child.kill('SIGKILL')
  if (dataDir !== '') await rm(dataDir, { recursive: true, force: true })
})

async function start (): Promise<ServerProcess> {
  const server = await startServerProcess({ DATA_DIR: dataDir, WORKER_THREADS: '2', ...gate.env })
  running.push(server)
  return server
}

async function submit (url: string): Promise<{ id: string }> {
  const res = await fetch(`${url}/v1/sweeps`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(spec) })
  expect(res.status).toBe(202)
  return await res.json() as { id: string }
}

/** Follows the sweep's events until the server closes the stream on a terminal state. */
async function finalState (url: string, id: string): Promise<Record<string, any>> {
  const stream = await openEventStream(`${url}/v1/sweeps/${id}/events`)
  await stream.ended
  const last = stream.received.filter((e) => e.data !== undefined).at(-1)
  return JSON.parse(last!.data!)
}

async function download (url: string, id: string, query: string): Promise<string> {
  const res = await fetch(`${url}/v1/sweeps/${id}/results?${query}`)
  expect(res.status).toBe(200)
  return await res.text()
}

describe('server restart', () => {
  it('finishes a sweep interrupted by SIGKILL with results identical to an uninterrupted run', async () => {
    dataDir = await mkdtemp(join(tmpdir(), 'memsweep-restart-'))
    gate.hold()
    const first = await start()
    const { id } = await submit(first.url)

    // Kill once two chunks are stored and others are held in progress.
    const stream = await openEventStream(`${first.url}/v1/sweeps/${id}/events`)
    gate.release(2)
    await stream.until((item) => item.data !== undefined && JSON.parse(item.data).progress.chunksDone >= 2, 30_000)
    await gate.untilWaiting()
    first.child.kill('SIGKILL')
    expect(await first.exited).toBe('SIGKILL')
    const beforeKill = JSON.parse(stream.received.filter((e) => e.data !== undefined).at(-1)!.data!)
    expect(beforeKill.status).toBe('running')

    gate.open()
    const second = await start()
    const resumed = await finalState(second.url, id)
    expect(resumed.status).toBe('succeeded')
    expect(resumed.progress).toMatchObject({ chunksDone: resumed.progress.chunksTotal, trialsDone: 6 * 60, trialsTotal: 6 * 60 })

    const fresh = (await (await fetch(`${second.url}/v1/sweeps`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(spec) })).json()) as { id: string }
    expect((await finalState(second.url, fresh.id)).status).toBe('succeeded')

    // Every representation is byte-identical: results carry no run timing unless asked for.
    for (const query of ['format=csv', 'format=csv&trials=true', 'format=json', 'format=json&trials=true']) {
      const interrupted = await download(second.url, id, query)
      const uninterrupted = await download(second.url, fresh.id, query)
      expect(interrupted.length).toBeGreaterThan(0)
      expect(query.includes('csv') ? withoutSweepId(interrupted) : interrupted).toBe(query.includes('csv') ? withoutSweepId(uninterrupted) : uninterrupted)
    }
    const timed = JSON.parse(await download(second.url, id, 'timing=true'))
    expect(timed.provenance.cpuSeconds).toBeGreaterThan(0)

    // A graceful stop: SIGTERM ends the process with status 0.
    second.child.kill('SIGTERM')
    expect(await second.exited).toBe(0)
    expect(second.logLines.some((line) => line.msg === 'shutting down')).toBe(true)
  })
})
