/**
 * The page's pure modules, run in Node: the event-stream parser, spec paths and error
 * placement, routes, axis ticks and curves, and the number formats.
 */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { curvesOf, extentOf, linearTicks, logTicks, measureAt, thumbnailOf } from '../../web/src/curves.js'
import { rerunLabel } from '../../web/src/labels.js'
import { EventStreamParser } from '../../web/src/event-stream.js'
import { formatBytes, formatDuration, formatPercent, formatValue } from '../../web/src/format.js'
import { modelLine, rangeText } from '../../web/src/model-line.js'
import { parseRoute, routeHref, type Route } from '../../web/src/router.js'
import { theoryKind, theoryName, theoryTooltip } from '../../web/src/theory-names.js'
import { assignIssues, axisModeOf, convertAxis, getAt, lineAndColumn, lineOfPath, parseList, parseNumber, setAt } from '../../web/src/spec-paths.js'
import type { ResultRow, SweepResult } from '../../web/src/types.js'

describe('EventStreamParser', () => {
  it('parses the service\'s stream: retry, ids, named events, heartbeats', () => {
    const parser = new EventStreamParser()
    const text = 'retry: 3000\n\nid: 1\nevent: snapshot\ndata: {"a":1}\n\n: ping\n\nid: 2\nevent: progress\ndata: {"a":2}\n\n'
    expect(parser.push(text)).toEqual([
      { event: 'snapshot', data: '{"a":1}', id: '1' },
      { event: 'progress', data: '{"a":2}', id: '2' }
    ])
    expect(parser.retry).toBe(3000)
    expect(parser.lastId).toBe('2')
  })

  it('gives the same events however the bytes are cut, with any line ending', () => {
    const stream = 'event: state\r\ndata: line one\r\ndata: line two\r\n\r\ndata:no space\n\nid: 7\rdata: cr only\r\r'
    const whole = new EventStreamParser().push(stream)
    expect(whole).toEqual([
      { event: 'state', data: 'line one\nline two', id: null },
      { event: 'message', data: 'no space', id: null },
      { event: 'message', data: 'cr only', id: '7' }
    ])
    for (let size = 1; size <= 5; size++) {
      const parser = new EventStreamParser()
      const events = []
      for (let i = 0; i < stream.length; i += size) events.push(...parser.push(stream.slice(i, i + size)))
      expect(events, `chunks of ${size}`).toEqual(whole)
    }
  })

  it('keeps an unfinished event until its blank line arrives, and drops events without data', () => {
    const parser = new EventStreamParser()
    expect(parser.push('event: progress\ndata: {"x":1}\n')).toEqual([])
    expect(parser.push('\nevent: lonely\n\n')).toEqual([{ event: 'progress', data: '{"x":1}', id: null }])
  })
})

describe('spec paths', () => {
  it('reads and writes nested fields, and removing one leaves no empty objects behind', () => {
    const spec: Record<string, unknown> = { cue: { kind: 'flip' } }
    setAt(spec, 'cue.fraction', 0.2)
    setAt(spec, 'dynamics.temperature', 0.5)
    expect(spec).toEqual({ cue: { kind: 'flip', fraction: 0.2 }, dynamics: { temperature: 0.5 } })
    expect(getAt(spec, 'cue.fraction')).toBe(0.2)
    expect(getAt(spec, 'cue.fraction.deeper')).toBeUndefined()
    setAt(spec, 'dynamics.temperature', undefined)
    setAt(spec, 'measures.stability', undefined)
    expect(spec).toEqual({ cue: { kind: 'flip', fraction: 0.2 } })
  })

  it('puts each error at the closest field that shows it, and keeps the rest apart', () => {
    const { byField, others } = assignIssues([
      { path: 'load', pointer: '/load', message: 'a generated axis needs exactly one of \'step\' or \'count\'' },
      { path: 'cue.fraction', pointer: '/cue/fraction', message: 'Too big: expected number to be <=1' },
      { path: 'load.values.2', pointer: '/load/values/2', message: 'expected number' },
      { path: 'family.data.3.17', pointer: '/family/data/3/17', message: 'must be -1 or 1' },
      { path: '', pointer: '', message: 'unknown field \'colour\'' }
    ], ['load', 'cue', 'cue.fraction', 'neurons'])
    expect(Object.fromEntries(byField)).toEqual({
      load: ['a generated axis needs exactly one of \'step\' or \'count\'', 'values.2: expected number'],
      'cue.fraction': ['Too big: expected number to be <=1']
    })
    expect(others.map((o) => o.path)).toEqual(['family.data.3.17', ''])
  })

  it('reads typed numbers and lists, passing non-numbers on for the server to name', () => {
    expect(parseNumber(' 0.25 ')).toBe(0.25)
    expect(parseNumber('')).toBeUndefined()
    expect(parseNumber('1e-3')).toBe(0.001)
    expect(parseNumber('0,25')).toBe('0,25')
    expect(parseList('200, 400;800  1600')).toEqual([200, 400, 800, 1600])
    expect(parseList('0.1, abc')).toEqual([0.1, 'abc'])
  })

  it('tells the axis forms apart and carries values between them', () => {
    expect(axisModeOf(0.1)).toBe('single')
    expect(axisModeOf({ values: [1, 2] })).toBe('list')
    expect(axisModeOf({ from: 0.02, to: 0.24, step: 0.02 })).toBe('step')
    expect(axisModeOf({ from: 100, to: 1600, count: 5, scale: 'log' })).toBe('count')
    expect(convertAxis({ values: [200, 400, 800] }, 'step')).toEqual({ from: 200, to: 800 })
    expect(convertAxis({ from: 0.02, to: 0.24, step: 0.02 }, 'count')).toEqual({ from: 0.02, to: 0.24, count: 2 })
    expect(convertAxis({ from: 100, to: 1600, count: 5, scale: 'log' }, 'list')).toEqual({ values: [100, 1600] })
    expect(convertAxis(0.5, 'list')).toEqual({ values: [0.5] })
    expect(convertAxis({ values: [3, 4] }, 'single')).toBe(3)
  })

  it('finds the line of a path in a JSON text, for errors in the JSON view', () => {
    const text = JSON.stringify({ label: 'x', neurons: { values: [200, 400] }, cue: { kind: 'flip', fraction: 1.5 }, family: { kind: 'supplied', data: [[1, -1], [1, 0]] } }, null, 2)
    const lines = text.split('\n')
    const lineWith = (needle: string): number => lines.findIndex((l) => l.includes(needle)) + 1
    expect(lineOfPath(text, 'cue.fraction')).toBe(lineWith('"fraction"'))
    expect(lineOfPath(text, 'cue')).toBe(lineWith('"cue"'))
    expect(lineOfPath(text, 'neurons.values.1')).toBe(lineWith('400'))
    expect(lineOfPath(text, 'family.data.1.1')).toBe(lineWith(' 0'))
    expect(lineOfPath(text, 'label')).toBe(2)
    expect(lineOfPath(text, 'dynamics')).toBeNull()
    expect(lineOfPath(text, '')).toBe(1)
    expect(lineAndColumn('{\n  "a": ,\n}', 9)).toEqual({ line: 2, column: 8 })
  })
})

describe('routes', () => {
  it('reads every page from the fragment and writes it back', () => {
    const routes: Route[] = [
      { page: 'list' },
      { page: 'list', tag: 'west wing', q: 'draft 2' },
      { page: 'list', replicatesOf: 'a1b2-c3' },
      { page: 'sweep', id: 'a1b2-c3' },
      { page: 'submit', from: null },
      { page: 'submit', from: 'room-capacity' },
      { page: 'compare', ids: ['a', 'b', 'c'] },
      { page: 'compare', ids: [] }
    ]
    for (const route of routes) expect(parseRoute(routeHref(route))).toEqual(route)
    expect(parseRoute('')).toEqual({ page: 'list' })
    expect(parseRoute('#/compare?ids=a,,b,a')).toEqual({ page: 'compare', ids: ['a', 'b'] })
    expect(parseRoute('#/elsewhere')).toEqual({ page: 'missing', hash: '/elsewhere' })
  })
})

function row (values: Record<string, number>, rate: number, overlap: number): ResultRow {
  return {
    point: 0,
    values,
    params: { alpha: values.load ?? 0.1, neurons: values.neurons ?? 100, patterns: 10 },
    summary: {
      trials: 10,
      overlap: { mean: overlap, sd: 0.1, se: 0.02 },
      success: { count: Math.round(rate * 10), rate, low: Math.max(0, rate - 0.1), high: Math.min(1, rate + 0.1) },
      sweeps: { mean: 3, sd: 1, se: 0.3 },
      maxOtherOverlap: { mean: 0.1, sd: 0.05, se: 0.01 },
      energy: { mean: -0.5, sd: 0.02, se: 0.006 },
      endings: { fixed: 10, cycle2: 0, max: 0, sampled: 0 },
      endStates: { target: 7, reversed: 0, otherPattern: 3, symmetricMixture: 0, partialTarget: 0, spurious: 0, spinGlass: 0 },
      stability: null
    },
    theory: {},
    theoryUnavailable: {}
  }
}

/** The provenance every result carries; the curves never read it. */
const PROVENANCE: SweepResult['provenance'] = { specHash: 'h', engineVersion: '0.0.0', node: 'v20', v8: '11', rng: 'test', pointKeying: 'test', tieRule: 'keep' }

describe('what the list shows of a sweep', () => {
  it('writes the model in one line: size, rule, load range, cue, other axes, trials', () => {
    const spec = {
      version: 2,
      coding: 'pm1',
      neurons: { values: [200, 400, 800] },
      load: { values: [0.02, 0.04, 0.06, 0.24] },
      rule: { kind: 'hebbian', selfCoupling: false },
      cue: { kind: 'flip', fraction: 0.05 },
      dynamics: { update: 'async-random', temperature: 0, maxSweeps: 50, burnIn: 0 },
      trials: 100,
      seed: 7
    }
    expect(modelLine(spec)).toBe('N 200–800 (3) · Hebbian · α 0.02–0.24 (4) · cue 5 % flipped · 100 trials')
    // A precision target: the trials are a range (first block to ceiling) and the target is named.
    expect(modelLine({ ...spec, trials: 480, precision: { measure: 'success', halfWidth: 0.05, block: 60 } })).toBe('N 200–800 (3) · Hebbian · α 0.02–0.24 (4) · cue 5 % flipped · 60–480 trials to success ± 0.05')
    const noisy = { ...spec, neurons: 500, rule: { kind: 'storkey' }, cue: { kind: 'flip', fraction: { values: [0, 0.1, 0.2] } }, dynamics: { temperature: 0.2 }, load: 0.1, trials: 2000 }
    expect(modelLine(noisy)).toBe('N 500 · Storkey · α 0.1 · cue 0–0.2 (3) flip · T 0.2 · 2,000 trials')
    expect(rangeText(['hebbian', 'storkey'])).toBe('hebbian / storkey')
  })

  it('labels a re-run with its seed, replacing an earlier seed note of either form', () => {
    expect(rerunLabel('West wing', 8)).toBe('West wing (seed 8)')
    expect(rerunLabel('West wing (seed 8)', 12)).toBe('West wing (seed 12)')
    expect(rerunLabel('West wing · seed 8', 12)).toBe('West wing (seed 12)')
    expect(rerunLabel(null, 3)).toBe('Untitled sweep (seed 3)')
  })

  it('draws the thumbnail along the axis with the most values, one line per other value, x ascending', () => {
    const rows = [0.2, 0.1, 0.3].flatMap((load) => [100, 200].map((neurons) => row({ neurons, load }, 1 - load, 0.9)))
    const thumb = thumbnailOf({ rows } as unknown as SweepResult)
    expect(thumb).toMatchObject({ x: 'load', xMin: 0.1, xMax: 0.3 })
    expect(thumb?.lines).toHaveLength(2)
    expect(thumb?.lines[0]?.map(([x]) => x)).toEqual([0.1, 0.2, 0.3])
    expect(thumbnailOf({ rows: rows.slice(0, 1) } as unknown as SweepResult)).toBeNull()
  })
})

describe('theory column names', () => {
  it('reads theory names and says which theory each is', () => {
    expect(theoryName('criticalLoad')).toBe('critical load α_c')
    expect(theoryName('crosstalkErrorExactTiesRandom')).toBe('bit error, ties random')
    expect(theoryName('dilutedFirstStepOverlapExactTiesKeep')).toBe('diluted overlap after one step, ties kept')
    expect(theoryName('someNewValue')).toBe('some new value')
    expect(theoryKind('retrievalOverlapRS')).toBe('mean-field')
    expect(theoryKind('firstStepOverlapExactTiesRandom')).toBe('exact finite-N')
    expect(theoryKind('loadAlpha')).toBe('definition')
    expect(theoryTooltip('crosstalkErrorExact')).toMatch(/^Exact at this point's finite N/)
  })
})

describe('curves', () => {
  const result = (rows: ResultRow[]): SweepResult => ({ specHash: 'h', spec: {}, rows, provenance: PROVENANCE })

  it('reads each measure with its error bar', () => {
    const r = row({ load: 0.1 }, 0.8, 0.9)
    expect(measureAt(r, 'success')).toEqual({ y: 0.8, low: 0.7000000000000001, high: 0.9 })
    expect(measureAt(r, 'overlap')).toEqual({ y: 0.9, low: 0.88, high: 0.92 })
    expect(measureAt(r, 'endState')).toEqual({ y: 0.7, low: null, high: null })
    expect(measureAt(r, 'unstableFraction')).toBeNull()
  })

  it('makes one curve per sweep and per value of its other varied parameters, x ascending', () => {
    const a = result([row({ neurons: 100, load: 0.2 }, 0.5, 0.7), row({ neurons: 100, load: 0.1 }, 1, 1), row({ neurons: 200, load: 0.1 }, 1, 1)])
    const b = result([row({ load: 0.1 }, 0.9, 0.95), row({ load: 0.2 }, 0.3, 0.6)])
    const c = result([row({ neurons: 100 }, 1, 1)])
    const curves = curvesOf([{ name: 'Hebbian', result: a }, { name: 'Storkey', result: b }, { name: 'no load axis', result: c }], 'success', 'load')
    expect(curves.map((curve) => curve.name)).toEqual(['Hebbian · network size N 100', 'Hebbian · network size N 200', 'Storkey'])
    expect(curves[0]?.points.map((p) => [p.x, p.y])).toEqual([[0.1, 1], [0.2, 0.5]])
    expect(extentOf(curves, 'x')).toEqual([0.1, 0.2])
  })

  it('chooses round ticks', () => {
    expect(linearTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1])
    expect(linearTicks(0.02, 0.24, 5)).toEqual([0.05, 0.1, 0.15, 0.2])
    expect(linearTicks(3, 3)).toEqual([3])
    expect(logTicks(100, 1600)).toEqual([100, 1000])
    expect(logTicks(2, 9)).toEqual([2, 5])
    expect(logTicks(0, 9)).toEqual([])
  })
})

describe('formats', () => {
  it('writes values, sizes, durations and shares as people read them', () => {
    expect(formatValue(0.912345)).toBe('0.912')
    expect(formatValue(null)).toBe('–')
    expect(formatValue(1)).toBe('1')
    expect(formatBytes(324_608)).toBe('317 KiB')
    expect(formatBytes(3 * 1024 ** 3)).toBe('3.0 GiB')
    expect(formatDuration(0.42)).toBe('0.4 s')
    expect(formatDuration(185)).toBe('3 min 05 s')
    expect(formatDuration(2 * 3600 + 600)).toBe('2 h 10 min')
    expect(formatPercent(0.999)).toBe('99 %')
    expect(formatPercent(1)).toBe('100 %')
  })
})

describe('colours of style.css', () => {
  // WCAG 2.x relative luminance and contrast ratio; 4.5:1 is the level for body text (1.4.3).
  const luminance = (hex: string): number => {
    const [r, g, b] = [0, 2, 4].map((i) => parseInt(hex.slice(1 + i, 3 + i), 16) / 255).map((c) => c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4) as [number, number, number]
    return 0.2126 * r + 0.7152 * g + 0.0722 * b
  }
  const contrast = (a: string, b: string): number => {
    const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number]
    return (hi + 0.05) / (lo + 0.05)
  }

  it('keep text at 4.5:1 or more against its ground', () => {
    const css = readFileSync(new URL('../../web/static/style.css', import.meta.url), 'utf8')
    const vars = Object.fromEntries([...css.matchAll(/--([\w-]+):\s*(#[0-9a-f]{6});/gi)].map((m) => [m[1] as string, m[2] as string]))
    const pairs: Array<[string, string]> = [
      ['ink', 'ground'], ['ink-soft', 'ground'], ['ink-soft', 'surface'], ['action', 'surface'], ['action', 'ground'],
      ['action', 'action-tint'], ['bad', 'bad-tint'], ['bad', 'surface'], ['good', 'good-tint'], ['wait', 'wait-tint'],
      ['stop', 'stop-tint'], ['mast-ink', 'mast']
    ]
    for (const [text, ground] of pairs) {
      expect(vars[text], text).toMatch(/^#/)
      expect(vars[ground], ground).toMatch(/^#/)
      expect(contrast(vars[text] as string, vars[ground] as string), `${text} on ${ground}`).toBeGreaterThanOrEqual(4.5)
    }
    // Focus rings and bars are not text: 3:1 (1.4.11).
    expect(contrast(vars.focus as string, vars.ground as string)).toBeGreaterThanOrEqual(3)
  })
})
