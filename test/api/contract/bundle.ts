/** Contract: the supplementary-material bundle of a sweep, unzipped and checked member by member against the routes that serve each part. */
import { createHash } from 'node:crypto'
import { unzipSync } from 'fflate'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { heldSpec, quickSpec } from '../helpers/specs.js'
import { sharedChunkGate } from '../../helpers/chunk-gate.js'

const gate = sharedChunkGate()

export function bundleContract (factory: QueueFactory): void {
  describe('bundle', () => {
    let h: Harness
    let id: string
    beforeAll(async () => {
      h = await createHarness(factory)
      id = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: quickSpec(61) })).json().id
      await h.waitFor(id, isTerminal)
      await h.request({ method: 'PATCH', url: `/v1/sweeps/${id}`, payload: { tags: ['supplement'], notes: 'Figure 2 of the draft.' } })
    })
    afterAll(async () => { await h.close() })

    it('holds the spec, results, per-trial rows, figure and provenance, each equal to what its own route serves, and a README to reproduce them', async () => {
      const res = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/bundle.zip` })
      expect(res.statusCode).toBe(200)
      expect(res.headers['content-type']).toBe('application/zip')
      expect(res.headers['content-disposition']).toBe(`attachment; filename="memsweep-${id}.zip"`)
      const files = unzipSync(new Uint8Array(res.rawPayload))
      const folder = `memsweep-${id}/`
      expect(Object.keys(files)).toEqual(['README.md', 'spec.json', 'spec.normalised.json', 'results.json', 'results.csv', 'results.arrow', 'trials.csv', 'figure.svg', 'figure.pdf', 'figure.png', 'provenance.json'].map((name) => folder + name))
      const read = (name: string): string => Buffer.from(files[folder + name]!).toString('utf8')
      const served = async (url: string): Promise<string> => (await h.request({ method: 'GET', url })).body

      const detail = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })).json()
      expect(JSON.parse(read('spec.json'))).toEqual(detail.spec)
      expect(createHash('sha256').update(read('spec.normalised.json')).digest('hex')).toBe(detail.specHash)
      expect(read('results.json')).toBe(await served(`/v1/sweeps/${id}/results`))
      expect(read('results.csv')).toBe(await served(`/v1/sweeps/${id}/results?format=csv`))
      expect(read('trials.csv')).toBe(await served(`/v1/sweeps/${id}/results?format=csv&trials=true`))
      expect(read('figure.svg')).toBe(await served(`/v1/sweeps/${id}/figure.svg`))
      const arrow = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=arrow` })
      expect(Buffer.compare(Buffer.from(files[`${folder}results.arrow`]!), arrow.rawPayload), 'results.arrow').toBe(0)
      for (const format of ['pdf', 'png']) {
        const print = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/figure.${format}?column=single` })
        expect(Buffer.compare(Buffer.from(files[`${folder}figure.${format}`]!), print.rawPayload), `figure.${format}`).toBe(0)
      }
      const provenance = JSON.parse(read('provenance.json'))
      expect(provenance.sweep).toMatchObject({ id, specHash: detail.specHash, tags: ['supplement'], notes: 'Figure 2 of the draft.', finishedAt: detail.finishedAt })
      expect(provenance.provenance.specHash).toBe(detail.specHash)
      expect(provenance.provenance).toHaveProperty('wallSeconds')

      const readme = read('README.md')
      expect(readme).toMatch(/^# rooms in a small hippocampus\n/)
      expect(readme).toContain('memsweep run spec.json -o results.csv')
      expect(readme).toContain('curl -sS -X POST http://localhost:80/v1/sweeps -H \'content-type: application/json\'')
      expect(readme).toContain(detail.specHash)
      expect(readme).toContain('Tags: supplement.')
      expect(readme).toContain('`trajectory.csv`: the spec records no trajectories.')
      for (const name of ['spec.json', 'results.csv', 'figure.svg', 'provenance.json']) expect(readme).toContain(`| \`${name}\` |`)
    })

    it('gives the same bytes each time (members dated at the finish) with a strong ETag, and 304 for If-None-Match', async () => {
      const first = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/bundle.zip` })
      const second = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/bundle.zip` })
      expect(Buffer.compare(first.rawPayload, second.rawPayload)).toBe(0)
      expect(first.headers.etag).toBe(`"${createHash('sha256').update(first.rawPayload).digest('base64url')}"`)
      const cached = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/bundle.zip`, headers: { 'if-none-match': first.headers.etag as string } })
      expect(cached.statusCode).toBe(304)
    })

    it('answers 409 for a sweep still running and for a canceled one, 404 for an unknown id', async () => {
      gate.hold()
      const running = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: heldSpec(62) })).json()
      expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${running.id as string}/bundle.zip` }), 409, 'MEMSWEEP_RESULTS_NOT_READY')
      await h.request({ method: 'DELETE', url: `/v1/sweeps/${running.id as string}` })
      gate.open()
      await h.waitFor(running.id, isTerminal)
      expectProblem(await h.request({ method: 'GET', url: `/v1/sweeps/${running.id as string}/bundle.zip` }), 409, 'MEMSWEEP_RESULTS_UNAVAILABLE')
      expectProblem(await h.request({ method: 'GET', url: '/v1/sweeps/00000000000000000000000000/bundle.zip' }), 404, 'MEMSWEEP_SWEEP_NOT_FOUND')
    })
  })
}
