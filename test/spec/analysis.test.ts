/** The analysis member of a spec: validation, normal form, chunks, assembly, output, determinism. */
import { deserialize, serialize } from 'node:v8'
import { describe, expect, it } from 'vitest'
import { canonicalJson, checkLimits, DEFAULT_LIMITS, estimateWork, normaliseSpec, specHash, SpecValidationError, WorkLimitError, type NormalisedSpec } from '../../src/spec/index.js'
import { assembleResult, ChunkCanceledError, IncompleteResultError, makeProvenance, planSweep, computeChunk, searchStreamPoint, SEARCH_STREAM_OFFSET, type ChunkResult } from '../../src/sweep/index.js'
import { resultToCsv, resultToJson } from '../../src/results/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

/** Two quick load searches at N = 60 and 120 (the outer grid), 40 trials per step. */
const SMALL = {
  label: 'test search',
  seed: 5,
  neurons: { values: [60, 120] },
  cue: { kind: 'flip', fraction: 0.05 },
  dynamics: { maxSweeps: 30 },
  trials: 40,
  analysis: { kind: 'threshold', parameter: 'load', from: 0.05, to: 0.4, maxSteps: 7 }
}

function issuesOf (input: unknown): Array<{ path: string, message: string }> {
  try {
    normaliseSpec(input)
  } catch (error) {
    if (error instanceof SpecValidationError) return error.issues
    throw error
  }
  throw new Error('expected a validation error')
}

function runAll (spec: NormalisedSpec): ChunkResult[] {
  return planSweep(spec).chunks.map((chunk) => computeChunk(spec, chunk))
}

const provenanceOf = (spec: NormalisedSpec) => makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 })

describe('analysis spec: normal form', () => {
  it('writes every default out, the tolerance as (to − from)/32, and is a fixed point', () => {
    const spec = normaliseSpec(SMALL)
    expect(spec.analysis).toEqual({
      kind: 'threshold',
      parameter: 'load',
      measure: 'success',
      level: 0.5,
      from: 0.05,
      to: 0.4,
      direction: 'decreasing',
      maxSteps: 7,
      tolerance: 0.0109375,
      confidence: 0.95,
      scaling: null
    })
    expect(spec.load).toBeUndefined()
    expect(spec.patterns).toBeUndefined()
    expect(normaliseSpec(JSON.parse(JSON.stringify(spec)))).toEqual(spec)
  })

  it('leaves grid specs and their hashes exactly as they were before analyses existed', () => {
    // Hashes recorded before the analysis member was added; a change here would orphan every
    // stored result. Format 2 changed what an unversioned spec means (end-state pattern
    // level), so these specs now say version 1, which keeps their meaning and their hash.
    expect(specHash(normaliseSpec({ version: 1, neurons: 100, patterns: 5 }))).toBe('0d93266e121c5a81783831ae360b1654c08bb10c0fd8b4d47a47a85d2684401a')
    const capacityGrid = {
      version: 1,
      label: 'grid',
      seed: 20260901,
      neurons: { values: [200, 400, 800] },
      load: { from: 0.02, to: 0.24, step: 0.02 },
      rule: { kind: 'hebbian' },
      cue: { kind: 'flip', fraction: 0.05 },
      dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50 },
      successThreshold: 0.9,
      trials: 100
    }
    const spec = normaliseSpec(capacityGrid)
    expect(specHash(spec)).toBe('015cd64fb29de398c0517e3f16747202dcd94275a4c8456bbfdd2825692cfbad')
    expect('analysis' in spec).toBe(false)
  })

  it('changes the hash with anything that changes the search', () => {
    const hash = specHash(normaliseSpec(SMALL))
    expect(specHash(normaliseSpec({ ...SMALL, analysis: { ...SMALL.analysis, level: 0.6 } }))).not.toBe(hash)
    expect(specHash(normaliseSpec({ ...SMALL, analysis: { ...SMALL.analysis, tolerance: 0.01 } }))).not.toBe(hash)
  })
})

describe('analysis spec: validation names the offending field', () => {
  it.each([
    [{ ...SMALL, load: 0.1 }, 'load', /searches the load/],
    [{ ...SMALL, analysis: { ...SMALL.analysis, to: 0.01 } }, 'analysis.to', /greater than from/],
    [{ ...SMALL, analysis: { ...SMALL.analysis, from: 0.001 } }, 'analysis.from', /rounds to 0 patterns/],
    [{ ...SMALL, analysis: { ...SMALL.analysis, tolerance: 1 } }, 'analysis.tolerance', /smaller than the range/],
    [{ ...SMALL, analysis: { ...SMALL.analysis, level: -0.2 } }, 'analysis.level', /strictly between 0 and 1/],
    [{ ...SMALL, analysis: { ...SMALL.analysis, maxSteps: 2 } }, 'analysis.maxSteps', /./],
    [{ ...SMALL, analysis: { ...SMALL.analysis, parameter: 'neurons' } }, 'analysis.parameter', /./],
    [{ ...SMALL, analysis: { ...SMALL.analysis, parameter: 'successThreshold' } }, 'analysis.parameter', /./],
    [{ ...SMALL, analysis: { ...SMALL.analysis, scaling: { form: 'power' } } }, 'analysis.scaling', /at least 4 sizes/],
    [{ ...SMALL, analysis: { ...SMALL.analysis, extra: 1 } }, 'analysis.extra', /unknown field/],
    [{ ...SMALL, rule: { kind: 'pseudo-inverse' }, analysis: { ...SMALL.analysis, to: 1.2 } }, 'analysis.to', /pseudo-inverse/],
    [{ neurons: 100, load: 0.1, cue: { kind: 'random' }, analysis: { kind: 'threshold', parameter: 'cue.fraction', from: 0, to: 0.5 } }, 'analysis.parameter', /cue kind flip or erase/],
    [{ neurons: 100, load: 0.1, cue: { kind: 'flip', fraction: { values: [0.1, 0.2] } }, analysis: { kind: 'threshold', parameter: 'cue.fraction', from: 0, to: 0.5 } }, 'cue.fraction', /cannot also be an axis/],
    [{ neurons: 100, load: 0.1, analysis: { kind: 'threshold', parameter: 'cue.fraction', from: 0, to: 1.5 } }, 'analysis.to', /above the allowed range/]
  ])('%#: %j → %s', (input, path, message) => {
    const issues = issuesOf(input)
    const issue = issues.find((i) => i.path === path)
    expect(issue, JSON.stringify(issues)).toBeDefined()
    expect(issue!.message).toMatch(message)
  })
})

describe('analysis spec: work and chunks', () => {
  it('plans one chunk per search, each counting the whole budget maxSteps × trials', () => {
    const spec = normaliseSpec(SMALL)
    expect(planSweep(spec).chunks).toEqual([
      { index: 0, point: 0, firstTrial: 0, count: 280 },
      { index: 1, point: 1, firstTrial: 0, count: 280 }
    ])
    const work = estimateWork(spec)
    expect(work).toMatchObject({ points: 2, trialsPerPoint: 280, trials: 560 })
    expect(() => checkLimits(spec, { ...DEFAULT_LIMITS, maxTrials: 500 })).toThrow(WorkLimitError)
  })

  it('keeps every step on its own stream, away from grid points', () => {
    expect(searchStreamPoint(0, 0)).toBe(SEARCH_STREAM_OFFSET)
    expect(searchStreamPoint(3, 7)).toBe(SEARCH_STREAM_OFFSET + 3007)
  })

  it('reports progress per trial, never beyond the budget, and cancels between trials', () => {
    const spec = normaliseSpec(SMALL)
    const chunk = planSweep(spec).chunks[0]!
    const seen: number[] = []
    const result = computeChunk(spec, chunk, { onTrial: (done) => seen.push(done) })
    expect(seen).toEqual(Array.from({ length: seen.length }, (_, i) => i + 1))
    expect(seen.length).toBe(result.search!.steps.length * spec.trials)
    expect(seen.length).toBeLessThanOrEqual(chunk.count)
    let polls = 0
    expect(() => computeChunk(spec, chunk, { shouldStop: () => ++polls > 50 })).toThrow(ChunkCanceledError)
    expect(() => computeChunk(spec, { ...chunk, count: 10 })).toThrow(RangeError)
  })
})

describe('analysis spec: assembly and output', () => {
  const spec = normaliseSpec(SMALL)
  const chunks = runAll(spec)

  it('gives identical payloads when a search chunk runs twice', () => {
    expect(canonicalJson(computeChunk(spec, planSweep(spec).chunks[1]!))).toBe(canonicalJson(chunks[1]))
  })

  it('is byte-identical whatever the arrival order and whether chunks travelled as JSON or V8 serialized', () => {
    const json = resultToJson(assembleResult(spec, chunks, provenanceOf(spec)), { perTrial: false })
    const viaJson = chunks.map((c) => JSON.parse(JSON.stringify(c)) as ChunkResult)
    const viaV8 = chunks.map((c) => deserialize(serialize(c)) as ChunkResult)
    expect(viaJson).toEqual(chunks)
    expect(resultToJson(assembleResult(spec, [...viaJson].reverse(), provenanceOf(spec)), { perTrial: false })).toBe(json)
    expect(resultToJson(assembleResult(spec, viaV8, provenanceOf(spec)), { perTrial: false })).toBe(json)
    // The same spec run again from scratch: the same bytes.
    expect(resultToJson(assembleResult(spec, runAll(normaliseSpec(SMALL)), provenanceOf(spec)), { perTrial: false })).toBe(json)
  })

  it('holds one search row per outer point with its steps, and no grid rows', () => {
    const result = assembleResult(spec, chunks, provenanceOf(spec))
    expect(result.rows).toEqual([])
    expect(result.searches!.map((s) => s.values)).toEqual([{ neurons: 60 }, { neurons: 120 }])
    for (const search of result.searches!) {
      expect(search.stepsUsed).toBe(search.steps.length)
      expect(search.trialsUsed).toBe(search.steps.length * 40)
      expect(search.steps[0]!.value).toBe(0.05)
      expect(search.steps[1]!.value).toBe(0.4)
      // Loads run are whole pattern counts.
      for (const step of search.steps) expect(step.value * search.neurons).toBeCloseTo(step.params.patterns, 9)
      expect(search.estimate).not.toBeNull()
      expect(search.low!).toBeLessThanOrEqual(search.estimate!)
      expect(search.high!).toBeGreaterThanOrEqual(search.estimate!)
    }
    expect(result.scaling).toBeUndefined()
  })

  it('refuses to assemble a missing, foreign or conflicting search', () => {
    expect(() => assembleResult(spec, chunks.slice(0, 1), provenanceOf(spec))).toThrow(IncompleteResultError)
    const { search: _search, ...bare } = chunks[0]!
    expect(() => assembleResult(spec, [bare, chunks[1]!], provenanceOf(spec))).toThrow(/no search result/)
    const altered = { ...chunks[1]!, search: { ...chunks[1]!.search!, estimate: 0.2 } }
    expect(() => assembleResult(spec, [...chunks, altered], provenanceOf(spec))).toThrow(/twice with different content/)
  })

  it('writes CSV with one row per search, or one per step with perTrial', () => {
    const result = assembleResult(spec, chunks, provenanceOf(spec))
    const perSearch = resultToCsv(result, { perTrial: false }).trimEnd().split('\r\n')
    const header = perSearch[0]!.split(',')
    expect(header.slice(0, 6)).toEqual(['sweepId', 'specHash', 'seed', 'search', 'neurons', 'patterns'])
    expect(header.slice(header.indexOf('alphaK') + 1)).toEqual(['parameter', 'measure', 'level', 'estimate', 'low', 'high', 'confidence', 'stoppedBy', 'bracket.low', 'bracket.high', 'steps', 'trials', 'fit.method', 'fit.slope', 'fit.dispersion', 'fit.separated', 'note'])
    expect(perSearch).toHaveLength(3)
    const first = perSearch[1]!.split(',')
    const at = (name: string): string => first[header.indexOf(name)]!
    expect([at('search'), at('neurons'), at('patterns'), at('load'), at('parameter'), at('measure'), at('level')]).toEqual(['0', '60', '', '', 'load', 'success', '0.5'])
    expect(Number(at('estimate'))).toBeCloseTo(result.searches![0]!.estimate!, 9)
    const perStep = resultToCsv(result, { perTrial: true }).trimEnd().split('\r\n')
    const stepHeader = perStep[0]!.split(',')
    expect(stepHeader.slice(0, 7)).toEqual(['sweepId', 'specHash', 'seed', 'search', 'step', 'neurons', 'patterns'])
    expect(stepHeader.slice(stepHeader.indexOf('alphaK') + 1, stepHeader.indexOf('alphaK') + 4)).toEqual(['side', 'trials', 'overlap.mean'])
    const step = perStep[1]!.split(',')
    expect(Number(step[stepHeader.indexOf('load')])).toBeCloseTo(result.searches![0]!.steps[0]!.value, 9)
    expect(perStep).toHaveLength(1 + result.searches!.reduce((n, s) => n + s.steps.length, 0))
    const json = JSON.parse(resultToJson(result, { perTrial: true })) as { trials: unknown[], searches: unknown[] }
    expect(json.trials).toEqual([])
    expect(json.searches).toHaveLength(2)
  })
})
