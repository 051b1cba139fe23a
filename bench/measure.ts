import { spawnSync } from 'node:child_process'
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

/** One JSON line printed by a measured process, plus what the harness saw from outside. */
export type Run = Record<string, unknown> & {
  impl: string
  workload: string
  variant: string
  label: string
  proc_wall_s: number
  /** Peak resident set of the whole process, KiB (/usr/bin/time %M, else the process's own report). */
  maxrss_kb: number
}

const TIME = '/usr/bin/time'
export const hasGnuTime = existsSync(TIME)

/**
 * Runs `command` as a fresh process (under /usr/bin/time when present, for peak RSS),
 * parses the last JSON line it prints and tags it with `label`.
 */
export function measure (label: string, command: string[], options: { cwd?: string, env?: NodeJS.ProcessEnv } = {}): Run {
  const dir = mkdtempSync(join(tmpdir(), 'memsweep-bench-'))
  const timeFile = join(dir, 'time')
  const argv = hasGnuTime ? [TIME, '-f', '%e %M', '-o', timeFile, ...command] : command
  const started = process.hrtime.bigint()
  const res = spawnSync(argv[0]!, argv.slice(1), { cwd: options.cwd, env: options.env ?? process.env, encoding: 'utf8', maxBuffer: 1 << 24 })
  const wall = Number(process.hrtime.bigint() - started) / 1e9
  if (res.status !== 0) {
    rmSync(dir, { recursive: true, force: true })
    throw new Error(`${command.join(' ')} failed (${res.status}): ${res.stderr}`)
  }
  const line = res.stdout.trim().split('\n').filter((l) => l.startsWith('{')).pop()
  if (line === undefined) throw new Error(`${command.join(' ')} printed no JSON line`)
  const parsed = JSON.parse(line) as Record<string, unknown>
  let procWall = wall
  let rss = typeof parsed.self_maxrss_kb === 'number' ? parsed.self_maxrss_kb : Number.NaN
  if (hasGnuTime && existsSync(timeFile)) {
    const [w, m] = readFileSync(timeFile, 'utf8').trim().split(/\s+/).slice(-2).map(Number)
    if (Number.isFinite(w)) procWall = w!
    if (Number.isFinite(m)) rss = m!
  }
  rmSync(dir, { recursive: true, force: true })
  // A process that ran warm repeats after the measured run reports its peak up to the end of that run.
  const first = parsed.first_maxrss_kb
  return { ...parsed, label, proc_wall_s: procWall, proc_maxrss_kb: rss, maxrss_kb: typeof first === 'number' && typeof parsed.warm_repeats === 'number' ? first : rss } as unknown as Run
}

export function median (xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const k = s.length >> 1
  return s.length % 2 === 1 ? s[k]! : (s[k - 1]! + s[k]!) / 2
}
