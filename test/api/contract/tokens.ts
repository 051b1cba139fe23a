/** Contract: bearer tokens, owners and roles on a shared server. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { quickSpec } from '../helpers/specs.js'

const ALICE = 'alice-laptop-7f3a9c2e1b'
const BOB = 'bob-workstation-4d8e6a0f'
const CAROL = 'carol-dashboard-91c5b7e3'
const LAB = 'lab-admin-2e6f0a9d5c44'

const as = (token: string): Record<string, string> => ({ authorization: `Bearer ${token}` })

export function tokensContract (factory: QueueFactory): void {
  describe('tokens', () => {
    let h: Harness
    let aliceSweep: string
    beforeAll(async () => {
      h = await createHarness(factory, {
        tokens: ['# owner:token[:role]', `alice:${ALICE}`, `bob:${BOB}:submit`, `carol:${CAROL}:read`, '', `lab:${LAB}:admin`]
      })
      const res = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(71), headers: as(ALICE) })
      expect(res.statusCode).toBe(202)
      aliceSweep = res.json().id
      expect(res.json().owner).toBe('alice')
      await h.waitFor(aliceSweep, isTerminal)
    })
    afterAll(async () => { await h.close() })

    it('401 without a token or with an unknown one, with a WWW-Authenticate challenge', async () => {
      for (const headers of [{}, as('not-a-known-token-at-all'), { authorization: `Basic ${ALICE}` }]) {
        const res = await h.request({ method: 'GET', url: '/v1/sweeps', headers })
        expectProblem(res, 401, 'MEMSWEEP_UNAUTHENTICATED')
        expect(res.headers['www-authenticate']).toMatch(/^Bearer/)
      }
      for (const url of ['/metrics', '/openapi.json', `/v1/sweeps/${aliceSweep}`]) {
        expectProblem(await h.request({ method: 'GET', url }), 401, 'MEMSWEEP_UNAUTHENTICATED')
      }
      const submit = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec() })
      expectProblem(submit, 401, 'MEMSWEEP_UNAUTHENTICATED')
    })

    it('keeps health and readiness public', async () => {
      expect((await h.request({ method: 'GET', url: '/healthz' })).statusCode).toBe(200)
      expect((await h.request({ method: 'GET', url: '/readyz' })).statusCode).toBe(200)
    })

    it('hides one owner\'s sweeps from another (404, never 403) and from their list', async () => {
      for (const url of [`/v1/sweeps/${aliceSweep}`, `/v1/sweeps/${aliceSweep}/results`, `/v1/sweeps/${aliceSweep}/events`]) {
        expectProblem(await h.request({ method: 'GET', url, headers: as(BOB) }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
      }
      expectProblem(await h.request({ method: 'DELETE', url: `/v1/sweeps/${aliceSweep}`, headers: as(BOB) }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
      const bobs = (await h.request({ method: 'GET', url: '/v1/sweeps', headers: as(BOB) })).json()
      expect(bobs.items).toEqual([])
      const alices = (await h.request({ method: 'GET', url: '/v1/sweeps', headers: as(ALICE) })).json()
      expect(alices.items.map((i: { id: string }) => i.id)).toContain(aliceSweep)
      expect((await h.request({ method: 'GET', url: `/v1/sweeps/${aliceSweep}/results?format=csv`, headers: as(ALICE) })).statusCode).toBe(200)
    })

    it('403 when a read-only token tries to submit', async () => {
      const res = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(), headers: as(CAROL) })
      const problem = expectProblem(res, 403, 'MEMSWEEP_FORBIDDEN')
      expect(problem.detail).toContain("'read'")
      expect((await h.request({ method: 'GET', url: '/v1/sweeps', headers: as(CAROL) })).statusCode).toBe(200)
    })

    it('lets an admin token read and cancel any owner\'s sweep', async () => {
      const seen = await h.request({ method: 'GET', url: `/v1/sweeps/${aliceSweep}`, headers: as(LAB) })
      expect(seen.statusCode).toBe(200)
      expect(seen.json().owner).toBe('alice')
      // The admin's cancel gets past visibility (Bob gets 404 above) and the role check; this
      // finished sweep then has nothing left to cancel.
      expectProblem(await h.request({ method: 'DELETE', url: `/v1/sweeps/${aliceSweep}`, headers: as(LAB) }), 409, 'MEMSWEEP_SWEEP_FINISHED')
    })

    it('shows /metrics (sweeps by status count every owner\'s) to admin tokens only', async () => {
      const admin = await h.request({ method: 'GET', url: '/metrics', headers: as(LAB) })
      expect(admin.statusCode).toBe(200)
      expect(admin.body).toMatch(/^memsweep_sweeps\{status="succeeded"\} \d+$/m)
      for (const token of [ALICE, CAROL]) {
        const refused = await h.request({ method: 'GET', url: '/metrics', headers: as(token) })
        expect(expectProblem(refused, 403, 'MEMSWEEP_FORBIDDEN').detail).toContain('metrics')
        expect(refused.body).not.toContain('memsweep_sweeps')
      }
    })

    it('lists every owner\'s sweeps for an admin with owner=* (or one owner\'s with owner=<name>), paging across owners', async () => {
      const bobSweep = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(72), headers: as(BOB) })).json().id as string
      await h.waitFor(bobSweep, isTerminal)
      const own = (await h.request({ method: 'GET', url: '/v1/sweeps', headers: as(LAB) })).json()
      expect(own.items).toEqual([])
      const everyone = (await h.request({ method: 'GET', url: '/v1/sweeps?owner=*&limit=100', headers: as(LAB) })).json()
      expect(everyone.items.map((i: { id: string }) => i.id)).toEqual(expect.arrayContaining([aliceSweep, bobSweep]))
      expect(new Set(everyone.items.map((i: { owner: string }) => i.owner))).toEqual(new Set(['alice', 'bob']))
      const bobs = (await h.request({ method: 'GET', url: '/v1/sweeps?owner=bob', headers: as(LAB) })).json()
      expect(bobs.items.map((i: { id: string }) => i.id)).toEqual([bobSweep])

      // Newest first across owners; the Link keeps owner=* so every page spans owners.
      const first = await h.request({ method: 'GET', url: '/v1/sweeps?owner=*&limit=1', headers: as(LAB) })
      expect(first.json().items.map((i: { id: string }) => i.id)).toEqual([bobSweep])
      const next = /^<([^>]+)>; rel="next"$/.exec(String(first.headers.link))![1]!
      expect(new URL(next, 'http://x').searchParams.get('owner')).toBe('*')
      const second = (await h.request({ method: 'GET', url: next, headers: as(LAB) })).json()
      expect(second.items.map((i: { owner: string }) => i.owner)).toEqual(['alice'])

      for (const query of ['owner=*', 'owner=bob']) {
        const refused = await h.request({ method: 'GET', url: `/v1/sweeps?${query}`, headers: as(ALICE) })
        expect(expectProblem(refused, 403, 'MEMSWEEP_FORBIDDEN').detail).toContain('other owners')
      }
      const self = (await h.request({ method: 'GET', url: '/v1/sweeps?owner=alice', headers: as(ALICE) })).json()
      expect(self.items.map((i: { id: string }) => i.id)).toEqual([aliceSweep])
      expectProblem(await h.request({ method: 'GET', url: '/v1/sweeps?owner=a%20b', headers: as(LAB) }), 400, 'MEMSWEEP_MALFORMED_REQUEST')
    })

    it('scopes idempotency keys to the owner', async () => {
      const key = 'shared-key-1'
      const a = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(81), headers: { ...as(ALICE), 'idempotency-key': key } })).json()
      const b = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(81), headers: { ...as(BOB), 'idempotency-key': key } })).json()
      expect(b.id).not.toBe(a.id)
      expect(b.owner).toBe('bob')
    })
  })

  describe('failed authentication', () => {
    let h: Harness
    beforeAll(async () => {
      h = await createHarness(factory, {
        tokens: [`alice:${ALICE}`, `lab:${LAB}:admin`],
        env: { AUTH_FAILURE_MAX: '3', AUTH_FAILURE_WINDOW: '600' }
      })
    })
    afterAll(async () => { await h.close() })

    it('429 with Retry-After once an address has failed AUTH_FAILURE_MAX times; valid tokens from it still pass', async () => {
      const attempts = [as('guess-number-one-000'), {}, as('guess-number-two-000')]
      for (const headers of attempts) expectProblem(await h.request({ method: 'GET', url: '/v1/sweeps', headers }), 401, 'MEMSWEEP_UNAUTHENTICATED')
      for (const [url, headers] of [['/v1/sweeps', as('guess-number-three-0')], ['/metrics', {}], ['/v1/sweeps/any-id', as(`${ALICE}x`)]] as const) {
        const limited = await h.request({ method: 'GET', url, headers })
        const problem = expectProblem(limited, 429, 'MEMSWEEP_TOO_MANY_AUTH_FAILURES')
        expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0)
        expect(Number(limited.headers['retry-after'])).toBeLessThanOrEqual(600)
        expect(problem.retryAfter).toBe(Number(limited.headers['retry-after']))
        expect(problem.detail).toContain('More than 3')
      }
      // Colleagues behind the same address, with valid tokens, are not refused.
      expect((await h.request({ method: 'GET', url: '/v1/sweeps', headers: as(ALICE) })).statusCode).toBe(200)
      expect((await h.request({ method: 'GET', url: '/metrics', headers: as(LAB) })).statusCode).toBe(200)
      expect((await h.request({ method: 'GET', url: '/healthz' })).statusCode).toBe(200)
      // Another address has its own count.
      const elsewhere = await h.request({ method: 'GET', url: '/v1/sweeps', headers: as('guess-number-four-00'), remoteAddress: '192.0.2.7' })
      expectProblem(elsewhere, 401, 'MEMSWEEP_UNAUTHENTICATED')
    })
  })
}
