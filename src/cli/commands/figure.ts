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
import { figureBytes, MAX_PNG_PIXELS, PNG_DPI, pngSize, type FigureFormat } from '../../figure-files/index.js'

/** The format asked for, or the one the output file's extension names (SVG by default). */
function fileFormat (output: string, flag: string | undefined): FigureFormat {
  if (flag !== undefined) {
    if (flag === 'svg' || flag === 'png' || flag === 'pdf') return flag
    throw new CliError('--format: svg, png or pdf', EXIT.refused)
  }
  const extension = /\.([a-z]+)$/i.exec(output)?.[1]?.toLowerCase()
  return extension === 'png' || extension === 'pdf' ? extension : 'svg'
}

export interface FigureCommandOptions {
  output: string
  format?: string
  dpi?: string
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
  const { output, format: formatFlag, dpi: dpiFlag, hideTitle, hideSubtitle, hideFootnote, seriesName, sweepName, ...rest } = options
  const format = fileFormat(output, formatFlag)
  const dpi = dpiFlag === undefined ? undefined : Number(dpiFlag)
  if (dpi !== undefined && !(Number.isInteger(dpi) && dpi >= PNG_DPI.min && dpi <= PNG_DPI.max)) {
    throw new CliError(`--dpi: a whole number from ${PNG_DPI.min} to ${PNG_DPI.max}`, EXIT.refused)
  }
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
  if (format === 'png') {
    const size = pngSize(svg, dpi)
    if (size.width * size.height > MAX_PNG_PIXELS) throw new CliError(`--dpi: the PNG would be ${size.width} × ${size.height} px, more than the ${MAX_PNG_PIXELS / 1e6} Mpx allowed`, EXIT.refused)
  }
  const bytes = await figureBytes(svg, format, { dpi, title: /<title[^>]*>([^<]*)</.exec(svg)?.[1] })
  if (output === '-') {
    io.stdout.write(format === 'svg' ? svg : bytes)
    return EXIT.ok
  }
  await writeFileAtomically(output, bytes)
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
