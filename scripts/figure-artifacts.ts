/**
 * Writes every kind of figure (test/figures/kinds.ts) at the two journal column widths, 85 and
 * 180 mm, and at the smallest screen size, as SVG and PNG under test/artifacts/, to look at.
 *
 *   npm run figures:artifacts
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { renderFigure } from '../src/figures/index.js'
import { svgToPng } from '../src/figure-files/png.js'
import { figureKinds } from '../test/figures/kinds.js'

const dir = fileURLToPath(new URL('../test/artifacts/', import.meta.url))
mkdirSync(dir, { recursive: true })
const sizes = [
  { suffix: '85mm', options: { column: 'single' } },
  { suffix: '180mm', options: { column: 'double' } },
  { suffix: '240x180px', options: { width: 240, height: 180 } }
] as const
const only = process.argv[2]
for (const kind of figureKinds()) {
  if (only !== undefined && !kind.name.includes(only)) continue
  for (const size of sizes) {
    const svg = renderFigure(kind.results, { ...kind.options, ...size.options })
    const base = `${dir}${kind.name}-${size.suffix}`
    writeFileSync(`${base}.svg`, svg)
    writeFileSync(`${base}.png`, svgToPng(svg, size.suffix === '240x180px' ? 96 : 150))
  }
  console.log(kind.name)
}
