/**
 * The members an analysis adds to a result: its searches (estimate, interval, the steps'
 * summaries) and its finite-size fits. Documentation and response validation only, like
 * the rest of the result schema: the bytes come from the spec layer.
 */
import { z } from 'zod'

const stat = z.number().nullable()

const crossingFit = z.object({
  method: z.enum(['logistic-profile', 'local-linear-fieller'])
    .describe('logistic-profile: local logistic regression of the success counts, profile-likelihood interval; local-linear-fieller: weighted line through the mean overlaps nearest the crossing, Fieller interval.'),
  estimate: stat,
  low: stat,
  high: stat,
  slope: stat.describe('Slope of the fitted curve at the crossing, per unit of the parameter (logit units for success, overlap units for overlap).'),
  separated: z.boolean().describe('The success counts switched from all to none between two neighbouring steps (a step sharper than the data resolve).'),
  dispersion: stat.describe('Pearson χ² per degree of freedom of the fit; above 1 the interval was widened by it.')
}).meta({ id: 'CrossingFit' })

const fittedValue = z.object({ value: z.number(), se: stat.describe('Standard error (null when fixed).') })

const scalingRow = z.object({
  values: z.record(z.string(), z.union([z.number(), z.string(), z.boolean()])).describe("The varied parameters other than neurons shared by this fit's searches ({} when only N varies); a rule axis gives the rule's label."),
  form: z.enum(['power', 'linear-inverse']),
  fit: z.object({
    form: z.enum(['power', 'linear-inverse']),
    limit: fittedValue.describe('x_∞, the extrapolation to N → ∞.'),
    limitInterval: z.object({ low: z.number(), high: z.number(), confidence: z.number() }).describe('x_∞ ± z·se.'),
    amplitude: fittedValue.describe('a in x_∞ + a·N^(−b).'),
    exponent: fittedValue.describe('b (1 for linear-inverse); se null when fixed.'),
    correlation: stat.describe('Correlation of the estimates of x_∞ and a.'),
    chiSquare: z.number(),
    degreesOfFreedom: z.number().int(),
    errorScale: z.number().describe('√max(1, χ²/dof): the factor already applied to every standard error.')
  }).nullable().describe('Weighted least-squares fit; null when too few sizes gave a bounded estimate (see note).'),
  sizes: z.array(z.object({ search: z.number().int(), neurons: z.number().int(), estimate: z.number(), se: z.number() }))
    .describe('The estimates that entered the fit; se = interval width / 2z.'),
  excluded: z.array(z.object({ search: z.number().int(), neurons: z.number().int(), reason: z.string() })),
  references: z.array(z.object({
    name: z.enum(['rs-theory', 'finite-size-simulations']),
    value: z.number(),
    uncertainty: stat,
    source: z.string(),
    deviation: stat.describe('(x_∞ − value) / √(se² + uncertainty²).')
  })).describe('Published values for the same quantity (the Hebbian capacity at T = 0, for a load search on that model); [] otherwise.'),
  note: z.string().nullable()
}).meta({ id: 'ScalingRow' })

// MAIN //

/**
 * The schemas of `searches` and `scaling`. A function of the PointSummary schema, which
 * result.ts owns, so the two modules do not import each other.
 */
export function analysisResultSchemas (pointSummary: z.ZodType) {
  const searchStep = z.object({
    step: z.number().int().describe('Position in evaluation order (0 and 1 are the ends of the range).'),
    value: z.number().describe('Value of the searched parameter run at this step (a load is P/N for a whole P; a cue fraction a whole number of neurons over N).'),
    side: z.enum(['above', 'below']).describe('Whether the measure was at or above the level.'),
    params: z.object({ alpha: z.number(), neurons: z.number().int(), patterns: z.number().int() }),
    summary: pointSummary.describe("The step's trials aggregated as for a grid point.")
  }).meta({ id: 'SearchStep' })

  const searchRow = z.object({
    search: z.number().int().describe('Index of the search: its point in the grid of the other varied parameters.'),
    values: z.record(z.string(), z.union([z.number(), z.string(), z.boolean()])).describe('The other varied parameters of this search, by path (a rule axis gives the rule\'s label).'),
    neurons: z.number().int(),
    estimate: stat.describe('The fitted value of the searched parameter at which the measure crosses the level; null when the range holds no crossing or no fit was possible (see note).'),
    low: stat.describe('Lower end of the confidence interval (analysis.confidence); null when the data do not bound it.'),
    high: stat.describe('Upper end of the confidence interval; null when the data do not bound it.'),
    stoppedBy: z.enum(['tolerance', 'noise', 'resolution', 'max-steps', 'no-crossing'])
      .describe("tolerance: bracket narrower than analysis.tolerance; noise: the level lay inside the latest step's interval with the bracket within 4 tolerances; resolution: the parameter cannot be split finer; max-steps: budget used up; no-crossing: the ends of the range do not straddle the level."),
    bracket: z.object({ low: z.number(), high: z.number() }).nullable().describe('The last bracket of evaluated values straddling the level.'),
    fit: crossingFit.nullable(),
    note: z.string().nullable().describe('A remark for the reader when the search needs one.'),
    stepsUsed: z.number().int(),
    trialsUsed: z.number().int(),
    steps: z.array(searchStep).describe('Every evaluated value, in evaluation order.')
  }).meta({ id: 'SearchRow' })

  return { searchRow, scalingRow }
}
