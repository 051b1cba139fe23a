/**
 * The module the API's rendering thread loads: turns a stored result (and its stored
 * chunks, for per-trial rows) into JSON, CSV or an SVG figure, and hashes the bytes for the
 * strong ETag. Everything heavy of a download happens here, so requests keep being answered
 * while a large result is rendered.
 */
import { createHash } from 'node:crypto'
import { FigureOptionsError, renderParsedFigure } from '../../figures/index.js'
import { figureBytes, MAX_PNG_PIXELS, pngSize } from '../../figure-files/index.js'
import { resultToCsv, resultToJson, trajectoryCsv, trajectoryJson, type SweepResult } from '../../results/index.js'
import { resultToArrow, trajectoryArrow } from '../../results/arrow-output.js'
import { assemblePartial, decodeValue, makeProvenance, storedTrials } from '../../sweep/index.js'
import { runtimeFacts } from '../../runtime/facts.js'
import type { EncodedResult } from '../../backends/port.js'
import { buildBundle } from './bundle.js'
import type { RenderOutcome, RenderSource, RenderTask } from './render-task.js'

export default async function render (task: RenderTask): Promise<RenderOutcome> {
  if (task.kind === 'bundle') {
    const { zip } = await buildBundle(decode(task.stored), task.record)
    return rendered(Buffer.from(zip.buffer, zip.byteOffset, zip.byteLength))
  }
  if (task.kind === 'result') {
    const result = read(task.source)
    if (task.format === 'arrow') {
      const bytes = task.series === 'trajectory' ? trajectoryArrow(result, task.sweepId) : resultToArrow(result, { perTrial: task.perTrial, sweepId: task.sweepId })
      return rendered(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength))
    }
    const text = task.series === 'trajectory'
      ? (task.format === 'csv' ? trajectoryCsv(result, task.sweepId) : trajectoryJson(result))
      : task.format === 'csv'
        ? resultToCsv(result, { perTrial: task.perTrial, sweepId: task.sweepId })
        : resultToJson(result, { perTrial: task.perTrial, timing: task.timing })
    return rendered(Buffer.from(text, 'utf8'))
  }
  let svg: string
  try {
    svg = renderParsedFigure(task.sources.map(read), task.options)
  } catch (error) {
    if (error instanceof FigureOptionsError) return { kind: 'figure-misfit', issues: error.issues }
    throw error
  }
  if (task.format === 'png') {
    const size = pngSize(svg, task.dpi)
    if (size.width * size.height > MAX_PNG_PIXELS) {
      return { kind: 'figure-misfit', issues: [{ path: 'dpi', message: `the PNG would be ${size.width} × ${size.height} px, more than the ${MAX_PNG_PIXELS / 1e6} Mpx allowed: choose a lower dpi or a smaller size` }] }
    }
  }
  return rendered(await figureBytes(svg, task.format, { dpi: task.dpi, title: /<title[^>]*>([^<]*)</.exec(svg)?.[1] }))
}

function read (source: RenderSource): SweepResult {
  if (source.kind === 'result') return decode(source.stored)
  const { spec, plan, chunks, openPoints } = source.progress
  return assemblePartial(spec, plan, chunks, openPoints, makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
}

/** The result with its trial records attached when they were sent (results stored by earlier releases hold them already). */
function decode (stored: EncodedResult): SweepResult {
  const result = decodeValue<SweepResult>(stored.result)
  if (stored.trials === null || result.trials.length > 0 || result.spec.analysis !== undefined) return result
  return { ...result, trials: storedTrials(result.spec, stored.trials.plan, stored.trials.chunks) }
}

function rendered (body: Buffer): RenderOutcome {
  return { kind: 'rendered', body: new Uint8Array(body.buffer, body.byteOffset, body.byteLength), etag: `"${createHash('sha256').update(body).digest('base64url')}"` }
}
