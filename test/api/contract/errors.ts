/** Contract: every error status is an RFC 9457 problem document naming what went wrong. */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import type { SweepQueue } from '../../../src/backends/port.js'
import { SweepSpecSchema } from '../../../src/spec/index.js'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { heldSpec, quickSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'
import { withOverrides } from '../../helpers/queue-overrides.js'

const gate = sharedChunkGate()

/** The real backend, except that reading sweep 'kaboom' fails the way a broken disk would. */
function withFailingRead (queue: SweepQueue): SweepQueue {
  return withOverrides(queue, {
    get: async (id) => {
      if (id === 'kaboom') throw new Error('SQLITE_IOERR: disk I/O error at /srv/secret/memsweep.db')
      return await queue.get(id)
    }
  })
}

export function errorsContract (factory: QueueFactory): void {
  describe('error answers', () => {
    let h: Harness
    beforeAll(async () => {
      h = await createHarness(async (scope) => withFailingRead(await factory(scope)), {
        env: { MAX_NEURONS: '200', BODY_LIMIT: '4096', MAX_ACTIVE_SWEEPS_PER_OWNER: '1' }
      })
    })
    afterAll(async () => { await h.close() })

    it('400 for a body that is not JSON, a bad query parameter, a cursor we never issued', async () => {
      const notJson = await h.request({ method: 'POST', url: '/v1/sweeps', payload: '{"neurons": 1', headers: { 'content-type': 'application/json' } })
      expect(expectProblem(notJson, 400, 'MEMSWEEP_MALFORMED_REQUEST').detail).toMatch(/JSON/)
      const badLimit = await h.request({ method: 'GET', url: '/v1/sweeps?limit=0' })
      expect(expectProblem(badLimit, 400, 'MEMSWEEP_MALFORMED_REQUEST').errors[0]).toMatchObject({ path: 'querystring.limit', pointer: '/limit' })
      const badCursor = await h.request({ method: 'GET', url: '/v1/sweeps?cursor=bm90LWEtY3Vyc29y' })
      expect(expectProblem(badCursor, 400, 'MEMSWEEP_MALFORMED_REQUEST').errors[0]).toMatchObject({ path: 'querystring.cursor', pointer: '/cursor' })
      const badStatus = await h.request({ method: 'GET', url: '/v1/sweeps?status=done' })
      expectProblem(badStatus, 400, 'MEMSWEEP_MALFORMED_REQUEST')
      const badId = await h.request({ method: 'GET', url: '/v1/sweeps/not%20an%20id' })
      expectProblem(badId, 400, 'MEMSWEEP_MALFORMED_REQUEST')
    })

    it('400 problem naming params.id for any id that is not 1-64 letters, digits, - and _, however long; 404 for a well-formed unknown one', async () => {
      const routes = (id: string) => [
        ['GET', `/v1/sweeps/${id}`], ['DELETE', `/v1/sweeps/${id}`], ['GET', `/v1/sweeps/${id}/results`],
        ['GET', `/v1/sweeps/${id}/events`], ['GET', `/v1/sweeps/${id}/figure.svg`]
      ] as const
      for (const length of [65, 100, 101, 128, 129, 200, 5000]) {
        for (const [method, url] of routes('r'.repeat(length))) {
          const problem = expectProblem(await h.request({ method, url }), 400, 'MEMSWEEP_MALFORMED_REQUEST')
          expect(problem.errors, `${method} ${length}`).toEqual([{ path: 'params.id', pointer: '/id', message: expect.stringContaining('1-64') }])
          expect(problem.errorsOmitted).toBe(0)
        }
      }
      for (const [method, url] of routes('r'.repeat(64))) expectProblem(await h.request({ method, url }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
      const overlay = await h.request({ method: 'GET', url: `/v1/figures/overlay.svg?sweeps=${'r'.repeat(65)}` })
      expect(expectProblem(overlay, 400, 'MEMSWEEP_MALFORMED_REQUEST').errors[0].path).toBe('querystring.sweeps')
    })

    it('400 problem with a request id for a path that is not valid percent-encoding', async () => {
      for (const url of ['/v1/sweeps/%E0%A4%A', '/v1/sw%zzeeps', '/v1/sweeps/ab%C0/results']) {
        const res = await h.request({ method: 'GET', url, headers: { 'x-request-id': 'lab-pipeline-7' } })
        const problem = expectProblem(res, 400, 'MEMSWEEP_MALFORMED_REQUEST')
        expect(problem.requestId).toBe('lab-pipeline-7')
        expect(problem.detail).toContain('percent-encoded')
      }
    })

    it('404 for an unknown sweep and for an unknown route', async () => {
      const sweep = await h.request({ method: 'GET', url: '/v1/sweeps/0b7e1a52-0000-4000-8000-000000000000' })
      expect(expectProblem(sweep, 404, 'MEMSWEEP_SWEEP_NOT_FOUND').instance).toBe('/v1/sweeps/0b7e1a52-0000-4000-8000-000000000000')
      const route = await h.request({ method: 'GET', url: '/v2/anything?x=1' })
      expect(expectProblem(route, 404, 'MEMSWEEP_ROUTE_NOT_FOUND').instance).toBe('/v2/anything')
      const method = await h.request({ method: 'PUT', url: '/v1/sweeps' })
      expectProblem(method, 404, 'MEMSWEEP_ROUTE_NOT_FOUND')
    })

    it('413 for a body over BODY_LIMIT, 415 for a body that is not JSON', async () => {
      const big = { ...quickSpec(), label: 'x'.repeat(150), family: { kind: 'supplied', data: [Array.from({ length: 3000 }, () => 1)] } }
      const tooLarge = await h.request({ method: 'POST', url: '/v1/sweeps', payload: big })
      expect(expectProblem(tooLarge, 413, 'MEMSWEEP_BODY_TOO_LARGE').detail).toContain('4096')
      const text = await h.request({ method: 'POST', url: '/v1/sweeps', payload: 'neurons=64', headers: { 'content-type': 'text/plain' } })
      expect(expectProblem(text, 415, 'MEMSWEEP_UNSUPPORTED_MEDIA_TYPE').detail).toContain('text/plain')
    })

    it('422 listing every offending field of an invalid spec', async () => {
      const res = await h.request({
        method: 'POST',
        url: '/v1/sweeps',
        payload: { neurons: 64, load: { from: 0.1, to: 0.05 }, dynamics: { temperature: -1 }, colour: 'blue' }
      })
      const problem = expectProblem(res, 422, 'MEMSWEEP_SPEC_INVALID')
      const paths = problem.errors.map((e: { path: string }) => e.path)
      expect(paths).toEqual(expect.arrayContaining(['load', 'dynamics.temperature', 'colour']))
      for (const issue of problem.errors) {
        expect(issue.pointer).toBe(issue.path === '' ? '' : '/' + issue.path.replaceAll('.', '/'))
        expect(issue.message.length).toBeGreaterThan(0)
      }
      const notAnObject = await h.request({ method: 'POST', url: '/v1/sweeps', payload: [1, 2, 3] })
      expectProblem(notAnObject, 422, 'MEMSWEEP_SPEC_INVALID')
    })

    it('422 listing at most 100 issues, with the number of the rest, however many a spec has', async () => {
      const spec: Record<string, unknown> = { neurons: 64, patterns: 2 }
      for (let i = 0; i < 150; i++) spec[`room${i}`] = i
      const res = await h.request({ method: 'POST', url: '/v1/sweeps/validate', payload: spec })
      const problem = expectProblem(res, 422, 'MEMSWEEP_SPEC_INVALID')
      expect(problem.errors).toHaveLength(100)
      expect(problem.errorsOmitted).toBe(50)
      expect(problem.detail).toContain('150 problem(s)')
      const few = expectProblem(await h.request({ method: 'POST', url: '/v1/sweeps', payload: { neurons: 64, patterns: 2, colour: 'blue' } }), 422, 'MEMSWEEP_SPEC_INVALID')
      expect(few).toMatchObject({ errors: [{ path: 'colour' }], errorsOmitted: 0 })
      const longKey = 'k'.repeat(3000)
      const cut = expectProblem(await h.request({ method: 'POST', url: '/v1/sweeps/validate', payload: { neurons: 64, patterns: 2, [longKey]: 1 } }), 422, 'MEMSWEEP_SPEC_INVALID')
      expect(cut.errors[0].path).toHaveLength(256)
      expect(cut.errors[0].path.endsWith('…')).toBe(true)
      expect(Buffer.byteLength(JSON.stringify(cut))).toBeLessThan(2000)
    })

    it('422 naming the work limit a spec exceeds, before anything runs; validate reports the same limit', async () => {
      const before = await h.queue.stats()
      const res = await h.request({ method: 'POST', url: '/v1/sweeps', payload: { neurons: { values: [100, 400] }, patterns: 5, trials: 2 } })
      const problem = expectProblem(res, 422, 'MEMSWEEP_WORK_LIMIT_EXCEEDED')
      expect(problem.limit).toEqual({ name: 'maxNeurons', value: 400, max: 200 })
      expect(problem.detail).toContain('maxNeurons')
      const after = await h.queue.stats()
      expect(after.queued + after.running + after.succeeded).toBe(before.queued + before.running + before.succeeded)
      const validate = (await h.request({ method: 'POST', url: '/v1/sweeps/validate', payload: { neurons: 400, patterns: 5, trials: 2 } })).json()
      expect(validate.exceeded).toEqual({ name: 'maxNeurons', value: 400, max: 200 })
    })

    it('429 when an owner already has the maximum of active sweeps', async () => {
      gate.hold()
      const first = await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(91) })
      expect(first.statusCode).toBe(202)
      const second = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec() })
      const problem = expectProblem(second, 429, 'MEMSWEEP_TOO_MANY_ACTIVE_SWEEPS')
      expect(second.headers['retry-after']).toBeDefined()
      expect(problem.detail).toContain('limit 1')
      await h.request({ method: 'DELETE', url: `/v1/sweeps/${first.json().id as string}` })
      gate.open()
      await h.waitFor(first.json().id, isTerminal)
      const third = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec() })
      expect(third.statusCode).toBe(202)
      await h.waitFor(third.json().id, isTerminal)
    })

    it('500 without internals when the backend fails', async () => {
      const res = await h.request({ method: 'GET', url: '/v1/sweeps/kaboom' })
      const problem = expectProblem(res, 500, 'MEMSWEEP_INTERNAL')
      expect(res.body).not.toMatch(/SQLITE|secret|disk/)
      expect(problem.detail).toContain(problem.requestId)
    })

    it('503 from /readyz once the backend is closed; /healthz stays 200', async () => {
      const ready = await h.request({ method: 'GET', url: '/readyz' })
      expect(ready.statusCode).toBe(200)
      expect(ready.json()).toEqual({ status: 'ready', backend: h.queue.kind })
      await h.queue.close()
      const notReady = await h.request({ method: 'GET', url: '/readyz' })
      expectProblem(notReady, 503, 'MEMSWEEP_NOT_READY')
      const live = await h.request({ method: 'GET', url: '/healthz' })
      expect(live.statusCode).toBe(200)
    })
  })

  describe('a huge bad spec', () => {
    let h: Harness
    // The default BODY_LIMIT (256 KiB), which a spec of 87 000 bad entries fits.
    beforeAll(async () => { h = await createHarness(factory) })
    afterAll(async () => { await h.close() })

    it('gets a small 422 with the count of the issues not listed, and zod never judges its entries one by one', async () => {
      const payload = `{"family":{"kind":"supplied","data":[[${Array.from({ length: 87_000 }, () => '{}').join(',')}]]},"trials":"many"}`
      expect(payload.length).toBeGreaterThan(260_000)
      // The issues the validator builds are what the work grows with; observed on the real schema.
      const built = vi.spyOn(SweepSpecSchema, 'safeParse')
      let res
      try {
        res = await h.request({ method: 'POST', url: '/v1/sweeps', payload, headers: { 'content-type': 'application/json' } })
        const issuesBuilt = built.mock.results.reduce((sum, r) => sum + (r.value.success === true ? 0 : r.value.error.issues.length), 0)
        expect(issuesBuilt).toBe(1)
      } finally {
        built.mockRestore()
      }
      const problem = expectProblem(res, 422, 'MEMSWEEP_SPEC_INVALID')
      expect(Buffer.byteLength(res.body)).toBeLessThan(16 * 1024)
      expect(problem.errors).toHaveLength(100)
      expect(problem.errors[0]).toMatchObject({ path: 'trials' })
      expect(problem.errors[1]).toEqual({ path: 'family.data[0][0]', pointer: '/family/data/0/0', message: 'expected a number, received object' })
      // 87 000 bad entries and the bad trials: 100 listed, 86 901 counted.
      expect(problem.errorsOmitted).toBe(86_901)
      expect(problem.detail).toContain('87001 problem(s)')
      expect((await h.queue.stats()).queued).toBe(0)
    })
  })

  describe('rate limit', () => {
    let h: Harness
    beforeAll(async () => { h = await createHarness(factory, { env: { RATE_LIMIT_MAX: '3', RATE_LIMIT_WINDOW: '60' } }) })
    afterAll(async () => { await h.close() })

    it('429 with Retry-After once a client exceeds RATE_LIMIT_MAX per window; probes are exempt', async () => {
      for (let i = 0; i < 3; i++) expect((await h.request({ method: 'GET', url: '/v1/sweeps' })).statusCode).toBe(200)
      const limited = await h.request({ method: 'GET', url: '/v1/sweeps' })
      const problem = expectProblem(limited, 429, 'MEMSWEEP_RATE_LIMITED')
      expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0)
      expect(problem.retryAfter).toBeGreaterThan(0)
      expect((await h.request({ method: 'GET', url: '/healthz' })).statusCode).toBe(200)
      expect((await h.request({ method: 'GET', url: '/readyz' })).statusCode).toBe(200)
    })
  })
}
