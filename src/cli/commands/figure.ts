/**
 * `memsweep figure results.json [more.json …] -o figure.svg`: draws results files (as `run`
 * writes them, or as downloaded from the API) as an SVG figure; several files are overlaid,
 * one series per sweep.
 */
import { readFile } from 'node:fs/promises'
import { FigureOptionsError, renderFigure, type FigureOptionsInput } from '../../figures/index.js'
import type { SweepResult } from '../../results/index.js'
import { CliError, EXIT, say, type CliIo } from '../io.js'
import { writeFileAtomically } from '../write-file.js'

export interface FigureCommandOptions {
  output: string
  measure?: string
  endState?: string
  x?: string
  series?: string
  xScale?: string
  yScale?: string
  errorBars?: string
  theory?: boolean
  width?: string
  height?: string
  column?: string
  widthMm?: string
  heightMm?: string
  fontSize?: string
  title?: string
  subtitle?: string
  footnote?: string
  hideTitle?: boolean
  hideSubtitle?: boolean
  hideFootnote?: boolean
  seriesName?: string[]
  sweepName?: string[]
}

/** The flag that sets each option, for error messages. */
const FLAGS: Record<string, string> = {
  measure: '--measure',
  endState: '--end-state',
  x: '--x',
  series: '--series',
  xScale: '--x-scale',
  yScale: '--y-scale',
  errorBars: '--error-bars',
  theory: '--no-theory',
  width: '--width',
  height: '--height',
  column: '--column',
  widthMm: '--width-mm',
  heightMm: '--height-mm',
  fontSize: '--font-size',
  title: '--title',
  subtitle: '--subtitle',
  footnote: '--footnote',
  showTitle: '--hide-title',
  showSubtitle: '--hide-subtitle',
  showFootnote: '--hide-footnote',
  seriesNames: '--series-name',
  sweepNames: '--sweep-name'
}

export async function figure (io: CliIo, files: readonly string[], options: FigureCommandOptions): Promise<number> {
  const results = await Promise.all(files.map(readResultFile))
  const { output, hideTitle, hideSubtitle, hideFootnote, seriesName, sweepName, ...rest } = options
  const figureOptions = Object.fromEntries(Object.entries({
    ...rest,
    showTitle: hideTitle === true ? false : undefined,
    showSubtitle: hideSubtitle === true ? false : undefined,
    showFootnote: hideFootnote === true ? false : undefined,
    seriesNames: seriesName?.join('|'),
    sweepNames: sweepName?.join('|')
  }).filter(([, v]) => v !== undefined)) as FigureOptionsInput
  let svg: string
  try {
    svg = renderFigure(results, figureOptions)
  } catch (error) {
    if (!(error instanceof FigureOptionsError)) throw error
    const lines = error.issues.map((i) => `  ${i.path === '' ? '(figure)' : FLAGS[i.path] ?? i.path}: ${i.message}`)
    throw new CliError(['The figure cannot be drawn:', ...lines].join('\n'), EXIT.refused)
  }
  if (output === '-') {
    io.stdout.write(svg)
    return EXIT.ok
  }
  await writeFileAtomically(output, svg)
  say(io, `Figure written to ${output}.`)
  return EXIT.ok
}

async function readResultFile (path: string): Promise<SweepResult> {
  let text: string
  try {
    text = await readFile(path, 'utf8')
  } catch (error) {
    throw new CliError(`Cannot read the results file ${path}: ${(error as Error).message}`, EXIT.refused)
  }
  let value: unknown
  try {
    value = JSON.parse(text)
  } catch {
    throw new CliError(`${path} is not JSON: figures are drawn from JSON results (memsweep run -o results.json, or GET /v1/sweeps/{id}/results).`, EXIT.refused)
  }
  const r = value as Partial<SweepResult> | null
  const looksRight = r !== null && typeof r === 'object' && Array.isArray(r.rows) && typeof r.spec === 'object' && r.spec !== null &&
    typeof r.specHash === 'string' && typeof r.provenance === 'object'
  if (!looksRight) throw new CliError(`${path} is not a memsweep result (it needs specHash, spec, rows and provenance).`, EXIT.refused)
  return value as SweepResult
}
