/** Contract: results as JSON or CSV, per point or per trial, with strong ETags. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { heldSpec, quickSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'

const gate = sharedChunkGate()

export function resultsContract (factory: QueueFactory): void {
  describe('results', () => {
    let h: Harness
    let id: string
    beforeAll(async () => {
      h = await createHarness(factory)
      id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(51) })).json().id
      await h.waitFor(id, isTerminal)
    })
    afterAll(async () => { await h.close() })

    it('serves JSON by default: one row per grid point with measures, uncertainties and theory', async () => {
      const res = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` })
      expect(res.statusCode).toBe(200)
      expect(res.headers['content-type']).toMatch(/^application\/json/)
      const body = res.json()
      expect(body.rows).toHaveLength(2)
      expect(body.trials).toBeUndefined()
      const [first] = body.rows
      expect(first.values).toEqual({ load: 0.05 })
      expect(first.params).toEqual({ alpha: 3 / 64, neurons: 64, patterns: 3 })
      expect(first.summary.trials).toBe(8)
      expect(first.summary.overlap).toHaveProperty('se')
      expect(first.summary.success.low).toBeLessThanOrEqual(first.summary.success.rate)
      expect(first.theory).toHaveProperty('criticalLoad')
      expect(body.provenance.specHash).toBe(body.specHash)
    })

    it('serves CSV for Accept: text/csv and for ?format=csv, byte for byte the same', async () => {
      const byAccept = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results`, headers: { accept: 'text/csv' } })
      const byQuery = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv`, headers: { accept: 'application/json' } })
      expect(byAccept.statusCode).toBe(200)
      expect(byAccept.headers['content-type']).toMatch(/^text\/csv/)
      expect(byAccept.headers['content-disposition']).toContain(`memsweep-${id}.csv`)
      expect(byQuery.body).toBe(byAccept.body)
      const lines = byAccept.body.trimEnd().split('\r\n')
      expect(lines).toHaveLength(3)
      expect(lines[0]).toMatch(/^sweepId,specHash,seed,point,neurons,patterns,load,.*,alpha,alphaK,trials,overlap\.mean/)
      expect(lines[1]!.startsWith(`${id},`)).toBe(true)
      // q-values decide: CSV preferred over JSON.
      const weighted = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results`, headers: { accept: 'application/json;q=0.5, text/csv' } })
      expect(weighted.headers['content-type']).toMatch(/^text\/csv/)
    })

    it('gives per-trial rows with ?trials=true', async () => {
      const csv = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv&trials=true` })
      const lines = csv.body.trimEnd().split('\r\n')
      expect(lines).toHaveLength(1 + 2 * 8)
      expect(lines[0]).toContain('trial')
      const json = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?trials=true` })).json()
      expect(json.trials).toHaveLength(2)
      expect(json.trials[1]).toHaveLength(8)
      expect(json.trials[1][7].trial).toBe(7)
    })

    it('sets a strong ETag (sha256 of the bytes) per representation and answers If-None-Match with 304', async () => {
      const json = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` })
      const csv = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv` })
      const { createHash } = await import('node:crypto')
      expect(json.headers.etag).toBe(`"${createHash('sha256').update(json.rawPayload).digest('base64url')}"`)
      expect(csv.headers.etag).not.toBe(json.headers.etag)
      expect(json.headers.vary).toBe('Accept')
      const cached = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results`, headers: { 'if-none-match': `"other", ${json.headers.etag as string}` } })
      expect(cached.statusCode).toBe(304)
      expect(cached.headers.etag).toBe(json.headers.etag)
      expect(cached.headers.vary).toBe('Accept')
      expect(cached.headers['cache-control']).toContain('immutable')
      expect(cached.body).toBe('')
    })

    it('refuses per-trial rows of a sweep over a million trials with 422 naming maxTrialRows', async () => {
      const huge = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: { neurons: 16, patterns: 1, trials: 1_000_001 } })).json()
      const res = await h.request({ method: 'GET', url: `/v1/sweeps/${huge.id as string}/results?trials=true` })
      expect(expectProblem(res, 422, 'MEMSWEEP_WORK_LIMIT_EXCEEDED').limit).toEqual({ name: 'maxTrialRows', value: 1_000_001, max: 1_000_000 })
      await h.request({ method: 'DELETE', url: `/v1/sweeps/${huge.id as string}` })
      await h.waitFor(huge.id, isTerminal)
    })

    it('answers 409 while the sweep is not finished, 406 for an unavailable media type', async () => {
      gate.hold()
      const running = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(81) })).json()
      const res = await h.request({ method: 'GET', url: `/v1/sweeps/${running.id}/results` })
      const problem = expectProblem(res, 409, 'MEMSWEEP_RESULTS_NOT_READY')
      expect(problem.sweepId).toBe(running.id)
      expect(res.headers['retry-after']).toBe('5')
      await h.request({ method: 'DELETE', url: `/v1/sweeps/${running.id}` })
      gate.open()
      await h.waitFor(running.id, isTerminal)

      const xml = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results`, headers: { accept: 'application/xml' } })
      expectProblem(xml, 406, 'MEMSWEEP_NOT_ACCEPTABLE')
      const badFormat = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=xlsx` })
      const bad = expectProblem(badFormat, 400, 'MEMSWEEP_MALFORMED_REQUEST')
      expect(bad.errors[0].path).toBe('querystring.format')
    })
  })
}
