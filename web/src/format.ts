/** Numbers, sizes, durations and times as people read them. Pure functions: no DOM. */

const GROUPED = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 })

/** A whole count with thousands separators: 3600 → "3,600". */
export function formatCount (n: number): string {
  return GROUPED.format(n)
}

/** A measured value to `digits` significant digits; null and non-finite values as an en dash. */
export function formatValue (x: number | null | undefined, digits = 3): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–'
  if (x === 0) return '0'
  const magnitude = Math.abs(x)
  if (magnitude >= 1e6 || magnitude < 1e-4) return x.toExponential(digits - 1).replace('e', '·10^').replace('^+', '^')
  return String(Number(x.toPrecision(digits)))
}

/** A grid value: numbers as formatValue has them, names (a learning rule, an update scheme) as they are. */
export function formatGridValue (x: number | string | boolean | null | undefined, digits = 3): string {
  return typeof x === 'string' || typeof x === 'boolean' ? String(x) : formatValue(x, digits)
}

/** A duration in seconds, coarser as it grows: "0.4 s", "12 s", "3 min 05 s", "2 h 10 min". */
export function formatDuration (seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 0) return '–'
  if (seconds < 1) return `${(Math.round(seconds * 10) / 10).toFixed(1)} s`
  if (seconds < 60) return `${Math.round(seconds)} s`
  const total = Math.round(seconds)
  if (total < 3600) return `${Math.floor(total / 60)} min ${String(total % 60).padStart(2, '0')} s`
  const minutes = Math.round(seconds / 60)
  if (minutes < 48 * 60) return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`
  return `${Math.round(seconds / 86400)} days`
}

/** Bytes in binary units: "820 B", "3.4 MiB". */
export function formatBytes (bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '–'
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB']
  let value = bytes
  let unit = 0
  while (value >= 1024 && unit < units.length - 1) { value /= 1024; unit++ }
  return unit === 0 ? `${Math.round(value)} B` : `${value < 10 ? value.toFixed(1) : Math.round(value)} ${units[unit]}`
}

/** How long ago an ISO time was, from `now` (ms): "just now", "4 min ago", "3 h ago", "2 days ago". */
export function formatAgo (iso: string, now: number): string {
  const seconds = (now - Date.parse(iso)) / 1000
  if (!Number.isFinite(seconds)) return '–'
  if (seconds < 45) return 'just now'
  if (seconds < 3600) return `${Math.max(1, Math.round(seconds / 60))} min ago`
  if (seconds < 36 * 3600) return `${Math.round(seconds / 3600)} h ago`
  return `${Math.round(seconds / 86400)} days ago`
}

/** An ISO time as a local date and time, to the minute: "2026-12-01 14:03". */
export function formatStamp (iso: string): string {
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return '–'
  const pad = (n: number): string => String(n).padStart(2, '0')
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())} ${pad(d.getHours())}:${pad(d.getMinutes())}`
}

/** A fraction as a whole percentage, never showing 100 % before it is exactly done. */
export function formatPercent (fraction: number): string {
  if (!Number.isFinite(fraction)) return '–'
  const percent = fraction >= 1 ? 100 : Math.min(99, Math.floor(fraction * 100))
  return `${percent} %`
}
