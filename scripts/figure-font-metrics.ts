/**
 * Writes src/figures/font-widths.generated.ts: the advance widths of the figure typeface
 * (Source Sans 3, shipped by the `source-sans` package and embedded in every PNG and PDF),
 * read from its TrueType files, so the layout measures text as the renderers will draw it.
 * `--check` fails when the file differs (test/figures/font-metrics.test.ts runs the same check).
 *
 *   npm run figures:metrics
 */
import { readFileSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { figureFontTable } from './figure-font-table.js'

const target = fileURLToPath(new URL('../src/figures/font-widths.generated.ts', import.meta.url))
const text = figureFontTable()
if (process.argv.includes('--check')) {
  if (readFileSync(target, 'utf8') !== text) {
    console.error('src/figures/font-widths.generated.ts is out of date: run npm run figures:metrics')
    process.exit(1)
  }
} else {
  writeFileSync(target, text)
  console.log(`wrote ${target}`)
}
