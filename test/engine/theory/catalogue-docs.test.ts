/** docs/theory.md lists every theory value the results can carry and every reason code. */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { THEORY_MODELS, UNAVAILABLE_REASON_CODES } from '../../../src/engine/theory/index.js'

const doc = readFileSync(new URL('../../../docs/theory.md', import.meta.url), 'utf8')

describe('docs/theory.md', () => {
  it('names every value of every model and every reason code', () => {
    for (const model of THEORY_MODELS) {
      for (const entry of model.entries) expect(doc, entry.name).toContain(`| \`${entry.name}\` |`)
    }
    for (const code of UNAVAILABLE_REASON_CODES) expect(doc, code).toContain(`| \`${code}\` |`)
  })

  it('labels every value that depends on the tie rule with that rule in its name or documented tie column', () => {
    for (const model of THEORY_MODELS) {
      for (const entry of model.entries) {
        if (entry.ties === 'random') expect(entry.name).toMatch(/TiesRandom$/)
        if (entry.ties === 'keep') expect(entry.name === 'crosstalkErrorExact' || entry.name.endsWith('TiesKeep'), entry.name).toBe(true)
      }
    }
  })
})
