/**
 * The precision measures are published at: 10 significant digits, in every representation
 * (JSON, CSV, Arrow). Sums of many trials leave binary noise in the last digits of a double
 * (0.09279999999999998 for 0.0928); no measure of a simulated sweep is known to more than a
 * few digits (the standard error of a mean over ten million trials is still ~3·10⁻⁴ of its
 * spread), so 10 digits lose nothing and keep a file readable. Integers (counts, N, P) are
 * exact and left alone, and so are the grid values a spec wrote (`values`, `spec`): those are
 * already the spec's decimals.
 */
import type { CsvCell } from './csv.js'
import type { SweepResult } from './types.js'

export const MEASURE_SIGNIFICANT_DIGITS = 10

const POWERS = Array.from({ length: 23 }, (_, k) => 10 ** k)

// MAIN //

/**
 * `x` rounded to 10 significant digits, as the shortest double of that decimal. Integers and
 * non-finite numbers are returned as they are.
 */
export function roundMeasure (x: number): number {
  if (Number.isInteger(x) || !Number.isFinite(x)) return x
  const magnitude = Math.floor(Math.log10(Math.abs(x)))
  const digits = MEASURE_SIGNIFICANT_DIGITS - 1 - magnitude
  // Fast path: an integer divided by an exact power of ten is the double nearest the decimal.
  if (digits >= 0 && digits < POWERS.length) {
    const scaled = Math.round(x * POWERS[digits]!)
    if (Math.abs(scaled) < Number.MAX_SAFE_INTEGER) return scaled / POWERS[digits]!
  }
  return Number(x.toPrecision(MEASURE_SIGNIFICANT_DIGITS))
}

/** A CSV cell with a number at the published precision. */
export function roundCell (cell: CsvCell): CsvCell {
  return typeof cell === 'number' ? roundMeasure(cell) : cell
}

/** Members holding the spec's own values, never rounded. */
const EXACT_MEMBERS = new Set(['spec', 'values', 'provenance'])

/** A copy of the result with every measure at the published precision (the spec and grid values untouched). */
export function atPublishedPrecision (result: SweepResult): SweepResult {
  return roundedCopy(result) as SweepResult
}

function roundedCopy (value: unknown): unknown {
  if (typeof value === 'number') return roundMeasure(value)
  if (value === null || typeof value !== 'object') return value
  if (Array.isArray(value)) return value.map((item) => roundedCopy(item))
  const out: Record<string, unknown> = {}
  for (const [key, member] of Object.entries(value)) {
    out[key] = EXACT_MEMBERS.has(key) ? member : roundedCopy(member)
  }
  return out
}
