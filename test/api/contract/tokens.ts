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

    it('scopes idempotency keys and the metrics route to a valid token', async () => {
      const metrics = await h.request({ method: 'GET', url: '/metrics', headers: as(CAROL) })
      expect(metrics.statusCode).toBe(200)
      const key = 'shared-key-1'
      const a = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(81), headers: { ...as(ALICE), 'idempotency-key': key } })).json()
      const b = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(81), headers: { ...as(BOB), 'idempotency-key': key } })).json()
      expect(b.id).not.toBe(a.id)
      expect(b.owner).toBe('bob')
    })
  })
}
