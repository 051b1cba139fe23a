import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { normaliseSpec, type NormalisedSpec } from '../../src/spec/index.js'
import { assembleResult, ChunkCanceledError, dispatchOrder, IncompleteResultError, makeProvenance, planSweep, computeChunk, type Chunk, type ChunkResult } from '../../src/sweep/index.js'
import { resultToCsv, resultToJson } from '../../src/results/index.js'
import { pointAt } from '../../src/spec/grid.js'
import { pointOps } from '../../src/spec/work.js'
import { estimatePointCost } from '../../src/engine/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

// Small enough to run in well under a second, varied enough to exercise two axes and
// networks shared by several trials.
const spec = normaliseSpec({
  label: 'lobby and corridor rooms, small',
  seed: 2024,
  neurons: 48,
  load: { values: [0.05, 0.15] },
  cue: { kind: 'flip', fraction: { values: [0.1, 0.3] } },
  trials: 9,
  trialsPerNetwork: 3,
  measures: { stability: true }
})
const provenance = makeProvenance(spec, runtimeFacts(), { wallSeconds: 1.5, cpuSeconds: 2.5, workers: 2 })

function runAll (s: NormalisedSpec, chunks: Chunk[]): ChunkResult[] {
  return chunks.map((chunk) => computeChunk(s, chunk))
}

/** Every trial in its own chunk: the finest possible split. */
function singleTrialChunks (s: NormalisedSpec, points: number): Chunk[] {
  const chunks: Chunk[] = []
  for (let point = 0; point < points; point++) {
    for (let t = 0; t < s.trials; t++) chunks.push({ index: chunks.length, point, firstTrial: t, count: 1 })
  }
  return chunks
}

const planned = planSweep(spec).chunks
const fullRun = runAll(spec, planned)
const reference = assembleResult(spec, fullRun, provenance)

describe('planSweep', () => {
  it('is a deterministic function of the spec', () => {
    expect(planSweep(normaliseSpec(JSON.parse(JSON.stringify(spec)))).chunks).toEqual(planned)
  })

  it('covers every trial of every point once, in order, on network boundaries', () => {
    const big = normaliseSpec({ neurons: 400, load: { values: [0.05, 0.1] }, dynamics: { temperature: 0.3, maxSweeps: 2000, burnIn: 100 }, trials: 300, trialsPerNetwork: 4 })
    const chunks = planSweep(big).chunks
    expect(chunks.length).toBeGreaterThan(2)
    expect(chunks.map((c) => c.index)).toEqual(chunks.map((_, i) => i))
    for (const point of [0, 1]) {
      const mine = chunks.filter((c) => c.point === point)
      expect(mine[0]!.firstTrial).toBe(0)
      for (let k = 1; k < mine.length; k++) expect(mine[k]!.firstTrial).toBe(mine[k - 1]!.firstTrial + mine[k - 1]!.count)
      expect(mine.at(-1)!.firstTrial + mine.at(-1)!.count).toBe(300)
      for (const c of mine) expect(c.firstTrial % 4).toBe(0)
    }
  })
})

describe('dispatchOrder', () => {
  it('starts the costliest chunks first: a capacity curve from its high-load end, each chunk once', () => {
    const curve = normaliseSpec({ neurons: 500, load: { from: 0.02, to: 0.24, step: 0.02 }, trials: 2000, seed: 1 })
    const plan = planSweep(curve).chunks
    const order = dispatchOrder(curve, plan)
    expect([...order].sort((a, b) => a - b)).toEqual(plan.map((c) => c.index))
    // Estimated work per chunk (trials × visits × cost of a visit) never rises along the order.
    const work = order.map((index) => {
      const chunk = plan[index]!
      const params = pointAt(curve, chunk.point).params
      return pointOps(estimatePointCost(params), chunk.count, params.trialsPerNetwork)
    })
    expect(work).toEqual([...work].sort((a, b) => b - a))
    // The cheapest, last, is the low-load end of the curve.
    expect(plan[order.at(-1)!]!.point).toBe(0)
    expect(work[0]! / work.at(-1)!).toBeGreaterThan(3)
  })
})

describe('computeChunk', () => {
  it('gives the same trials as the full run, whatever the chunk boundaries', () => {
    const middle = computeChunk(spec, { index: 99, point: 3, firstTrial: 4, count: 4 })
    expect(middle.point).toBe(3)
    expect(middle.chunk).toBe(99)
    expect(middle.trials).toEqual(reference.trials[3]!.slice(4, 8))
  })

  it('reports progress after each trial and stops between trials when asked', () => {
    const progress: number[] = []
    computeChunk(spec, { index: 0, point: 0, firstTrial: 0, count: 3 }, { onTrial: (done) => progress.push(done) })
    expect(progress).toEqual([1, 2, 3])
    let polls = 0
    const stop = () => ++polls > 2
    expect(() => computeChunk(spec, { index: 5, point: 1, firstTrial: 0, count: 9 }, { shouldStop: stop }))
      .toThrow(ChunkCanceledError)
    expect(polls).toBe(3)
  })

  it('refuses a chunk outside the grid', () => {
    expect(() => computeChunk(spec, { index: 0, point: 4, firstTrial: 0, count: 1 })).toThrow(RangeError)
    expect(() => computeChunk(spec, { index: 0, point: 0, firstTrial: 8, count: 2 })).toThrow(RangeError)
  })
})

describe('assembleResult', () => {
  it('aggregates each point in trial order, with values, params and theory', () => {
    expect(reference.rows).toHaveLength(4)
    const row = reference.rows[3]!
    expect(row.values).toEqual({ load: 0.15, 'cue.fraction': 0.3 })
    expect(row.params).toEqual({ alpha: 7 / 48, neurons: 48, patterns: 7 })
    expect(row.summary.trials).toBe(9)
    expect(row.summary.stability?.networks).toBe(3)
    expect(reference.trials[3]!.map((t) => t.trial)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8])
    expect(reference.specHash).toBe(provenance.specHash)
  })

  it('gives byte-identical JSON and CSV whatever the chunk order or chunking', () => {
    const bytes = (chunks: ChunkResult[]) => {
      const result = assembleResult(spec, chunks, provenance)
      return [true, false].flatMap((perTrial) => [resultToJson(result, { perTrial }), resultToCsv(result, { perTrial })])
    }
    const expected = bytes(fullRun)
    fc.assert(fc.property(fc.shuffledSubarray(fullRun, { minLength: fullRun.length }), (shuffled) => {
      expect(bytes(shuffled)).toEqual(expected)
    }), { numRuns: 20 })
    const fine = runAll(spec, singleTrialChunks(spec, 4)).reverse()
    expect(bytes(fine)).toEqual(expected)
  })

  it('accepts a chunk delivered twice but refuses missing or conflicting trials', () => {
    expect(resultToJson(assembleResult(spec, [...fullRun, fullRun[0]!], provenance), { perTrial: true }))
      .toBe(resultToJson(reference, { perTrial: true }))
    expect(() => assembleResult(spec, fullRun.slice(1), provenance)).toThrow(IncompleteResultError)
    const tampered: ChunkResult = { ...fullRun[0]!, trials: fullRun[0]!.trials.map((t) => ({ ...t, overlap: -t.overlap })) }
    expect(() => assembleResult(spec, [...fullRun, tampered], provenance)).toThrow(/twice with different content/)
  })

  it('refuses provenance made for another spec', () => {
    const other = makeProvenance(normaliseSpec({ neurons: 48, patterns: 2 }), runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 })
    expect(() => assembleResult(spec, fullRun, other)).toThrow(RangeError)
  })
})

describe('output', () => {
  it('writes canonical JSON, with trials only on request', () => {
    const json = resultToJson(reference, { perTrial: false })
    expect(json.endsWith('}\n')).toBe(true)
    const parsed = JSON.parse(json)
    expect(Object.keys(parsed)).toEqual(['provenance', 'rows', 'spec', 'specHash'])
    expect(parsed.spec.label).toBe('lobby and corridor rooms, small')
    expect(JSON.parse(resultToJson(reference, { perTrial: true })).trials).toHaveLength(4)
  })

  it('leaves the run timing out unless asked, so reruns give the same bytes', () => {
    const rerun = { ...reference, provenance: { ...reference.provenance, wallSeconds: 99, cpuSeconds: 42, workers: 7 } }
    expect(resultToJson(rerun, { perTrial: true })).toBe(resultToJson(reference, { perTrial: true }))
    const timed = JSON.parse(resultToJson(rerun, { perTrial: false, timing: true }))
    expect(timed.provenance).toMatchObject({ wallSeconds: 99, cpuSeconds: 42, workers: 7 })
    expect(JSON.parse(resultToJson(rerun, { perTrial: false })).provenance.wallSeconds).toBeUndefined()
  })

  it('writes one tidy CSV row per point, identity and every parameter first', () => {
    const csv = resultToCsv(reference, { perTrial: false, sweepId: 'sw_test' })
    const lines = csv.split('\r\n')
    expect(lines).toHaveLength(6)
    expect(lines.at(-1)).toBe('')
    const header = lines[0]!.split(',')
    expect(header.slice(0, 8)).toEqual(['sweepId', 'specHash', 'seed', 'point', 'neurons', 'patterns', 'load', 'inDegreeLoad'])
    expect(header).toEqual(expect.arrayContaining(['cue.fraction', 'alpha', 'trials', 'overlap.mean', 'success.rate', 'success.low', 'endStates.target', 'stability.unstableFraction']))
    expect(header.some((h) => h.startsWith('theory.'))).toBe(true)
    const cells = lines[4]!.split(',')
    const at = (name: string): string => cells[header.indexOf(name)]!
    expect([at('sweepId'), at('specHash'), at('seed'), at('point')]).toEqual(['sw_test', reference.specHash, String(reference.spec.seed), '3'])
    expect([at('load'), at('cue.fraction'), at('neurons'), at('patterns'), at('alpha'), at('trials')]).toEqual(['0.15', '0.3', '48', '7', String(Number((7 / 48).toPrecision(10))), '9'])
    expect(Number(at('success.count'))).toBe(reference.rows[3]!.summary.success.count)
  })

  it('writes one CSV row per trial on request', () => {
    const lines = resultToCsv(reference, { perTrial: true }).trimEnd().split('\r\n')
    expect(lines).toHaveLength(1 + 4 * 9)
    const header = lines[0]!.split(',')
    expect(header.slice(0, 4)).toEqual(['sweepId', 'specHash', 'seed', 'point'])
    expect(header.indexOf('trial')).toBe(header.indexOf('alphaK') + 1)
    const last = lines.at(-1)!.split(',')
    expect(last[header.indexOf('sweepId')]).toBe('')
    expect(last[header.indexOf('point')]).toBe('3')
    expect(last[header.indexOf('trial')]).toBe('8')
    const trial = reference.trials[3]![8]!
    expect(last[header.indexOf('overlap')]).toBe(String(trial.overlap))
    expect(last[header.indexOf('success')]).toBe(trial.overlap >= 0.9 ? '1' : '0')
  })

  it('states N and P once, where they stand in every table, when they are themselves varied', () => {
    const sizes = normaliseSpec({ neurons: { values: [20, 30] }, patterns: { values: [2, 3] }, trials: 2 })
    const result = assembleResult(sizes, runAll(sizes, planSweep(sizes).chunks), makeProvenance(sizes, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
    const header = resultToCsv(result, { perTrial: false }).split('\r\n')[0]!.split(',')
    expect(header.slice(3, 7)).toEqual(['point', 'neurons', 'patterns', 'load'])
    expect(header.filter((h) => h === 'neurons')).toHaveLength(1)
    const first = resultToCsv(result, { perTrial: true }).split('\r\n')[1]!.split(',')
    expect([first[3], first[4], first[5], first[header.indexOf('alpha')]]).toEqual(['0', '20', '2', '0.1'])
  })
})
