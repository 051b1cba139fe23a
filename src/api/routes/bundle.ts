/**
 * A succeeded sweep's supplementary-material bundle as one zip (members and README in
 * render/bundle.ts), built on the rendering thread. Its bytes depend on the sweep only (the
 * members are dated at its finishing time), so the ETag is stable; a label, tag or notes
 * edit changes the README and so the ETag.
 */
import { z } from 'zod'
import type { FastifyReply } from 'fastify'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { BUNDLE_MAX_TRIAL_ROWS, BUNDLE_MEMBERS } from '../render/bundle.js'
import { ifNoneMatchHits } from '../presenters.js'
import { problemResponses } from '../schemas/problem.js'
import { sweepIdSchema } from '../schemas/sweep.js'
import { succeededSweep, type RouteContext } from './context.js'

function sendBytes (reply: FastifyReply, body: Buffer): FastifyReply {
  return reply.send(body)
}

export const bundleRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  app.get('/v1/sweeps/:id/bundle.zip', {
    schema: {
      operationId: 'getSweepBundle',
      summary: 'Supplementary-material bundle of a succeeded sweep (zip)',
      description: `One zip with a folder \`memsweep-<id>/\` holding README.md (what each file is and how to reproduce the numbers with one command), ${BUNDLE_MEMBERS.map((member) => `\`${member.name}\``).join(', ')}. Files that do not apply to the sweep are left out and the README says why (per-trial rows above ${BUNDLE_MAX_TRIAL_ROWS.toLocaleString('en-US')} trials, trajectories the spec does not record, the figure of a threshold search). A strong ETag (sha256 of the bytes) supports If-None-Match → 304. 409 while the sweep has not succeeded.`,
      tags: ['sweeps'],
      params: z.object({ id: sweepIdSchema }),
      response: {
        200: {
          description: 'The bundle.',
          content: { 'application/zip': { schema: z.string().describe('A zip archive (deflate).') } }
        },
        304: z.undefined().describe('Not modified: the ETag in If-None-Match is current.'),
        ...problemResponses(401, 404, 409, 429)
      }
    }
  }, async (request, reply) => {
    const { id } = request.params
    const record = await succeededSweep(ctx.queue, request.principal, id)
    const withTrials = record.spec.analysis === undefined && record.progress.trialsTotal <= BUNDLE_MAX_TRIAL_ROWS
    const stored = await ctx.queue.encodedResult(id, { trials: withTrials })
    if (stored === null) throw new Error(`sweep ${id} succeeded but the backend has no result for it`)
    const outcome = await ctx.render.render({
      kind: 'bundle',
      stored,
      // Named one by one: a bundle is shared, so nothing else of the record (a callback URL) goes in.
      record: {
        id: record.id,
        label: record.label,
        owner: record.owner,
        specHash: record.specHash,
        createdAt: record.createdAt,
        startedAt: record.startedAt,
        finishedAt: record.finishedAt,
        extends: record.extends,
        reusedFrom: record.reusedFrom,
        reused: record.reused,
        tags: record.tags,
        notes: record.notes,
        serverUrl: `${request.protocol}://${request.host}`
      }
    })
    if (outcome.kind !== 'rendered') throw new Error(`bundling sweep ${id} answered ${outcome.kind}`)
    const body = Buffer.from(outcome.body.buffer, outcome.body.byteOffset, outcome.body.byteLength)
    reply.header('etag', outcome.etag).header('cache-control', 'private, no-cache')
    if (ifNoneMatchHits(request.headers['if-none-match'], outcome.etag)) return reply.code(304).send()
    reply.header('content-disposition', `attachment; filename="memsweep-${id}.zip"`)
    return sendBytes(reply.type('application/zip'), body)
  })
}
