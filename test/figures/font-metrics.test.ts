/** The layout's font widths are those of the shipped typeface (drift check of the generated table). */
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { figureFontTable } from '../../scripts/figure-font-table.js'
import { textWidth } from '../../src/figures/text-metrics.js'

describe('figure font metrics', () => {
  it('are generated from the Source Sans 3 files the renderings embed (npm run figures:metrics)', () => {
    const file = readFileSync(new URL('../../src/figures/font-widths.generated.ts', import.meta.url), 'utf8')
    expect(file).toBe(figureFontTable())
  })

  it('cover the symbols of our labels, and count unknown characters wide', () => {
    for (const ch of 'αβθμνΣ≥≤±√·∞→−⁰¹²³⁴⁵⁶⁷⁸⁹⁻ⁿˣ…×') expect(textWidth(ch, 1), ch).toBeLessThan(1)
    expect(textWidth('\u4e00', 1)).toBe(1)
    expect(textWidth('mmm', 10, 'semibold')).toBeGreaterThan(textWidth('mmm', 10))
  })
})
