/** Theory-only evaluation: mean-field and exact-combinatorics values at a spec's grid points, no simulation. */
import { setImmediate as yieldToEventLoop } from 'node:timers/promises'
import { z } from 'zod'
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod'
import { theoryForPoint } from '../../engine/index.js'
import { checkLimits, countPoints, normaliseSpec, pointsToCheck, specHash, SweepSpecSchema } from '../../spec/index.js'
import { problemResponses } from '../schemas/problem.js'
import { axisValuesSchema, theoryUnavailableSchema } from '../schemas/result.js'
import { specBodyValidator, type RouteContext } from './context.js'

const theoryPointSchema = z.object({
  point: z.number().int().describe('Grid point index (the last axis varies fastest). For an analysis: the search, i.e. the point of the grid of the other varied parameters.'),
  end: z.enum(['from', 'to']).optional().describe('Analysis specs only: the end of the searched range this row is evaluated at (its realised value is in `values` under the searched parameter). Every step of the search lies between the two ends.'),
  values: axisValuesSchema,
  params: z.object({
    neurons: z.number().int(),
    patterns: z.number().int(),
    alpha: z.number().describe('The realised load P/N.')
  }),
  theory: z.record(z.string(), z.number()).describe('Theory values that hold at this point, by name (e.g. criticalLoad, retrievalOverlapRS, crosstalkErrorExact); {} when none does.'),
  theoryUnavailable: theoryUnavailableSchema
})

const theoryResultSchema = z.object({
  specHash: z.string(),
  points: z.array(theoryPointSchema).describe('One row per grid point in grid order; for an analysis, two per search (its range ends), search by search.')
}).meta({ id: 'TheoryEvaluation' })

export const theoryRoutes: FastifyPluginAsyncZod<RouteContext> = async (app, ctx) => {
  app.post('/v1/theory', {
    validatorCompiler: specBodyValidator,
    schema: {
      operationId: 'evaluateTheory',
      summary: 'Theory values at every grid point of a spec, without simulating',
      description: 'Which values exist depends on the model: e.g. Hebbian ±1 networks with unbiased patterns get the replica-symmetric critical load and retrieval overlap, the one-step crosstalk error, first-step overlaps for parallel dynamics; the pseudo-inverse rule gets its critical load. Each value is given only inside its domain; elsewhere `theoryUnavailable` names the reason. For an analysis (threshold search) each search is evaluated at both ends of its range. Nothing is simulated, but the spec must pass the same work limits as submitting it (422 naming the limit), so any spec answered here can be submitted.',
      tags: ['theory'],
      body: SweepSpecSchema,
      response: { 200: theoryResultSchema.describe('Theory values at every grid point.'), ...problemResponses(400, 401, 413, 415, 422, 429) }
    }
  }, async (request) => {
    const spec = normaliseSpec(request.body)
    checkLimits(spec, ctx.limits)
    const rows = []
    const points = countPoints(spec)
    for (let index = 0; index < points; index++) {
      // A point takes from microseconds to tens of milliseconds (finite-temperature theory):
      // yield between points so that one large grid never stalls other requests.
      if (index > 0) await yieldToEventLoop()
      for (const { end, values, params } of pointsToCheck(spec, index)) {
        const theory = theoryForPoint(params)
        rows.push({
          point: index,
          ...(end === undefined ? {} : { end }),
          values,
          params: { neurons: params.neurons, patterns: params.patterns, alpha: params.patterns / params.neurons },
          theory: theory.values,
          theoryUnavailable: theory.unavailable
        })
      }
    }
    return { specHash: specHash(spec), points: rows }
  })
}
