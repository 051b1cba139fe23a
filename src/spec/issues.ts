/**
 * zod issues → our `{ path, message }` issues: dotted paths, one issue per unknown field,
 * and unions unwrapped to the branch the user evidently meant.
 */
import type { z } from 'zod'
import type { SpecIssue } from './errors.js'

type ZodIssue = z.core.$ZodIssue

export function joinPath (path: ReadonlyArray<PropertyKey>): string {
  return path.map((segment) => String(segment)).join('.')
}

export function issuesFromZod (issues: readonly ZodIssue[], prefix: ReadonlyArray<PropertyKey> = []): SpecIssue[] {
  const out: SpecIssue[] = []
  for (const issue of issues) {
    const path = [...prefix, ...issue.path]
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) out.push({ path: joinPath([...path, key]), message: 'unknown field' })
    } else if (issue.code === 'invalid_union' && issue.errors.length > 0) {
      const meant = issue.errors.filter((branch) => !branch.every((e) => e.code === 'invalid_type' && e.path.length === 0))
      if (meant.length === 1) out.push(...issuesFromZod(meant[0]!, path))
      else out.push({ path: joinPath(path), message: issue.message })
    } else {
      out.push({ path: joinPath(path), message: issue.message })
    }
  }
  return out
}

/** Drops exact repeats, keeping the first occurrence's position. */
export function uniqueIssues (issues: readonly SpecIssue[]): SpecIssue[] {
  const seen = new Set<string>()
  return issues.filter((issue) => {
    const key = `${issue.path}\u0000${issue.message}`
    if (seen.has(key)) return false
    seen.add(key)
    return true
  })
}
