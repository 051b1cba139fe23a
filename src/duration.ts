/**
 * Durations as people and batch schedulers write them: `90s`, `45m`, `2h`, `1h30m`, `500ms`,
 * `1d`, or a scheduler's wall-time form `[D-]HH:MM:SS` / `MM:SS`. A bare number is refused:
 * seconds or minutes would be a guess.
 */
const UNIT_MS: Record<string, number> = { ms: 1, s: 1000, m: 60_000, h: 3_600_000, d: 86_400_000 }

/** @returns milliseconds, or null when `text` is not a duration. */
export function parseDuration (text: string): number | null {
  const trimmed = text.trim()
  const clock = /^(?:(\d+)-)?(?:(\d+):)?(\d+):(\d{2})$/.exec(trimmed)
  if (clock !== null) {
    const [, days, hours, minutes, seconds] = clock
    if (Number(seconds) >= 60 || (hours !== undefined && Number(minutes) >= 60)) return null
    return (((Number(days ?? 0) * 24 + Number(hours ?? 0)) * 60 + Number(minutes)) * 60 + Number(seconds)) * 1000
  }
  if (!/^(?:\d+(?:\.\d+)?(?:ms|s|m|h|d))+$/.test(trimmed)) return null
  let total = 0
  for (const [, amount, unit] of trimmed.matchAll(/(\d+(?:\.\d+)?)(ms|s|m|h|d)/g)) total += Number(amount) * UNIT_MS[unit!]!
  return Math.round(total)
}
