/**
 * A threshold search end to end through the real HTTP app and the embedded backend (SQLite
 * in a temp dir, two worker threads): submit examples/room-capacity-search.json, follow it
 * to success, fetch JSON and CSV. Every response is checked against the OpenAPI document.
 */
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import type { SweepRecord } from '../../src/backends/port.js'
import { createHarness, isTerminal, type Harness } from './helpers/harness.js'
import { expectProblem } from './helpers/problems.js'
import { csvRecords } from '../helpers/tables.js'

const example = JSON.parse(readFileSync(new URL('../../examples/room-capacity-search.json', import.meta.url), 'utf8')) as Record<string, any>

describe('threshold search through the API (embedded backend)', () => {
  let h: Harness
  beforeAll(async () => {
    h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 2 }))
  })
  afterAll(async () => { await h.close() })

  it('validates a search: the estimate counts the whole step budget; a bad range is a 422 naming analysis.to', async () => {
    const ok = await h.request({ method: 'POST', url: '/v1/sweeps/validate', payload: example })
    expect(ok.statusCode).toBe(200)
    const body = ok.json()
    expect(body.work).toMatchObject({ points: 1, trialsPerPoint: 16 * 400, trials: 6400 })
    expect(body.spec.analysis).toMatchObject({ kind: 'threshold', parameter: 'load', tolerance: 0.0015, scaling: null })
    const bad = await h.request({ method: 'POST', url: '/v1/sweeps', payload: { ...example, analysis: { ...example.analysis, to: 0.05 } } })
    const problem = expectProblem(bad, 422, 'MEMSWEEP_SPEC_INVALID')
    expect(problem.errors.map((e: { path: string }) => e.path)).toContain('analysis.to')
    const both = await h.request({ method: 'POST', url: '/v1/sweeps', payload: { ...example, load: 0.1 } })
    expect(expectProblem(both, 422, 'MEMSWEEP_SPEC_INVALID').errors[0].path).toBe('load')
  })

  it('runs room-capacity-search.json to success, progress reaching 100 %, and serves the search as JSON and CSV', async () => {
    const submitted = await h.request({ method: 'POST', url: '/v1/sweeps', payload: example })
    expect(submitted.statusCode).toBe(202)
    const id = submitted.json().id as string
    const seen: SweepRecord['progress'][] = []
    const unsubscribe = h.queue.subscribe(id, (event) => seen.push(event.sweep.progress))
    const record = await h.waitFor(id, isTerminal, 120_000)
    unsubscribe()
    expect(record.status).toBe('succeeded')
    expect(record.progress).toMatchObject({ trialsDone: 6400, trialsTotal: 6400, chunksDone: 1, chunksTotal: 1, pointsDone: 1 })
    for (const p of seen) expect(p.trialsDone).toBeLessThanOrEqual(p.trialsTotal)

    const status = await h.request({ method: 'GET', url: `/v1/sweeps/${id}` })
    expect(status.json().progress.fraction).toBe(1)

    const json = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` })
    expect(json.statusCode).toBe(200)
    const result = json.json()
    expect(result.rows).toEqual([])
    expect(result.scaling).toBeUndefined()
    const [search] = result.searches
    expect(search).toMatchObject({ search: 0, values: {}, neurons: 1000 })
    // Recall from a 5 % cue at N = 1000 fails half the time somewhere between the RS α_c = 0.138
    // and the no-recall loads of the range's top; the interval is tight with 400 trials a step.
    expect(search.estimate).toBeGreaterThan(0.138)
    expect(search.estimate).toBeLessThan(0.2)
    expect(search.low).toBeLessThan(search.estimate)
    expect(search.high).toBeGreaterThan(search.estimate)
    expect(search.high - search.low).toBeLessThan(0.01)
    expect(search.trialsUsed).toBe(400 * search.stepsUsed)
    expect(search.steps[0].summary.success.rate).toBe(1)

    const csv = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv` })
    const records = csvRecords(csv.body)
    expect(records).toHaveLength(1)
    expect(records[0]).toMatchObject({ sweepId: id, search: '0', neurons: '1000', load: '', parameter: 'load', measure: 'success', level: '0.5', confidence: '0.95' })
    expect([records[0]!.estimate, records[0]!.low, records[0]!.high].map(Number)).toEqual([search.estimate, search.low, search.high])
    const steps = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv&trials=true` })
    expect(steps.body.trimEnd().split('\r\n')).toHaveLength(1 + search.stepsUsed)

    // Running the same spec again gives the same bytes (timing is left out of the document).
    const again = (await h.request({ method: 'POST', url: '/v1/sweeps', payload: example })).json().id as string
    await h.waitFor(again, isTerminal, 120_000)
    expect((await h.request({ method: 'GET', url: `/v1/sweeps/${again}/results` })).body).toBe(json.body)
  })
})
