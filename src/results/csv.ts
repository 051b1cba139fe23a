/**
 * RFC 4180 CSV: CRLF line ends (the last line too), fields quoted only when they hold a
 * comma, a double quote, CR or LF, quotes inside doubled. Numbers in ECMAScript's shortest
 * round-trip form; null and non-finite numbers as empty fields. Same rows ⇒ same bytes.
 */

export type CsvCell = string | number | boolean | null | undefined

/** A table as the CSV and Arrow writers take it: column names and rows of cells. */
export interface Table {
  header: string[]
  rows: CsvCell[][]
}

export function csvField (cell: CsvCell): string {
  if (cell === null || cell === undefined) return ''
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : ''
  if (typeof cell === 'boolean') return cell ? 'true' : 'false'
  return /[",\r\n]/.test(cell) ? `"${cell.replaceAll('"', '""')}"` : cell
}

export function toCsv (header: readonly string[], rows: ReadonlyArray<readonly CsvCell[]>): string {
  const lines = [header.map(csvField).join(',')]
  for (const row of rows) lines.push(row.map(csvField).join(','))
  return lines.join('\r\n') + '\r\n'
}
