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
      const meant = meantBranches(issue.errors)
      if (meant.length === 1) out.push(...issuesFromZod(meant[0]!, path))
      else out.push({ path: joinPath(path), message: issue.message })
    } else {
      out.push({ path: joinPath(path), message: issue.message })
    }
  }
  return out
}

/**
 * The branches of a union the input evidently meant: not those that failed on the input's
 * type alone; then, among object branches, not those that do not know the input's keys
 * (a rule object is not an axis `{ values }`), nor those whose only complaint is a missing
 * discriminator (an axis `{ values }` is not a rule object), while another branch remains.
 */
function meantBranches (branches: readonly ZodIssue[][]): ZodIssue[][] {
  let meant = branches.filter((branch) => !branch.every((e) => e.code === 'invalid_type' && e.path.length === 0))
  const narrower = (keep: (branch: ZodIssue[]) => boolean): void => {
    const kept = meant.filter(keep)
    if (kept.length > 0) meant = kept
  }
  narrower((branch) => !branch.some((e) => e.code === 'unrecognized_keys' && e.path.length === 0))
  narrower((branch) => !branch.every((e) => e.code === 'invalid_union' && e.path.length === 1 && (e as { note?: string }).note === 'No matching discriminator'))
  return meant
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
