/**
 * POST /v1/theory and the theory in sweep results through the real HTTP app and the embedded
 * backend: the loads that once made the replica-symmetric root finder throw (a 500 here, a
 * failed sweep after all its trials), every shipped example including the threshold searches,
 * and the work limits of submit. Every response is checked against the OpenAPI document.
 */
import { readdirSync, readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { UNAVAILABLE_REASON_CODES } from '../../src/engine/index.js'
import { createHarness, isTerminal, type Harness } from './helpers/harness.js'
import { expectProblem } from './helpers/problems.js'

const examplesDir = new URL('../../examples/', import.meta.url)
const examples = readdirSync(examplesDir).filter((name) => name.endsWith('.json'))
  .map((name) => ({ name, spec: JSON.parse(readFileSync(new URL(name, examplesDir), 'utf8')) as Record<string, any> }))

/** The loads of the fuzzer's reports (issue 12): the RS bracket failed at each. */
const BROKEN_LOADS: Array<[number, number]> = [[5000, 7], [5000, 23], [5000, 27], [5000, 28], [5000, 31], [10000, 14], [10000, 17], [10000, 19], [10000, 46]]

describe('theory through the API (embedded backend)', () => {
  let h: Harness
  beforeAll(async () => {
    h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 2 }), { env: { MAX_NEURONS: '20000' } })
  })
  afterAll(async () => { await h.close() })

  it('answers 200 at the small loads where the root bracketing used to fail', async () => {
    for (const [neurons, patterns] of BROKEN_LOADS) {
      const res = await h.request({ method: 'POST', url: '/v1/theory', payload: { neurons, patterns } })
      expect(res.statusCode, `${neurons}/${patterns}: ${res.body}`).toBe(200)
      const [point] = res.json().points
      // At α ≤ 0.005 the RS retrieval state is perfect to double precision (AGS 1987: m = erf(y), y ≥ 10).
      expect(point.theory.retrievalOverlapRS).toBe(1)
      expect(point.theory.criticalLoad).toBeCloseTo(0.137906, 6)
    }
    const grid = await h.request({ method: 'POST', url: '/v1/theory', payload: { neurons: { values: [5000, 10000] }, patterns: { values: BROKEN_LOADS.map(([, p]) => p) } } })
    expect(grid.statusCode).toBe(200)
    expect(grid.json().points).toHaveLength(2 * BROKEN_LOADS.length)
  })

  it('runs {"neurons": 5000, "patterns": 7} to success with the theory in its rows', async () => {
    const submitted = await h.request({ method: 'POST', url: '/v1/sweeps', payload: { neurons: 5000, patterns: 7, trials: 2, seed: 12 } })
    expect(submitted.statusCode).toBe(202)
    const record = await h.waitFor(submitted.json().id as string, isTerminal)
    expect(record.status, JSON.stringify(record)).toBe('succeeded')
    const result = (await h.request({ method: 'GET', url: `/v1/sweeps/${record.id}/results` })).json()
    // The engine's T = 0 tie rule is stated with every result.
    expect(result.provenance.tieRule).toBe('keep')
    const [row] = result.rows
    expect(row.theory.retrievalOverlapRS).toBe(1)
    expect(row.theoryUnavailable).toMatchObject({ firstStepOverlap: 'dynamics-outside-domain' })
    for (const reason of Object.values(row.theoryUnavailable)) expect(UNAVAILABLE_REASON_CODES).toContain(reason)
    // CSV: one column per theory value of the model, empty where it is unavailable.
    const csv = (await h.request({ method: 'GET', url: `/v1/sweeps/${record.id}/results?format=csv` })).body
    const [header, line] = csv.split('\r\n') as [string, string]
    const cells = Object.fromEntries(header.split(',').map((name, i) => [name, line.split(',')[i]]))
    expect(cells['theory.retrievalOverlapRS']).toBe('1')
    expect(cells['theory.firstStepOverlap']).toBe('')
  })

  it('answers every shipped example with 200, the threshold searches at both ends of their range', async () => {
    for (const { name, spec } of examples) {
      const res = await h.request({ method: 'POST', url: '/v1/theory', payload: spec })
      expect(res.statusCode, `${name}: ${res.body.slice(0, 300)}`).toBe(200)
      const { points } = res.json()
      if (spec.analysis === undefined) continue
      const parameter = spec.analysis.parameter as string
      expect(points.length % 2).toBe(0)
      for (let i = 0; i < points.length; i += 2) {
        expect(points[i]).toMatchObject({ point: i / 2, end: 'from' })
        expect(points[i + 1]).toMatchObject({ point: i / 2, end: 'to' })
        expect(points[i].values[parameter]).toBeLessThan(points[i + 1].values[parameter])
      }
    }
    const capacity = examples.find((e) => e.name === 'room-capacity-search.json')!.spec
    const [from, to] = (await h.request({ method: 'POST', url: '/v1/theory', payload: capacity })).json().points
    // The search's range straddles the RS capacity (AGS 1987, α_c = 0.138): retrieval at 0.08, none at 0.28.
    expect(from.values.load).toBe(0.08)
    expect(from.theory.retrievalOverlapRS).toBeGreaterThan(0.99)
    expect(to.theory.retrievalOverlapRS).toBe(0)
  })

  it('applies the work limits of submit before computing anything', async () => {
    const tooBig = await h.request({ method: 'POST', url: '/v1/theory', payload: { neurons: 30000, patterns: 10 } })
    expect(expectProblem(tooBig, 422, 'MEMSWEEP_WORK_LIMIT_EXCEEDED').limit).toMatchObject({ name: 'maxNeurons', max: 20000 })
    const tooManyTrials = await h.request({ method: 'POST', url: '/v1/theory', payload: { neurons: 100, load: { values: [0.05, 0.1] }, trials: 9_000_000 } })
    expect(expectProblem(tooManyTrials, 422, 'MEMSWEEP_WORK_LIMIT_EXCEEDED').limit.name).toBe('maxTrials')
    const search = examples.find((e) => e.name === 'room-capacity-search.json')!.spec
    const tooLong = await h.request({ method: 'POST', url: '/v1/theory', payload: { ...search, trials: 1_000_000 } })
    expect(expectProblem(tooLong, 422, 'MEMSWEEP_WORK_LIMIT_EXCEEDED').limit.name).toBe('maxTrials')
  })
})
