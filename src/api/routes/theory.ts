/** Theory-only evaluation: mean-field and exact-combinatorics values at a spec's grid points, no simulation. */
import { setImmediate as yieldToEventLoop } from 'node:timers/promises'
import { z } from 'zod'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { theoryForPoint } from '../../engine/index.js'
import { countPoints, normaliseSpec, pointAt, specHash, SweepSpecSchema, WorkLimitError } from '../../spec/index.js'
import { problemResponses } from '../schemas/problem.js'
import { specBodyValidator, type RouteContext } from './context.js'

const POINTS_PER_SLICE = 64

const theoryPointSchema = z.object({
  point: z.number().int().describe('Grid point index (the last axis varies fastest).'),
  values: z.record(z.string(), z.number()).describe('The varied parameters at this point, by path.'),
  params: z.object({
    neurons: z.number().int(),
    patterns: z.number().int(),
    alpha: z.number().describe('The realised load P/N.')
  }),
  theory: z.record(z.string(), z.number()).describe('Theory values that apply at this point, by name (e.g. criticalLoad, retrievalOverlapRS, crosstalkErrorExact); {} when no theory covers it.')
})

const theoryResultSchema = z.object({
  specHash: z.string(),
  points: z.array(theoryPointSchema)
}).meta({ id: 'TheoryEvaluation' })

export const theoryRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  app.post('/v1/theory', {
    validatorCompiler: specBodyValidator,
    schema: {
      operationId: 'evaluateTheory',
      summary: 'Theory values at every grid point of a spec, without simulating',
      description: 'Which values exist depends on the model: e.g. Hebbian ±1 networks with unbiased patterns get the replica-symmetric critical load and retrieval overlap, the one-step crosstalk error, first-step overlaps for parallel dynamics; the pseudo-inverse rule gets its critical load. Trials, seeds and measures in the spec are ignored.',
      tags: ['theory'],
      body: SweepSpecSchema,
      response: { 200: theoryResultSchema.describe('Theory values at every grid point.'), ...problemResponses(400, 401, 413, 415, 422, 429) }
    }
  }, async (request) => {
    const spec = normaliseSpec(request.body)
    const points = countPoints(spec)
    // Theory is cheap per point, but the grid-point limit still bounds the answer's size.
    if (points > ctx.limits.maxPoints) throw new WorkLimitError('maxPoints', points, ctx.limits.maxPoints)
    const rows = []
    for (let index = 0; index < points; index++) {
      // Up to ~0.4 ms a point: yield now and then so one large grid never stalls other requests.
      if (index > 0 && index % POINTS_PER_SLICE === 0) await yieldToEventLoop()
      const { values, params } = pointAt(spec, index)
      rows.push({
        point: index,
        values,
        params: { neurons: params.neurons, patterns: params.patterns, alpha: params.patterns / params.neurons },
        theory: theoryForPoint(params)
      })
    }
    return { specHash: specHash(spec), points: rows }
  })
}
