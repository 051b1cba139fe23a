/** Contract: submitting, reading, listing, canceling, validating sweeps; theory. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { heldSpec, quickSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'
import { withoutSweepId } from '../../helpers/tables.js'

const gate = sharedChunkGate()

export function sweepContract (factory: QueueFactory): void {
  describe('sweep lifecycle', () => {
    let h: Harness
    beforeAll(async () => { h = await createHarness(factory) })
    afterAll(async () => { await h.close() })

    it('accepts a spec with 202, Location and the status; the sweep then succeeds with full progress', async () => {
      const res = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec() })
      expect(res.statusCode).toBe(202)
      const body = res.json()
      expect(res.headers.location).toBe(`/v1/sweeps/${body.id}`)
      expect(['queued', 'running', 'succeeded']).toContain(body.status)
      expect(body.label).toBe('rooms in a small hippocampus')
      expect(body.owner).toBeNull()
      // The normalised spec: axes expanded, defaults filled in.
      expect(body.spec.load).toEqual({ values: [0.05, 0.1] })
      expect(body.spec.rule).toEqual({ kind: 'hebbian', selfCoupling: false })
      expect(body.progress).toMatchObject({ pointsTotal: 2, trialsTotal: 16 })

      const done = await h.waitFor(body.id, isTerminal)
      expect(done.status).toBe('succeeded')
      const status = await h.request({ method: 'GET', url: `/v1/sweeps/${body.id}` })
      expect(status.statusCode).toBe(200)
      const s = status.json()
      expect(s.progress).toMatchObject({ pointsDone: 2, trialsDone: 16, fraction: 1, estimatedSecondsLeft: 0 })
      expect(s.progress.elapsedSeconds).toBeGreaterThanOrEqual(0)
      expect(s.error).toBeNull()
      expect(s.finishedAt).not.toBeNull()
      expect(s.links).toEqual({ self: `/v1/sweeps/${body.id}`, events: `/v1/sweeps/${body.id}/events`, results: `/v1/sweeps/${body.id}/results` })
    })

    it('shows elapsed time and an estimate of the time left while running; cancel stops it with 202', async () => {
      gate.hold()
      const submitted = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(21) })).json()
      gate.release()
      await h.waitFor(submitted.id, (r) => r.status === 'running' && r.progress.chunksDone === 1)
      await gate.untilWaiting()
      const running = (await h.request({ method: 'GET', url: `/v1/sweeps/${submitted.id}` })).json()
      expect(running.status).toBe('running')
      expect(running.progress.fraction).toBeGreaterThan(0)
      expect(running.progress.fraction).toBeLessThan(1)
      expect(running.progress.elapsedSeconds).toBeGreaterThan(0)
      expect(running.progress.estimatedSecondsLeft).toBeGreaterThan(0)

      const cancel = await h.request({ method: 'DELETE', url: `/v1/sweeps/${submitted.id}` })
      expect(cancel.statusCode).toBe(202)
      expect(cancel.json().id).toBe(submitted.id)
      const final = await h.waitFor(submitted.id, isTerminal)
      expect(final.status).toBe('canceled')
      // Held chunks notice the stop and leave; no chunk of the sweep runs or waits afterwards.
      await expect.poll(async () => {
        const stats = await h.queue.stats()
        return stats.chunksActive + stats.chunksWaiting
      }, { timeout: 30_000, interval: 50 }).toBe(0)
      gate.open()
      const results = await h.request({ method: 'GET', url: `/v1/sweeps/${submitted.id}/results` })
      expectProblem(results, 409, 'MEMSWEEP_RESULTS_UNAVAILABLE')
    })

    it('canceling a finished sweep is a 409 that changes nothing', async () => {
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(12) })).json().id
      await h.waitFor(id, isTerminal)
      const before = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json()
      const res = await h.request({ method: 'DELETE', url: `/v1/sweeps/${id}` })
      const problem = expectProblem(res, 409, 'MEMSWEEP_SWEEP_FINISHED')
      expect(problem.detail).toBe(`Sweep '${id}' already ended as succeeded; a finished sweep cannot be canceled. To remove it with everything stored for it, send DELETE with ?purge=true (its owner only; irreversible).`)
      expect(problem.sweepId).toBe(id)
      const after = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json()
      expect(after).toEqual(before)
      expect((await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv` })).statusCode).toBe(200)
    })

    it('gives the status a weak ETag, so pollers get 304 until the sweep changes', async () => {
      const id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(13) })).json().id
      await h.waitFor(id, isTerminal)
      const first = await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })
      const tag = first.headers.etag as string
      expect(tag).toMatch(/^W\/"/)
      const again = await h.request({ method: 'GET', url: `/v1/sweeps/${id}`, headers: { 'if-none-match': tag } })
      expect(again.statusCode).toBe(304)
      expect(again.headers.etag).toBe(tag)
      expect(again.body).toBe('')
      const other = await h.request({ method: 'GET', url: `/v1/sweeps/${id}`, headers: { 'if-none-match': 'W/"something-else"' } })
      expect(other.statusCode).toBe(200)
    })

    it('lists newest first with cursor pagination (Link rel="next") and a status filter', async () => {
      const ids: string[] = []
      for (let seed = 100; seed < 105; seed++) {
        ids.push((await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(seed) })).json().id)
      }
      for (const id of ids) await h.waitFor(id, isTerminal)

      const seen: string[] = []
      let url: string | null = '/v1/sweeps?limit=2'
      let pages = 0
      while (url !== null) {
        const page = await h.request({ method: 'GET', url })
        expect(page.statusCode).toBe(200)
        const body = page.json()
        expect(body.items.length).toBeLessThanOrEqual(2)
        seen.push(...body.items.map((item: { id: string }) => item.id))
        const link = page.headers.link as string | undefined
        if (body.nextCursor === null) {
          expect(link).toBeUndefined()
          url = null
        } else {
          const match = /^<([^>]+)>; rel="next"$/.exec(link ?? '')
          expect(match).not.toBeNull()
          url = match![1]!
          expect(url).toContain(`cursor=${encodeURIComponent(body.nextCursor)}`)
        }
        pages++
      }
      expect(pages).toBeGreaterThanOrEqual(3)
      expect(new Set(seen).size).toBe(seen.length)
      // Ours appear newest first, and nothing is skipped.
      const ours = seen.filter((id) => ids.includes(id))
      expect(ours).toEqual([...ids].reverse())

      const succeeded = (await h.request({ method: 'GET', url: '/v1/sweeps?status=succeeded&limit=100' })).json()
      expect(succeeded.items.every((item: { status: string }) => item.status === 'succeeded')).toBe(true)
      expect(succeeded.items.map((item: { id: string }) => item.id)).toEqual(expect.arrayContaining(ids))
      const failed = (await h.request({ method: 'GET', url: '/v1/sweeps?status=failed' })).json()
      expect(failed.items.map((item: { id: string }) => item.id)).not.toEqual(expect.arrayContaining([ids[0]]))
    })

    it('Idempotency-Key: a retry with the same spec gets the same sweep; a different spec gets 422', async () => {
      const key = `retry-${Math.random().toString(36).slice(2)}`
      const first = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(21), headers: { 'idempotency-key': key } })
      const again = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(21), headers: { 'idempotency-key': `"${key}"` } })
      expect(first.statusCode).toBe(202)
      expect(first.headers['retry-after']).toBe('2')
      expect(again.json().id).toBe(first.json().id)
      // 202 while it runs, 200 once it has finished (a small sweep may already have).
      expect(again.statusCode).toBe(isTerminal(again.json()) ? 200 : 202)
      await h.waitFor(first.json().id, isTerminal)
      const afterwards = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(21), headers: { 'idempotency-key': key } })
      expect(afterwards.statusCode).toBe(200)
      expect(afterwards.json()).toMatchObject({ id: first.json().id, status: 'succeeded' })
      expect(afterwards.headers.location).toBe(`/v1/sweeps/${first.json().id as string}`)
      expect(afterwards.headers['retry-after']).toBeUndefined()
      const different = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(22), headers: { 'idempotency-key': key } })
      const problem = expectProblem(different, 422, 'MEMSWEEP_IDEMPOTENCY_KEY_REUSED')
      expect(problem.detail).toContain(key)
      const bad = await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(21), headers: { 'idempotency-key': 'has a space' } })
      expectProblem(bad, 400, 'MEMSWEEP_MALFORMED_REQUEST')
    })

    it('?reuse=true reuses the results of a finished identical sweep; without it the sweep runs afresh', async () => {
      const original = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(31) })).json()
      await h.waitFor(original.id, isTerminal)
      const reused = await h.request({ method: 'POST', url: '/v1/sweeps?reuse=true', payload: quickSpec(31) })
      // Finished on arrival: 200 with its final status, nothing to wait for.
      expect(reused.statusCode).toBe(200)
      expect(reused.headers['retry-after']).toBeUndefined()
      expect(reused.headers.location).toBe(`/v1/sweeps/${reused.json().id as string}`)
      expect(reused.json()).toMatchObject({ status: 'succeeded', reusedFrom: original.id, specHash: original.specHash })
      const fresh = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(31) })).json()
      expect(fresh.reusedFrom).toBeNull()
      await h.waitFor(fresh.id, isTerminal)
      const csv = async (id: string) => withoutSweepId((await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv` })).body)
      const [a, b, c] = [await csv(original.id), await csv(reused.json().id), await csv(fresh.id)]
      expect(b).toBe(a)
      expect(c).toBe(a)
    })

    it('validate returns the normalised spec, its hash and the work estimate without queuing anything', async () => {
      const before = (await h.request({ method: 'GET', url: '/v1/sweeps?limit=100' })).json().items.length
      const res = await h.request({ method: 'POST', url: '/v1/sweeps/validate', payload: quickSpec(41) })
      expect(res.statusCode).toBe(200)
      const body = res.json()
      expect(body.spec.load).toEqual({ values: [0.05, 0.1] })
      expect(body.work).toMatchObject({ points: 2, trialsPerPoint: 8, trials: 16 })
      expect(body.work.peakBytes).toBeGreaterThan(0)
      expect(body.work.cpuSeconds).toBeGreaterThan(0)
      expect(body.exceeded).toBeNull()
      expect(body.limits.maxNeurons).toBeGreaterThan(64)
      const submitted = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(41) })).json()
      expect(submitted.specHash).toBe(body.specHash)
      const after = (await h.request({ method: 'GET', url: '/v1/sweeps?limit=100' })).json().items.length
      expect(after).toBe(before + 1)
    })

    it('theory evaluates every grid point without simulating', async () => {
      const res = await h.request({ method: 'POST', url: '/v1/theory', payload: { neurons: 1000, load: { values: [0.05, 0.1, 0.2] }, trials: 1 } })
      expect(res.statusCode).toBe(200)
      const body = res.json()
      expect(body.points).toHaveLength(3)
      expect(body.points.map((p: { values: { load: number } }) => p.values.load)).toEqual([0.05, 0.1, 0.2])
      for (const point of body.points) {
        // Replica-symmetric critical load of the Hebbian network, αc ≈ 0.138
        // (Amit, Gutfreund & Sompolinsky 1987, Ann. Phys. 173, 30).
        expect(point.theory.criticalLoad).toBeCloseTo(0.138, 3)
      }
      // Above αc the retrieval state is gone: overlap 0 at α = 0.2, near 1 at α = 0.05.
      expect(body.points[0].theory.retrievalOverlapRS).toBeGreaterThan(0.99)
      expect(body.points[2].theory.retrievalOverlapRS).toBe(0)
    })
  })
}
