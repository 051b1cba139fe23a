/** The RFC 9457 problem document every error status answers with. */
import { z } from 'zod'
import { ERROR_CODES, ERRORS, type ErrorCode } from '../../errors.js'

/** Most field issues one problem document lists; `errorsOmitted` counts the rest. */
export const MAX_LISTED_ISSUES = 100

/** Longest path, pointer or message an issue repeats back; longer ones are cut. */
export const MAX_ISSUE_TEXT = 256

export const fieldIssueSchema = z.object({
  path: z.string().describe('Dotted path of the offending field, e.g. `grid.load.to` or `patterns.data[3]`; empty for the whole body.'),
  pointer: z.string().describe('The same location as a JSON Pointer (RFC 6901), e.g. `/grid/load/to`.'),
  message: z.string()
}).meta({ id: 'FieldIssue', description: `One offending field. A path, pointer or message longer than ${MAX_ISSUE_TEXT} characters (an unknown key that long, say) is cut and ends in …` })

export const problemSchema = z.object({
  type: z.string().describe('URI naming the problem type: `urn:memsweep:problem:<code in kebab case>`.'),
  title: z.string(),
  status: z.number().int().min(400).max(599),
  detail: z.string(),
  instance: z.string().describe('The request path the problem occurred on.'),
  code: z.enum(ERROR_CODES).describe('Stable machine-readable code; see docs/errors.md.'),
  requestId: z.string().describe('Request id, also sent as the X-Request-Id header; quote it in bug reports.'),
  errors: z.array(fieldIssueSchema).max(MAX_LISTED_ISSUES).optional()
    .describe(`One entry per invalid field (validation problems only), at most ${MAX_LISTED_ISSUES}.`),
  errorsOmitted: z.number().int().nonnegative().optional()
    .describe(`Present with \`errors\`: how many further issues were found but not listed (errors[] lists at most ${MAX_LISTED_ISSUES}); 0 when errors[] lists them all.`),
  limit: z.object({
    name: z.string(),
    value: z.number(),
    max: z.number()
  }).optional().describe('The work limit a sweep exceeds (MEMSWEEP_WORK_LIMIT_EXCEEDED only).'),
  sweepId: z.string().optional().describe('The sweep the problem is about, when there is one.'),
  retryAfter: z.number().optional().describe('Seconds to wait before retrying (also sent as Retry-After).')
}).meta({ id: 'Problem', description: 'RFC 9457 problem details.' })

export type Problem = z.infer<typeof problemSchema>
export type FieldIssue = z.infer<typeof fieldIssueSchema>

export const PROBLEM_MEDIA_TYPE = 'application/problem+json'

/** Statuses any route may answer with: an unexpected failure, or a request arriving during shutdown. */
const ALWAYS_POSSIBLE = [500, 503]

/** OpenAPI response entries for the error statuses a route can answer with (500 and 503 are always added). */
export function problemResponses (...statuses: number[]): Record<number, { description: string, content: Record<string, { schema: typeof problemSchema }> }> {
  const entries: Record<number, { description: string, content: Record<string, { schema: typeof problemSchema }> }> = {}
  for (const status of [...new Set([...statuses, ...ALWAYS_POSSIBLE])].sort((a, b) => a - b)) {
    const codes = (Object.keys(ERRORS) as ErrorCode[]).filter((code) => ERRORS[code].status === status)
    if (codes.length === 0) throw new Error(`no error code is registered for status ${status}`)
    entries[status] = {
      description: `Problem details: ${codes.join(', ')}.`,
      content: { [PROBLEM_MEDIA_TYPE]: { schema: problemSchema } }
    }
  }
  return entries
}
