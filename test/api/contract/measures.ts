/**
 * Contract: the measures and spec members of format 2 through the service — the canonical
 * stream reproducing the shared benchmark's reference outputs, the trajectory series, a rule
 * axis and the load per input.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createHarness, isTerminal, type Harness, type QueueFactory } from '../helpers/harness.js'
import { expectProblem } from '../helpers/problems.js'
import { csvRecords } from '../../helpers/tables.js'

/**
 * The shared benchmark's workloads (WORKLOADS.md §5) as sweep specs on the canonical stream
 * (§7, seed 1): W1 and W4 keep one network for all 200 trials, W2 draws a new one per trial
 * and walks α = 0.02 … 0.24 in order.
 */
export const CANONICAL_WORKLOADS = {
  W1: { label: 'W1 recall', streams: 'canonical', seed: 1, neurons: 1000, patterns: 100, cue: { kind: 'flip', fraction: 0.1 }, dynamics: { update: 'async-random', maxSweeps: 50 }, successThreshold: 0.95, trials: 200, trialsPerNetwork: 200 },
  W4: { label: 'W4 sync', streams: 'canonical', seed: 1, neurons: 1000, patterns: 100, cue: { kind: 'flip', fraction: 0.1 }, dynamics: { update: 'sync', maxSweeps: 100 }, successThreshold: 0.95, trials: 200, trialsPerNetwork: 200 },
  W2: { label: 'W2 capacity', streams: 'canonical', seed: 1, neurons: 500, load: { from: 0.02, to: 0.24, step: 0.02 }, cue: { kind: 'flip', fraction: 0.05 }, dynamics: { update: 'async-random', maxSweeps: 50 }, successThreshold: 0.95, trials: 50, trialsPerNetwork: 1 }
} as const

/**
 * The outputs of the C reference program's integer variants for seed 1 (shared bench
 * RESULTS.md; the same values test/engine/canonical.test.ts checks through the bench
 * harness). Measured regression references of a reference implementation, not published values.
 */
export const C_REFERENCE = {
  W1: { meanOverlap: '0.997970', meanSweeps: 3.055, success: 1, maxed: 0 },
  W4: { meanOverlap: '0.997910', meanSweeps: 3.57, fixed: 199, cycle2: 1, maxed: 0 },
  W2: { success: [1, 1, 1, 1, 1, 0.98, 0.88, 0.46, 0.26, 0.02, 0, 0.02] }
} as const

export function measuresContract (factory: QueueFactory): void {
  describe('format-2 measures through the service', () => {
    let h: Harness
    beforeAll(async () => { h = await createHarness(factory) })
    afterAll(async () => { await h.close() })

    async function run (spec: Record<string, unknown>): Promise<string> {
      const submitted = await h.request({ method: 'POST', url: '/v1/sweeps', payload: spec })
      expect(submitted.statusCode).toBe(202)
      const id = submitted.json().id as string
      const final = await h.waitFor(id, isTerminal, 120_000)
      expect(final.status).toBe('succeeded')
      return id
    }

    it('reproduces the benchmark reference workloads W1, W4 and W2 bit for bit on the canonical stream', async () => {
      const [w1, w4, w2] = await Promise.all([run(CANONICAL_WORKLOADS.W1), run(CANONICAL_WORKLOADS.W4), run(CANONICAL_WORKLOADS.W2)])
      const rows = async (id: string) => (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` })).json().rows
      const [one] = await rows(w1)
      expect(one.summary.overlap.mean.toFixed(6)).toBe(C_REFERENCE.W1.meanOverlap)
      expect(one.summary.sweeps.mean).toBe(C_REFERENCE.W1.meanSweeps)
      expect(one.summary.success.rate).toBe(C_REFERENCE.W1.success)
      expect(one.summary.endings.max).toBe(C_REFERENCE.W1.maxed)
      const [four] = await rows(w4)
      expect(four.summary.overlap.mean.toFixed(6)).toBe(C_REFERENCE.W4.meanOverlap)
      expect(four.summary.sweeps.mean).toBe(C_REFERENCE.W4.meanSweeps)
      expect([four.summary.endings.fixed, four.summary.endings.cycle2, four.summary.endings.max]).toEqual([C_REFERENCE.W4.fixed, C_REFERENCE.W4.cycle2, C_REFERENCE.W4.maxed])
      const curve = await rows(w2)
      expect(curve.map((row: { values: { load: number } }) => row.values.load)).toEqual([0.02, 0.04, 0.06, 0.08, 0.1, 0.12, 0.14, 0.16, 0.18, 0.2, 0.22, 0.24])
      expect(curve.map((row: { summary: { success: { rate: number } } }) => row.summary.success.rate)).toEqual(C_REFERENCE.W2.success)
      // The whole canonical sweep is one chunk.
      const status = (await h.request({ method: 'GET', url: `/v1/sweeps/${w2}` })).json()
      expect(status.progress.trialsTotal).toBe(600)
      expect(status.progress.trialsDone).toBe(600)
    })

    it('serves the mean trajectories as a long-format series (CSV and JSON), and says when there are none', async () => {
      const id = await run({
        label: 'settling rooms',
        neurons: 120,
        load: { values: [0.05, 0.1] },
        cue: { kind: 'flip', fraction: 0.2 },
        measures: { overlapTrajectory: true },
        trials: 6,
        seed: 4
      })
      const csv = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?series=trajectory&format=csv` })
      expect(csv.statusCode).toBe(200)
      expect(csv.headers['content-disposition']).toContain(`memsweep-${id}-trajectory.csv`)
      const lines = csv.body.trimEnd().split('\r\n')
      expect(lines[0]).toMatch(/^sweepId,specHash,seed,point,neurons,patterns,load,.*,alpha,alphaK,sweep,running,overlap\.mean,overlap\.sd,overlap\.se$/)
      const json = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?series=trajectory` })).json()
      expect(json.series).toBe('trajectory')
      expect(json.padding).toMatch(/holds its last value/)
      const rows = (await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results` })).json().rows
      expect(json.points.map((p: { overlap: unknown }) => p.overlap)).toEqual(rows.map((r: { summary: { overlapTrajectory: unknown } }) => r.summary.overlapTrajectory))
      const lengths = json.points.map((p: { overlap: { mean: unknown[] } }) => p.overlap.mean.length)
      expect(lines).toHaveLength(1 + lengths[0] + lengths[1])
      expect(csvRecords(csv.body)[0]).toMatchObject({ sweepId: id, point: '0', load: '0.05', neurons: '120', patterns: '6', alpha: '0.05', sweep: '0', running: '6', 'overlap.mean': '0.6', 'overlap.sd': '0', 'overlap.se': '0' })
      const both = await h.request({ method: 'GET', url: `/v1/sweeps/${id}/results?series=trajectory&trials=true` })
      expect(expectProblem(both, 400, 'MEMSWEEP_MALFORMED_REQUEST').errors[0].path).toBe('querystring.series')

      const plain = await run({ label: 'no trajectories', neurons: 64, patterns: 3, trials: 4, seed: 5 })
      const none = await h.request({ method: 'GET', url: `/v1/sweeps/${plain}/results?series=trajectory` })
      const problem = expectProblem(none, 400, 'MEMSWEEP_MALFORMED_REQUEST')
      expect(problem.errors[0]).toMatchObject({ path: 'querystring.series', message: expect.stringMatching(/measures\.overlapTrajectory/) })
    })

    it('compares learning rules in one sweep and states the load per input under a fixed in-degree', async () => {
      const rules = await run({
        label: 'three rules',
        neurons: 100,
        patterns: 12,
        trials: 4,
        seed: 6,
        rule: { values: [{ kind: 'hebbian' }, { kind: 'storkey' }, { kind: 'pseudo-inverse' }] }
      })
      const body = (await h.request({ method: 'GET', url: `/v1/sweeps/${rules}/results` })).json()
      expect(body.rows.map((r: { values: unknown }) => r.values)).toEqual([{ rule: 'hebbian' }, { rule: 'storkey' }, { rule: 'pseudo-inverse' }])
      const csv = csvRecords((await h.request({ method: 'GET', url: `/v1/sweeps/${rules}/results?format=csv` })).body)
      expect(csv[1]).toMatchObject({ point: '1', 'rule.kind': 'storkey', 'rule.selfCoupling': 'false', neurons: '100', patterns: '12', alpha: '0.12' })

      const sparse = await run({
        label: 'sparse inputs',
        neurons: 400,
        inDegreeLoad: 0.25,
        dilution: { kind: 'fixed-in-degree', inDegree: { values: [20, 40] } },
        dynamics: { update: 'sync' },
        trials: 4,
        seed: 7
      })
      const sparseRows = (await h.request({ method: 'GET', url: `/v1/sweeps/${sparse}/results` })).json().rows
      expect(sparseRows.map((r: { params: unknown }) => r.params)).toEqual([
        { alpha: 5 / 400, inDegreeLoad: 0.25, neurons: 400, patterns: 5 },
        { alpha: 10 / 400, inDegreeLoad: 0.25, neurons: 400, patterns: 10 }
      ])
      const sparseCsv = (await h.request({ method: 'GET', url: `/v1/sweeps/${sparse}/results?format=csv` })).body
      expect(csvRecords(sparseCsv).map((row) => [row['dilution.kind'], row['dilution.inDegree'], row.inDegreeLoad, row.patterns, row.alpha, row.alphaK])).toEqual([
        ['fixed-in-degree', '20', '0.25', '5', '0.0125', '0.25'],
        ['fixed-in-degree', '40', '0.25', '10', '0.025', '0.25']
      ])
    })
  })
}
