/**
 * Small sweeps run in this process, and the SVG parsed back into a DOM so tests read what
 * was drawn. Scenario: population codes of rooms stored in a model place-cell network.
 */
import { DOMParser, type Document, type Element } from '@xmldom/xmldom'
import { normaliseSpec } from '../../src/spec/index.js'
import { assembleResult, makeProvenance, planSweep, computeChunk } from '../../src/sweep/index.js'
import { type SweepResult } from '../../src/results/index.js'
import { runtimeFacts } from '../../src/runtime/facts.js'

/** Runs a spec through the same chunk → assemble path every backend uses. */
export function runSweep (raw: Record<string, unknown>): SweepResult {
  const spec = normaliseSpec(raw)
  const chunks = planSweep(spec).chunks.map((chunk) => computeChunk(spec, chunk))
  return assembleResult(spec, chunks, makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
}

/** Parses the SVG; any XML error (unescaped text, bad nesting) fails the test. */
export function parseSvg (svg: string): Document {
  return new DOMParser({ onError: (level, message) => { if (level !== 'warning') throw new Error(`SVG is not well-formed XML: ${message}`) } })
    .parseFromString(svg, 'image/svg+xml')
}

export function byClass (doc: Document, className: string, tag = '*'): Element[] {
  return Array.from(doc.getElementsByTagName(tag)).filter((el) => (el.getAttribute('class') ?? '').split(' ').includes(className))
}

export function num (el: Element, name: string): number {
  const value = el.getAttribute(name)
  if (value === null) throw new Error(`<${el.tagName} class="${el.getAttribute('class') ?? ''}"> has no ${name}`)
  return Number(value)
}

export interface DrawnPoint {
  series: number
  sweep: number
  point: number
  x: number
  y: number
  low: number | null
  high: number | null
  n: number
  cx: number
  cy: number
  bar: { y1: number, y2: number } | null
}

export function drawnPoints (doc: Document): DrawnPoint[] {
  return byClass(doc, 'point', 'g').map((g) => {
    const bar = byClass(g as unknown as Document, 'error-bar', 'g')[0]
    return {
      series: num(g, 'data-series'),
      sweep: num(g, 'data-sweep'),
      point: num(g, 'data-point'),
      x: num(g, 'data-x'),
      y: num(g, 'data-y'),
      low: g.getAttribute('data-low') === null ? null : num(g, 'data-low'),
      high: g.getAttribute('data-high') === null ? null : num(g, 'data-high'),
      n: num(g, 'data-n'),
      cx: num(g, 'data-cx'),
      cy: num(g, 'data-cy'),
      bar: bar === undefined ? null : { y1: num(bar, 'data-y1'), y2: num(bar, 'data-y2') }
    }
  })
}

/** The labelled ticks of an axis ('x-axis' or 'y-axis'): value and pixel position. */
export function axisTicks (doc: Document, axis: 'x-axis' | 'y-axis'): Array<{ value: number, at: number }> {
  const group = byClass(doc, axis, 'g')[0]
  if (group === undefined) throw new Error(`no ${axis}`)
  return byClass(group as unknown as Document, 'tick', 'g').map((tick) => {
    const line = tick.getElementsByTagName('line')[0]!
    return { value: num(tick, 'data-value'), at: num(line, axis === 'x-axis' ? 'x1' : 'y1') }
  })
}

/** The note under the plot, its wrapped lines joined again. */
export function noteText (doc: Document): string {
  const note = byClass(doc, 'note', 'g')[0]
  return note === undefined ? '' : Array.from(note.getElementsByTagName('text')).map((t) => t.textContent).join(' ')
}
