import { describe, expect, it } from 'vitest'
import { parseTokens, TokenFileError } from '../../src/api/tokens.js'

describe('tokens file', () => {
  it('maps tokens to owners and roles, skipping comments and blank lines', () => {
    const table = parseTokens('# lab tokens\n\nalice:alice-laptop-7f3a9c2e1b\r\nbob:bob-token-0000000000:read\nlab:lab-admin-2e6f0a9d5c44:admin\nalice:alice-desktop-99a8b7c6d5\n')
    expect(table.size).toBe(4)
    expect(table.lookup('alice-laptop-7f3a9c2e1b')).toEqual({ owner: 'alice', role: 'submit' })
    expect(table.lookup('alice-desktop-99a8b7c6d5')).toEqual({ owner: 'alice', role: 'submit' })
    expect(table.lookup('bob-token-0000000000')).toEqual({ owner: 'bob', role: 'read' })
    expect(table.lookup('lab-admin-2e6f0a9d5c44')).toEqual({ owner: 'lab', role: 'admin' })
    expect(table.lookup('alice-laptop-7f3a9c2e1')).toBeNull()
    expect(table.lookup('')).toBeNull()
  })

  it.each([
    ['alice', 'expected owner:token'],
    ['al ice:abcdefghijklmnop', 'owner'],
    ['alice:short', 'token must be'],
    ['alice:abcdefghijklmnop:root', "role 'root'"],
    ['a:abcdefghijklmnop\nb:abcdefghijklmnop', 'twice']
  ])('rejects %j naming the line', (text, message) => {
    expect(() => parseTokens(text, 'tokens.txt')).toThrow(TokenFileError)
    expect(() => parseTokens(text, 'tokens.txt')).toThrow(message)
    expect(() => parseTokens(text, 'tokens.txt')).toThrow(/^tokens\.txt:\d+:/)
  })
})
