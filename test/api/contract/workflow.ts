/**
 * Contract: the research workflow. Extensions and new sweeps take the owner's finished
 * trials and compute only what is missing, with the rows of a fresh run; partial results of
 * an unfinished sweep; resume in place without recomputing; monotone progress; annotations,
 * list filters and purge. Chunks computed are counted at the test gate (every chunk that
 * runs passes it and is logged with its trial count), never inferred from timing.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SweepRecord } from '../../../src/backends/port.js'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { heldSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'

const gate = sharedChunkGate()

/** Two loads of a model place-cell network storing the rooms of one wing. */
const wingSpec = (seed: number): Record<string, unknown> => ({
  label: 'rooms of the east wing',
  neurons: 64,
  load: { values: [0.05, 0.1] },
  trials: 8,
  seed
})

const succeeded = (record: SweepRecord): boolean => record.status === 'succeeded'

export function workflowContract (factory: QueueFactory): void {
  describe('research workflow', () => {
    let h: Harness
    beforeAll(async () => { h = await createHarness(factory) })
    afterAll(async () => { await h.close() })

    const submit = async (spec: Record<string, unknown>, query = ''): Promise<string> => {
      const res = await h.request({ method: 'POST', url: `/v1/sweeps${query}`, payload: spec })
      expect([200, 202], res.body).toContain(res.statusCode)
      return res.json().id as string
    }
    const rowsOf = async (id: string): Promise<string> => JSON.stringify((await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` })).json().rows)
    const specOf = async (id: string): Promise<Record<string, unknown>> => (await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json().spec

    it('an extension computes only the missing trials and has the rows of a fresh run of the extended spec; so does an extension of it', async () => {
      const seed = 7101
      const parent = await submit(wingSpec(seed))
      await h.waitFor(parent, succeeded)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 8)

      const extended = await h.request({ method: 'POST', url: `/v1/sweeps/${parent}/extend`, payload: { trials: 16, add: { load: [0.15] }, tags: ['wing'] } })
      expect(extended.statusCode, extended.body).toBe(202)
      expect(extended.headers.location).toBe(`/v1/sweeps/${extended.json().id as string}`)
      const child = extended.json().id as string
      expect(extended.json()).toMatchObject({ extends: parent, tags: ['wing'], label: 'rooms of the east wing' })
      const childDone = await h.waitFor(child, succeeded)
      // 3 loads × 16 trials, of which the parent's 2 × 8 are copied, not computed.
      expect(childDone.reused).toEqual({ points: 0, trials: 16 })
      expect(gate.ranForSeed(seed).trials).toBe(2 * 8 + (3 * 16 - 16))

      const childSpec = await specOf(child)
      expect(childSpec).toMatchObject({ trials: 16, load: { values: [0.05, 0.1, 0.15] } })
      const fresh = await submit(childSpec, '?reusePoints=false')
      await h.waitFor(fresh, succeeded)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 8 + 32 + 48)
      expect(await rowsOf(child)).toBe(await rowsOf(fresh))

      const again = await h.request({ method: 'POST', url: `/v1/sweeps/${child}/extend`, payload: { trials: 24 } })
      expect(again.statusCode, again.body).toBe(202)
      const grandchild = again.json().id as string
      const grandchildDone = await h.waitFor(grandchild, succeeded)
      expect(grandchildDone.extends).toBe(child)
      expect(grandchildDone.reused.trials).toBe(3 * 16)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 8 + 32 + 48 + 3 * 8)
      const freshAgain = await submit(await specOf(grandchild), '?reusePoints=false')
      await h.waitFor(freshAgain, succeeded)
      expect(await rowsOf(grandchild)).toBe(await rowsOf(freshAgain))
    })

    it('refuses an extension that would shrink the sweep or add values to nothing, naming the field', async () => {
      const parent = await submit(wingSpec(7102))
      await h.waitFor(parent, succeeded)
      const fewer = await h.request({ method: 'POST', url: `/v1/sweeps/${parent}/extend`, payload: { trials: 4 } })
      expect(expectProblem(fewer, 422, 'MEMSWEEP_SPEC_INVALID').errors.map((e: { path: string }) => e.path)).toContain('trials')
      const nowhere = await h.request({ method: 'POST', url: `/v1/sweeps/${parent}/extend`, payload: { add: { seed: [8] } } })
      expect(expectProblem(nowhere, 422, 'MEMSWEEP_SPEC_INVALID').errors.map((e: { path: string }) => e.path)).toEqual(['add.seed'])
    })

    it('a new sweep of the owner takes whole points already computed; the status counts them', async () => {
      const seed = 7103
      const first = await submit(wingSpec(seed))
      await h.waitFor(first, succeeded)
      const wider = await submit({ ...wingSpec(seed), load: { values: [0.05, 0.1, 0.2] } })
      const done = await h.waitFor(wider, succeeded)
      expect(done.reused).toEqual({ points: 2, trials: 16 })
      expect(gate.ranForSeed(seed).trials).toBe(16 + 8)
    })

    it('a new sweep with fewer trials takes them from inside the stored chunks, with the rows of a fresh run', async () => {
      const seed = 7108
      const first = await submit({ ...wingSpec(seed), trials: 20 })
      await h.waitFor(first, succeeded)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 20)
      const fewer = await submit({ ...wingSpec(seed), trials: 6 })
      const done = await h.waitFor(fewer, succeeded)
      expect(done.reused).toEqual({ points: 2, trials: 12 })
      expect(gate.ranForSeed(seed).trials).toBe(2 * 20)
      const fresh = await submit({ ...wingSpec(seed), trials: 6 }, '?reusePoints=false')
      await h.waitFor(fresh, succeeded)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 20 + 2 * 6)
      expect(await rowsOf(fewer)).toBe(await rowsOf(fresh))
      // The slices are this sweep's own chunks: a later sweep takes them like any other.
      const again = await submit({ ...wingSpec(seed), trials: 6, label: 'rooms of the east wing, again' })
      expect((await h.waitFor(again, succeeded)).reused).toEqual({ points: 2, trials: 12 })
    })

    it('a precision-targeted sweep takes every block an earlier sweep computed, with the rows of a fresh run', async () => {
      const seed = 7109
      const coarse = await submit({ ...wingSpec(seed), trials: 50 })
      await h.waitFor(coarse, succeeded)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 50)
      const target = { ...wingSpec(seed), label: 'rooms of the east wing to ±0.08', trials: 50, precision: { measure: 'success', halfWidth: 0.08, block: 10 } }
      const precise = await submit(target)
      const done = await h.waitFor(precise, succeeded)
      const rows = (await h.request({ method: 'GET', url: `/v1/sweeps/${precise}/results` })).json().rows as Array<{ summary: { trials: number } }>
      const trials = rows.map((row) => row.summary.trials)
      // Later blocks were decided on and taken too, not only the first.
      expect(Math.max(...trials)).toBeGreaterThan(10)
      expect(done.reused.trials).toBe(trials.reduce((a, b) => a + b, 0))
      expect(gate.ranForSeed(seed).trials).toBe(2 * 50)
      // A sweep that opts out computes every block, and both have the same rows.
      const fresh = await submit(target, '?reusePoints=false')
      expect((await h.waitFor(fresh, succeeded)).reused.trials).toBe(0)
      expect(gate.ranForSeed(seed).trials).toBe(2 * 50 + trials.reduce((a, b) => a + b, 0))
      expect(await rowsOf(precise)).toBe(await rowsOf(fresh))
    })

    it('serves the finished points of a running sweep, then of the canceled sweep; resume computes only what is left, with monotone progress throughout', async () => {
      const seed = 7104
      const seen: Array<SweepRecord['progress']> = []
      const fractions: number[] = []
      gate.hold()
      const id = await submit(heldSpec(seed))
      const unsubscribe = h.queue.subscribe(id, (event) => { seen.push(event.sweep.progress) })
      try {
        await gate.untilWaiting()
        gate.release(1)
        await h.waitFor(id, (record) => record.progress.pointsDone >= 1)
        fractions.push((await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json().progress.fraction)

        const partial = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?partial=true` })
        expect(partial.statusCode).toBe(200)
        expect(partial.headers['cache-control']).toBe('no-store')
        expect(partial.headers['memsweep-partial']).toBe('1/4')
        expect(partial.json().partial).toEqual({ pointsDone: 1, pointsTotal: 4 })
        expect(partial.json().rows).toHaveLength(1)
        const partialCsv = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?partial=true&format=csv` })
        expect(partialCsv.headers['memsweep-partial']).toBe('1/4')
        expect(partialCsv.body.trimEnd().split('\r\n')).toHaveLength(2)
        // Without partial=true the contract is unchanged.
        expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` }), 409, 'MEMSWEEP_RESULTS_NOT_READY')

        expect((await h.request({ method: 'DELETE', url: `/v1/sweeps/${id}` })).statusCode).toBe(202)
        const canceled = await h.waitFor(id, isTerminal)
        expect(canceled.status).toBe('canceled')
        fractions.push((await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json().progress.fraction)
        const afterCancel = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?partial=true` })
        expect(afterCancel.json().rows).toHaveLength(1)

        const resumed = await h.request({ method: 'POST', url: `/v1/sweeps/${id}/resume` })
        expect(resumed.statusCode, resumed.body).toBe(202)
        expect(['queued', 'running']).toContain(resumed.json().status)
        gate.open()
        const done = await h.waitFor(id, succeeded)
        fractions.push((await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json().progress.fraction)
        // Every chunk ran exactly once: the one finished before the cancel was not run again.
        const ran = gate.ranForSeed(seed)
        expect(new Set(ran.labels).size).toBe(ran.chunks)
        expect(ran.chunks).toBe(done.progress.chunksTotal)
        expect(ran.trials).toBe(4 * 40)
        expect(expectProblem(await h.request({ method: 'POST', url: `/v1/sweeps/${id}/resume` }), 409, 'MEMSWEEP_NOT_RESUMABLE').detail).toContain('succeeded')
      } finally {
        unsubscribe()
        gate.open()
      }
      for (const counter of ['pointsDone', 'trialsDone', 'chunksDone', 'trialsTotal', 'chunksTotal'] as const) {
        const values = seen.map((progress) => progress[counter])
        expect(values, counter).toEqual([...values].sort((a, b) => a - b))
      }
      expect(fractions).toEqual([...fractions].sort((a, b) => a - b))
      expect(fractions.at(-1)).toBe(1)
    })

    it('edits label, tags and notes; lists by tag, by text and by replicates', async () => {
      const id = await submit({ ...wingSpec(7105), label: 'north corridor' })
      await h.waitFor(id, isTerminal)
      const patched = await h.request({ method: 'PATCH', url: `/v1/sweeps/${id}`, payload: { tags: ['corridor', 'pilot'], notes: 'Cue noise from the doorway cells.' } })
      expect(patched.statusCode, patched.body).toBe(200)
      expect(patched.json()).toMatchObject({ label: 'north corridor', tags: ['corridor', 'pilot'], notes: 'Cue noise from the doorway cells.' })
      const replicate = await submit({ ...wingSpec(7106), label: 'north corridor (seed 7106)' })
      await h.waitFor(replicate, isTerminal)

      const ids = async (query: string): Promise<string[]> => (await h.request({ method: 'GET', url: `/v1/sweeps?${query}&limit=100` })).json().items.map((item: { id: string }) => item.id)
      expect(await ids('tag=pilot')).toEqual([id])
      expect(await ids('q=DOORWAY')).toEqual([id])
      expect(await ids(`replicatesOf=${id}`)).toEqual(expect.arrayContaining([id, replicate]))
      expect(await ids(`replicatesOf=${id}`)).not.toContain(await submit({ ...wingSpec(7106), neurons: 65 }))

      const cleared = await h.request({ method: 'PATCH', url: `/v1/sweeps/${id}`, payload: { notes: null, label: null } })
      expect(cleared.json()).toMatchObject({ label: null, notes: null, tags: ['corridor', 'pilot'] })
      expectProblem(await h.request({ method: 'PATCH', url: `/v1/sweeps/${id}`, payload: {} }), 400, 'MEMSWEEP_MALFORMED_REQUEST')
    })

    it('purges a finished sweep for good, and never an active one', async () => {
      gate.hold()
      const active = await submit(heldSpec(7107))
      try {
        await gate.untilWaiting()
        const refused = expectProblem(await h.request({ method: 'DELETE', url: `/v1/sweeps/${active}?purge=true` }), 409, 'MEMSWEEP_SWEEP_ACTIVE')
        expect(refused.detail).toContain(active)
        expect((await h.request({ method: 'GET', url: `/v1/sweeps/${active}` })).statusCode).toBe(200)
      } finally {
        gate.open()
      }
      await h.waitFor(active, isTerminal)
      const finished = expectProblem(await h.request({ method: 'DELETE', url: `/v1/sweeps/${active}` }), 409, 'MEMSWEEP_SWEEP_FINISHED')
      expect(finished.detail).toContain('?purge=true')

      const purged = await h.request({ method: 'DELETE', url: `/v1/sweeps/${active}?purge=true` })
      expect(purged.statusCode).toBe(204)
      expect(purged.body).toBe('')
      expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${active}` }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
      expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${active}/results` }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
      expectProblem(await h.request({ method: 'DELETE', url: `/v1/sweeps/${active}?purge=true` }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
      expect((await h.request({ method: 'GET', url: '/v1/sweeps?limit=100' })).json().items.map((item: { id: string }) => item.id)).not.toContain(active)
    })
  })
}
