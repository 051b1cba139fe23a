/**
 * Figures of succeeded sweeps, drawn by src/figures as standalone SVG: one sweep, or several
 * overlaid (one series per sweep). The query is the figure options schema itself, so the
 * OpenAPI document lists every option. An option that is malformed on its own is a 400; one
 * that is well formed but does not fit the sweeps (an x one of them does not vary, …) is a 422;
 * both name the option.
 */
import { z } from 'zod'
import type { FastifyReply, FastifyRequest } from 'fastify'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { SWEEP_ID_PATTERN } from '../../backends/port.js'
import { ServiceError } from '../../errors.js'
import { FigureOptionsSchema, type FigureIssue } from '../../figures/index.js'
import { FIGURE_MEDIA_TYPES, PNG_DPI, type FigureFormat } from '../../figure-files/index.js'
import { gridAxes, type NormalisedSpec } from '../../spec/index.js'
import type { RenderSource } from '../render/render-task.js'
import { ifNoneMatchHits } from '../presenters.js'
import { fieldIssue, listedIssues } from '../problem-reply.js'
import { problemResponses } from '../schemas/problem.js'
import { SWEEP_ID_RULE, sweepIdSchema } from '../schemas/sweep.js'
import { succeededSweep, visibleSweep, type RouteContext } from './context.js'

interface Rendered { body: Buffer, etag: string }

/** Rendered figures kept, newest last, up to this many bytes: a page that redraws on every control change asks for the same few often. */
const CACHED_FIGURE_BYTES = 16 * 1024 * 1024

/** A figure is a document of its own: nothing in it may run or load anything. */
const SVG_POLICY = "default-src 'none'; style-src 'unsafe-inline'"

/** Most sweeps one overlay draws; more would not stay legible (and each is a full result in memory). */
export const MAX_OVERLAID_SWEEPS = 8

/** One id of the overlay's list: the sweep-id pattern without its anchors. */
const SWEEP_ID_LIST_ITEM = SWEEP_ID_PATTERN.source.slice(1, -1)

const overlayQuery = z.strictObject({
  sweeps: z.string().regex(new RegExp(`^${SWEEP_ID_LIST_ITEM}(,${SWEEP_ID_LIST_ITEM}){0,${MAX_OVERLAID_SWEEPS - 1}}$`), `1 to ${MAX_OVERLAID_SWEEPS} sweep ids separated by commas (${SWEEP_ID_RULE})`)
    .describe(`Ids of the succeeded sweeps to overlay, separated by commas (at most ${MAX_OVERLAID_SWEEPS}); series are labelled by each sweep's label.`),
  ...FigureOptionsSchema.shape
})

type FigureQuery = z.output<typeof FigureOptionsSchema>

const FIGURE_FORMATS = ['svg', 'png', 'pdf'] as const satisfies readonly FigureFormat[]

const FORMAT_WORDS: Record<FigureFormat, { name: string, suffix: string, about: string }> = {
  svg: { name: 'SVG', suffix: '', about: 'A standalone SVG document; every point carries its numbers as data-x, data-y, data-low, data-high attributes.' },
  png: { name: 'PNG', suffix: 'Png', about: 'The SVG figure drawn as PNG by resvg with the shipped typeface (Source Sans 3), the same pixels on every machine; dpi sets the resolution.' },
  pdf: { name: 'PDF', suffix: 'Pdf', about: 'The SVG figure as a vector PDF (pdfkit with svg-to-pdfkit) with the shipped typeface embedded; the page is the figure\'s size.' }
}

const dpiSchema = z.coerce.number().int().min(PNG_DPI.min).max(PNG_DPI.max).optional()
  .describe(`Resolution of the PNG in dots per inch (${PNG_DPI.min}–${PNG_DPI.max}). Default: ${PNG_DPI.print} for a size in mm; ${PNG_DPI.screen} for a size in px (2 pixels per px).`)

function figureResponses (format: FigureFormat) {
  const body = format === 'svg'
    ? z.string().describe('A standalone SVG document (UTF-8) with <title> and <desc>.')
    : z.string().describe(format === 'png' ? 'A PNG image.' : 'A PDF document.')
  return {
    200: {
      description: 'The figure.',
      content: { [FIGURE_MEDIA_TYPES[format].split(';')[0]!]: { schema: body } }
    },
    304: z.undefined().describe('Not modified: the ETag in If-None-Match is current.'),
    ...problemResponses(400, 401, 404, 409, 422, 429)
  }
}

function sendBytes (reply: FastifyReply, body: Buffer): FastifyReply {
  return reply.send(body)
}

/** Stability error bars are the spread over networks, read from the per-trial records. */
const MEASURES_FROM_TRIALS: ReadonlySet<string> = new Set(['unstableFraction', 'fixedPatternFraction'])

async function loadResult (ctx: RouteContext, id: string, measure: string): Promise<RenderSource> {
  const stored = await ctx.queue.encodedResult(id, { trials: MEASURES_FROM_TRIALS.has(measure) })
  if (stored === null) throw new Error(`sweep ${id} succeeded but the backend has no result for it`)
  return { kind: 'result', stored }
}

/** What an unfinished sweep stored so far: its figure shows the finished points. */
async function loadProgress (ctx: RouteContext, id: string): Promise<RenderSource> {
  const progress = await ctx.queue.storedProgress(id)
  if (progress === null) throw new ServiceError('MEMSWEEP_SWEEP_NOT_FOUND', { id })
  return { kind: 'partial', progress }
}

export const figureRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  const cache = new Map<string, Rendered>()
  let cachedBytes = 0

  for (const format of FIGURE_FORMATS) {
    const words = FORMAT_WORDS[format]
    const fileQuery = format === 'png' ? { dpi: dpiSchema } : {}
    app.get(`/v1/sweeps/:id/figure.${format}`, {
      schema: {
        operationId: `getSweepFigure${words.suffix}`,
        summary: `A figure of a succeeded sweep (${words.name})`,
        description: 'A measure against one varied parameter, one series per value of the others, 95 % error bars, theory overlaid where it applies, lines named at their ends or in a legend; readable in black and white (house style and options: docs/figures.md). ' +
          `${words.about} A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded; 400 naming the option when an option is malformed, 422 naming it when the options do not fit this sweep (for example an x it does not vary).`,
        tags: ['sweeps'],
        params: z.object({ id: sweepIdSchema }),
        querystring: FigureOptionsSchema.extend({
          ...fileQuery,
          partial: z.enum(['true', 'false']).optional().describe('true: for a sweep that has not succeeded, the figure of the points finished so far (drawn afresh each time, never cached). A succeeded sweep answers its full figure.')
        }),
        response: figureResponses(format)
      }
    }, async (request, reply) => {
      const { id } = request.params
      const { partial, dpi, ...options } = request.query as FigureQuery & { partial?: string, dpi?: number }
      const file = { format, dpi }
      if (partial === 'true') {
        const record = await visibleSweep(ctx.queue, request.principal, id)
        if (record.status !== 'succeeded') {
          refuseMisfit([record.spec], options)
          const rendered = await render(ctx, [await loadProgress(ctx, id)], options, file)
          reply.header('cache-control', 'no-store')
          return sendFigure(request, reply, rendered, format, `memsweep-${id}-${options.measure}-partial.${format}`, false)
        }
      }
      // Visibility is checked on every request; the result is only loaded when the figure is not cached.
      const record = await succeededSweep(ctx.queue, request.principal, id)
      refuseMisfit([record.spec], options)
      const rendered = await cached(`${id}\u0000${format}\u0000${dpi ?? ''}\u0000${optionsKey(options)}`, async () => await render(ctx, [await loadResult(ctx, id, options.measure)], options, file))
      return sendFigure(request, reply, rendered, format, `memsweep-${id}-${options.measure}.${format}`)
    })

    app.get(`/v1/figures/overlay.${format}`, {
      schema: {
        operationId: `getOverlayFigure${words.suffix}`,
        summary: `Several succeeded sweeps overlaid in one figure (${words.name})`,
        description: `The figure of /v1/sweeps/{id}/figure.${format} for up to ${MAX_OVERLAID_SWEEPS} sweeps at once: each sweep in its own colour, each combination of its other varied parameters with its own marker, named by the sweep label shortened (or sweepNames) and the parameter values; x must be varied by every sweep. For comparing, for example, two learning rules' capacity curves. 404 if any sweep is unknown, 409 if any has not succeeded, 422 naming the option if the options do not fit them.`,
        tags: ['sweeps'],
        querystring: overlayQuery.extend(fileQuery),
        response: figureResponses(format)
      }
    }, async (request, reply) => {
      const { sweeps, dpi, ...options } = request.query as FigureQuery & { sweeps: string, dpi?: number }
      const ids = sweeps.split(',')
      const specs: NormalisedSpec[] = []
      for (const id of ids) specs.push((await succeededSweep(ctx.queue, request.principal, id)).spec)
      refuseMisfit(specs, options)
      const rendered = await cached(`${ids.join(',')}\u0000${format}\u0000${dpi ?? ''}\u0000${optionsKey(options)}`, async () => {
        const sources: RenderSource[] = []
        for (const id of ids) sources.push(await loadResult(ctx, id, options.measure))
        return await render(ctx, sources, options, { format, dpi })
      })
      return sendFigure(request, reply, rendered, format, `memsweep-overlay-${options.measure}.${format}`)
    })
  }

  async function cached (key: string, draw: () => Promise<Rendered>): Promise<Rendered> {
    let rendered = cache.get(key)
    if (rendered === undefined) {
      rendered = await draw()
      cache.set(key, rendered)
      cachedBytes += rendered.body.length
      for (const [oldKey, old] of cache) {
        if (cachedBytes <= CACHED_FIGURE_BYTES) break
        cache.delete(oldKey)
        cachedBytes -= old.body.length
      }
    } else {
      cache.delete(key)
      cache.set(key, rendered)
    }
    return rendered
  }
}

function optionsKey (options: FigureQuery): string {
  return JSON.stringify(Object.entries(options).sort(([a], [b]) => a.localeCompare(b)))
}

function sendFigure (request: FastifyRequest, reply: FastifyReply, rendered: Rendered, format: FigureFormat, filename: string, immutable = true): FastifyReply {
  reply.header('etag', rendered.etag)
  if (immutable) reply.header('cache-control', 'private, max-age=86400, immutable')
  reply
    .header('content-security-policy', SVG_POLICY)
    .header('x-content-type-options', 'nosniff')
  if (ifNoneMatchHits(request.headers['if-none-match'], rendered.etag)) return reply.code(304).send()
  reply.header('content-disposition', `inline; filename="${filename}"`)
  return sendBytes(reply.type(FIGURE_MEDIA_TYPES[format]), rendered.body)
}

/** Draws the figure on the rendering thread; options that do not fit the sweeps are a 4xx naming each. */
async function render (ctx: RouteContext, sources: RenderSource[], options: FigureQuery, file: { format: FigureFormat, dpi: number | undefined }): Promise<Rendered> {
  const outcome = await ctx.render.render({ kind: 'figure', sources, options, format: file.format, dpi: file.dpi })
  if (outcome.kind === 'figure-misfit') misfit(outcome.issues)
  return { body: Buffer.from(outcome.body.buffer, outcome.body.byteOffset, outcome.body.byteLength), etag: outcome.etag }
}

/**
 * Refuses, before any result is loaded, options that cannot fit what the specs say: an x
 * that some sweep does not vary. (Everything else is checked where the figure is drawn.)
 */
function refuseMisfit (specs: readonly NormalisedSpec[], options: FigureQuery): void {
  if (options.x === undefined) return
  const missing = specs.filter((spec) => !gridAxes(spec).some((axis) => axis.path === options.x))
  if (missing.length > 0) misfit([{ path: 'x', message: `${specs.length === 1 ? 'this sweep' : `${missing.length} of the ${specs.length} sweeps`} does not vary '${options.x}'` }])
}

function misfit (issues: readonly FigureIssue[]): never {
  const errors = issues.map((issue) => ({
    ...fieldIssue(issue.path === '' ? [] : [issue.path], issue.message),
    path: issue.path === '' ? 'querystring' : `querystring.${issue.path}`
  }))
  const words = issues.map((issue) => (issue.path === '' ? issue.message : `${issue.path}: ${issue.message}`)).join('; ')
  throw new ServiceError('MEMSWEEP_FIGURE_OPTIONS_UNFIT', { issues: words }, { extensions: listedIssues(errors) })
}
