/**
 * Trial records stored by column. A chunk holds thousands of records of one shape; the V8
 * serializer writes each as a separate object, every property name included, and reading
 * them back was most of a sweep's assembly (the 24,000-trial curve: 60 % of 41–56 ms, a
 * serial step at the end of every sweep). By column, numbers go into one typed array per
 * field (copied whole by the serializer, every double's bits kept, −0 and NaN included),
 * strings into a small dictionary, and nested objects and numeric arrays recursively.
 *
 * Decoding rebuilds records equal to the originals, key order included: a field absent from
 * a record stays absent, and a value of any other kind is kept as is. Records whose keys do
 * not follow one common order (no producer of ours makes them) are not stored by column.
 */

// TYPES //

type Column =
  | { key: string, present?: Uint8Array, kind: 'i32', values: Int32Array }
  | { key: string, present?: Uint8Array, kind: 'f64', values: Float64Array }
  | { key: string, present?: Uint8Array, kind: 'text', words: string[], codes: Uint8Array }
  | { key: string, present?: Uint8Array, kind: 'list', lengths: Uint32Array, values: Float64Array }
  | { key: string, present?: Uint8Array, kind: 'nested', rows: RecordColumns }
  | { key: string, present?: Uint8Array, kind: 'as-is', values: unknown[] }

/** What a chunk stores in place of its records: the record count and one column per field. */
export interface RecordColumns {
  count: number
  columns: Column[]
}

type PlainRecord = Record<string, unknown>

// FUNCTIONS //

function isPlainRecord (value: unknown): value is PlainRecord {
  return typeof value === 'object' && value !== null && Object.getPrototypeOf(value) === Object.prototype
}

function isInt32 (value: number): boolean {
  return (value | 0) === value && !Object.is(value, -0)
}

/**
 * The union of the records' keys in an order every record's own order follows; null when
 * no such order exists (two records order two keys differently).
 */
function commonKeyOrder (records: readonly PlainRecord[]): string[] | null {
  const order: string[] = []
  const position = new Map<string, number>()
  for (const record of records) {
    let last = -1
    let insertAt = -1
    for (const key of Object.keys(record)) {
      const at = position.get(key)
      if (at === undefined) {
        // A key not seen before goes right after the previous key of this record.
        insertAt = last + 1
        order.splice(insertAt, 0, key)
        for (let k = insertAt; k < order.length; k++) position.set(order[k]!, k)
        last = insertAt
      } else {
        if (at <= last) return null
        last = at
      }
    }
  }
  // Splicing can put a new key between two keys another record holds in order; check all.
  for (const record of records) {
    let last = -1
    for (const key of Object.keys(record)) {
      const at = position.get(key)!
      if (at <= last) return null
      last = at
    }
  }
  return order
}

function columnOf (key: string, records: readonly PlainRecord[]): Column {
  const holders: PlainRecord[] = []
  const present = new Uint8Array(records.length)
  for (let i = 0; i < records.length; i++) {
    if (Object.hasOwn(records[i]!, key)) {
      present[i] = 1
      holders.push(records[i]!)
    }
  }
  const base = holders.length === records.length ? { key } : { key, present }
  const values = holders.map((record) => record[key])
  if (values.every((v) => typeof v === 'number')) {
    const numbers = values as number[]
    return numbers.every(isInt32)
      ? { ...base, kind: 'i32', values: Int32Array.from(numbers) }
      : { ...base, kind: 'f64', values: Float64Array.from(numbers) }
  }
  if (values.every((v) => typeof v === 'string')) {
    const words = [...new Set(values as string[])]
    if (words.length <= 256) {
      const code = new Map(words.map((word, k) => [word, k]))
      return { ...base, kind: 'text', words, codes: Uint8Array.from(values as string[], (v) => code.get(v)!) }
    }
  }
  if (values.every((v) => Array.isArray(v) && v.length === Object.keys(v).length && v.every((x) => typeof x === 'number'))) {
    const lists = values as number[][]
    return { ...base, kind: 'list', lengths: Uint32Array.from(lists, (list) => list.length), values: Float64Array.from(lists.flat()) }
  }
  if (values.every(isPlainRecord)) {
    const rows = toColumns(values)
    if (rows !== null) return { ...base, kind: 'nested', rows }
  }
  return { ...base, kind: 'as-is', values }
}

// MAIN //

/** The records by column; null when they cannot be stored so and must be stored as they are. */
export function toColumns (records: readonly unknown[]): RecordColumns | null {
  if (!records.every(isPlainRecord)) return null
  const order = commonKeyOrder(records)
  // Assigning a member named __proto__ would set the prototype instead: such records stay as they are.
  if (order === null || order.includes('__proto__')) return null
  return { count: records.length, columns: order.map((key) => columnOf(key, records)) }
}

/** The records `toColumns` stored, equal to the originals (key order included). */
export function fromColumns (stored: RecordColumns): PlainRecord[] {
  const records: PlainRecord[] = Array.from({ length: stored.count }, () => ({}))
  for (const column of stored.columns) {
    const value = valuesOf(column)
    const { key, present } = column
    if (present === undefined) {
      for (let i = 0; i < stored.count; i++) records[i]![key] = value(i)
    } else {
      let k = 0
      for (let i = 0; i < stored.count; i++) if (present[i] === 1) records[i]![key] = value(k++)
    }
  }
  return records
}

/** The k-th present value of a column. */
function valuesOf (column: Column): (k: number) => unknown {
  switch (column.kind) {
    case 'i32':
    case 'f64': {
      const values = column.values
      return (k) => values[k]
    }
    case 'text': {
      const { words, codes } = column
      return (k) => words[codes[k]!]
    }
    case 'list': {
      const { lengths, values } = column
      const starts = new Uint32Array(lengths.length + 1)
      for (let k = 0; k < lengths.length; k++) starts[k + 1] = starts[k]! + lengths[k]!
      return (k) => Array.from(values.subarray(starts[k]!, starts[k + 1]!))
    }
    case 'nested': {
      const rows = fromColumns(column.rows)
      return (k) => rows[k]
    }
    case 'as-is': {
      const values = column.values
      return (k) => values[k]
    }
  }
}
