/** Contract: Server-Sent Events for a sweep. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, parseEventStream, type Harness, type QueueFactory } from '../helpers/harness.js'
import { assertComponent } from '../helpers/openapi.js'
import { expectProblem } from '../helpers/problems.js'
import { openEventStream } from '../helpers/sse-client.js'
import { heldSpec, quickSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'

const gate = sharedChunkGate()

export function eventsContract (factory: QueueFactory): void {
  describe('events (SSE)', () => {
    let h: Harness
    let base: string
    beforeAll(async () => {
      h = await createHarness(factory, { env: { SSE_HEARTBEAT_SECONDS: '1' } })
      base = await h.app.listen({ port: 0, host: '127.0.0.1' })
    })
    afterAll(async () => { await h.close() })

    it('sends the snapshot of a finished sweep, then its final state, and closes', async () => {
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(61) })).json().id
      await h.waitFor(id, isTerminal)
      const res = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/events` })
      expect(res.statusCode).toBe(200)
      expect(res.headers['content-type']).toMatch(/^text\/event-stream/)
      expect(res.headers['x-accel-buffering']).toBe('no')
      expect(res.headers['cache-control']).toContain('no-cache')
      expect(res.headers['x-request-id']).toBeDefined()
      const events = parseEventStream(res.body).filter((e) => e.event !== undefined)
      expect(events.map((e) => [e.id, e.event])).toEqual([['1', 'snapshot'], ['2', 'state']])
      const [snapshot, state] = events.map((e) => JSON.parse(e.data!))
      assertComponent('Sweep', snapshot)
      assertComponent('Sweep', state)
      expect(snapshot.status).toBe('succeeded')
      expect(state).toEqual(snapshot)
    })

    it('streams snapshot, progress and state events of a live sweep in order, then closes', async () => {
      gate.hold()
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(62) })).json().id
      const stream = await openEventStream(`${base}/v1/sweeps/${id}/events`)
      expect(stream.status).toBe(200)
      expect(stream.headers.get('x-accel-buffering')).toBe('no')
      await stream.until((item) => item.event === 'snapshot')
      // One chunk at a time: each stored chunk is a progress event the stream must carry.
      for (let chunks = 1; chunks < 4; chunks++) {
        gate.release()
        await stream.until((item) => item.event === 'progress' && JSON.parse(item.data!).progress.chunksDone >= chunks, 30_000)
      }
      gate.open()
      await stream.ended
      const events = stream.received.filter((e) => e.event !== undefined)
      expect(events[0]?.event).toBe('snapshot')
      expect(events.at(-1)?.event).toBe('state')
      const last = JSON.parse(events.at(-1)!.data!)
      expect(last.status).toBe('succeeded')
      expect(events.some((e) => e.event === 'progress')).toBe(true)
      const ids = events.map((e) => Number(e.id))
      expect(ids).toEqual(ids.map((_, i) => i + 1))
      let previous = -1
      for (const e of events) {
        const body = JSON.parse(e.data!)
        assertComponent('Sweep', body)
        expect(body.progress.trialsDone).toBeGreaterThanOrEqual(previous)
        previous = body.progress.trialsDone
      }
    })

    it('sends `: ping` heartbeats and a canceled state event, then closes', async () => {
      gate.hold()
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(63) })).json().id
      const stream = await openEventStream(`${base}/v1/sweeps/${id}/events`)
      await stream.until((item) => item.comment === 'ping', 5000)
      await h.request({ method: 'DELETE', url: `/v1/sweeps/${id}` })
      gate.open()
      await stream.ended
      const last = stream.received.filter((e) => e.event !== undefined).at(-1)!
      expect(last.event).toBe('state')
      expect(JSON.parse(last.data!).status).toBe('canceled')
    })

    it('answers 404 problem+json before streaming for an unknown sweep', async () => {
      const res = await h.request({ method: 'GET', url: '/v1/sweeps/no-such-sweep/events' })
      expectProblem(res, 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
    })

    it('ends open streams when the app closes, so close() never hangs', async () => {
      const other = await createHarness(factory)
      const url = await other.app.listen({ port: 0, host: '127.0.0.1' })
      gate.hold()
      const id = (await other.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(64) })).json().id
      const stream = await openEventStream(`${url}/v1/sweeps/${id}/events`)
      await stream.until((item) => item.event === 'snapshot')
      // The sweep is held unfinished: only closing the app can end the stream (a hang fails on the test timeout).
      await other.app.close()
      await stream.ended
      gate.open()
      await other.close()
    })
  })
}
