import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { csvField, toCsv } from '../../src/results/csv.js'

/** A small RFC 4180 reader, written independently of the writer, to read our output back. */
function parseCsv (text: string): string[][] {
  const records: string[][] = []
  let record: string[] = []
  let field = ''
  let i = 0
  while (i < text.length) {
    if (text[i] === '"') {
      i++
      for (;;) {
        if (text[i] === '"' && text[i + 1] === '"') { field += '"'; i += 2 } else if (text[i] === '"') { i++; break } else { field += text[i]; i++ }
      }
    } else if (text[i] === ',') {
      record.push(field); field = ''; i++
    } else if (text[i] === '\r' && text[i + 1] === '\n') {
      record.push(field); records.push(record); record = []; field = ''; i += 2
    } else {
      field += text[i]; i++
    }
  }
  expect(field).toBe('')
  expect(record).toEqual([])
  return records
}

describe('CSV fields', () => {
  it('quotes only what RFC 4180 requires, doubling inner quotes', () => {
    expect(csvField('target')).toBe('target')
    expect(csvField('kitchen, north wing')).toBe('"kitchen, north wing"')
    expect(csvField('the "blue" room')).toBe('"the ""blue"" room"')
    expect(csvField('two\nlines')).toBe('"two\nlines"')
    expect(csvField('carriage\rreturn')).toBe('"carriage\rreturn"')
    expect(csvField(' padded ')).toBe(' padded ')
  })

  it('writes numbers in shortest round-trip form and gaps for missing or non-finite values', () => {
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004')
    expect(csvField(1e-7)).toBe('1e-7')
    expect(csvField(-0)).toBe('0')
    expect(csvField(Number.NaN)).toBe('')
    expect(csvField(Number.POSITIVE_INFINITY)).toBe('')
    expect(csvField(null)).toBe('')
    expect(csvField(undefined)).toBe('')
    expect(csvField(true)).toBe('true')
  })

  it('ends every record, the last one too, with CRLF', () => {
    expect(toCsv(['a', 'b'], [[1, 'x,y']])).toBe('a,b\r\n1,"x,y"\r\n')
  })

  it('reads back exactly what it wrote', () => {
    const cell = fc.string({ unit: fc.constantFrom('a', 'Z', ' ', ',', '"', '\r', '\n', 'é', '1') })
    fc.assert(fc.property(fc.array(fc.array(cell, { minLength: 3, maxLength: 3 }), { maxLength: 8 }), (rows) => {
      expect(parseCsv(toCsv(['x', 'y', 'z'], rows))).toEqual([['x', 'y', 'z'], ...rows])
    }))
  })
})
