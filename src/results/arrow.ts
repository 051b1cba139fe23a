/**
 * A table as an Apache Arrow IPC file (the random-access "file" format, media type
 * application/vnd.apache.arrow.file), with the maintained `apache-arrow` package: the same
 * columns, names and rows as the CSV, each column typed by its name (column-types.ts) so
 * every sweep's file has one schema per table kind. Integers are int64, measures float64,
 * names utf8, flags bool; an empty CSV cell is a null.
 */
import { Bool, Float64, Int64, Table as ArrowTable, Utf8, tableToIPC, vectorFromArray, type Vector } from 'apache-arrow'
import type { CsvCell, Table } from './csv.js'
import { columnType } from './column-types.js'

// MAIN //

/** The table as Arrow IPC file bytes; `metadata` goes into the schema (e.g. the spec hash). */
export function toArrow (table: Table, metadata: Record<string, string> = {}): Uint8Array {
  const columns: Record<string, Vector> = {}
  table.header.forEach((name, k) => { columns[name] = column(name, table.rows.map((row) => row[k])) })
  const arrow = new ArrowTable(columns)
  for (const [key, value] of Object.entries(metadata)) arrow.schema.metadata.set(key, value)
  return tableToIPC(arrow, 'file')
}

function column (name: string, cells: CsvCell[]): Vector {
  const present = (cell: CsvCell): boolean => cell !== null && cell !== undefined && cell !== '' && !(typeof cell === 'number' && !Number.isFinite(cell))
  switch (columnType(name)) {
    case 'int': return vectorFromArray(cells.map((cell) => present(cell) ? BigInt(cell as number) : null), new Int64())
    case 'bool': return vectorFromArray(cells.map((cell) => present(cell) ? cell === true || cell === 'true' : null), new Bool())
    case 'string': return vectorFromArray(cells.map((cell) => present(cell) ? String(cell) : null), new Utf8())
    default: return vectorFromArray(cells.map((cell) => present(cell) ? Number(cell) : null), new Float64())
  }
}
