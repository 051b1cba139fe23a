import { describe, expect, it } from 'vitest'
import { negotiate } from '../../src/api/negotiate.js'

const offered = ['application/json', 'text/csv'] as const

describe('negotiate', () => {
  it.each([
    [undefined, 'application/json'],
    ['', 'application/json'],
    ['*/*', 'application/json'],
    ['text/csv', 'text/csv'],
    ['text/*', 'text/csv'],
    ['application/json;q=0.4, text/csv;q=0.9', 'text/csv'],
    ['text/csv;q=0, */*', 'application/json'],
    ['text/html, application/xhtml+xml, */*;q=0.8', 'application/json'],
    ['application/xml', null],
    ['text/csv;q=0', null]
  ])('Accept %j → %j', (accept, expected) => {
    expect(negotiate(accept, offered)).toBe(expected)
  })
})
