/** Contract: probes, metrics and the served OpenAPI document. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { openApiDocument } from '../helpers/openapi.js'
import { heldSpec, quickSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'

const gate = sharedChunkGate()

export function operationsContract (factory: QueueFactory): void {
  describe('operations', () => {
    let h: Harness
    beforeAll(async () => { h = await createHarness(factory) })
    afterAll(async () => { await h.close() })

    it('/healthz and /readyz answer', async () => {
      expect((await h.request({ method: 'GET', url: '/healthz' })).json()).toEqual({ status: 'ok' })
      expect((await h.request({ method: 'GET', url: '/readyz' })).json()).toEqual({ status: 'ready', backend: h.queue.kind })
    })

    it('/metrics exposes sweeps by status, chunk counts and the request histogram in Prometheus text format', async () => {
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(91) })).json().id
      await h.waitFor(id, isTerminal)
      await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })
      const res = await h.request({ method: 'GET', url: '/metrics' })
      expect(res.statusCode).toBe(200)
      expect(res.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/)
      const text = res.body
      expect(text.endsWith('\n')).toBe(true)
      expect(text).toContain('# TYPE memsweep_sweeps gauge')
      const succeeded = /^memsweep_sweeps\{status="succeeded"\} (\d+)$/m.exec(text)
      expect(Number(succeeded?.[1])).toBeGreaterThanOrEqual(1)
      expect(text).toMatch(/^memsweep_chunks_waiting \d+$/m)
      expect(text).toMatch(/^memsweep_chunks_active \d+$/m)
      expect(text).toContain('# TYPE memsweep_http_request_duration_seconds histogram')
      // Route templates, never concrete ids, label the histogram.
      expect(text).toContain('route="/v1/sweeps/:id"')
      expect(text).not.toContain(id)
      expect(text).toMatch(/memsweep_http_request_duration_seconds_bucket\{le="\+Inf",method="POST",route="\/v1\/sweeps",status_code="202"\} \d+/)
    })

    it('/metrics shows running sweeps and active chunks while a sweep runs', async () => {
      gate.hold()
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(41) })).json().id
      await gate.untilWaiting()
      await h.waitFor(id, (r) => r.status === 'running')
      // Counters may trail the record by a moment (the Redis backend updates them in its own script): scrape until they agree.
      await expect.poll(async () => {
        const text = (await h.request({ method: 'GET', url: '/metrics' })).body
        return [Number(/^memsweep_sweeps\{status="running"\} (\d+)$/m.exec(text)?.[1]), Number(/^memsweep_chunks_active (\d+)$/m.exec(text)?.[1]) >= 1]
      }, { timeout: 10_000, interval: 100 }).toEqual([1, true])
      await h.request({ method: 'DELETE', url: `/v1/sweeps/${id as string}` })
      gate.open()
      await h.waitFor(id, isTerminal)
    })

    it('/openapi.json serves the committed document', async () => {
      const res = await h.request({ method: 'GET', url: '/openapi.json' })
      expect(res.json()).toEqual(openApiDocument)
    })

    it('echoes a plain X-Request-Id and replaces one that is not', async () => {
      const kept = await h.request({ method: 'GET', url: '/healthz', headers: { 'x-request-id': 'pipeline-42.step-3' } })
      expect(kept.headers['x-request-id']).toBe('pipeline-42.step-3')
      const replaced = await h.request({ method: 'GET', url: '/healthz', headers: { 'x-request-id': 'bad id\twith spaces' } })
      expect(replaced.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/)
    })
  })
}
