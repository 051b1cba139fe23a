/** Reading the service's CSV tables in tests. */

/** The CSV without its first column, `sweepId`: what two sweeps of one spec have in common byte for byte. */
export function withoutSweepId (csv: string): string {
  return csv.split('\r\n').map((line) => line.slice(line.indexOf(',') + 1)).join('\r\n')
}

/** Header and rows of a CSV whose cells hold no commas, each row as a record by column name. */
export function csvRecords (csv: string): Array<Record<string, string>> {
  const [header, ...rows] = csv.trimEnd().split('\r\n').map((line) => line.split(','))
  return rows.map((cells) => Object.fromEntries(header!.map((name, k) => [name, cells[k] ?? ''])))
}
