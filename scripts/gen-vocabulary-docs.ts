/**
 * Writes docs/glossary.md and docs/data-dictionary.md from the vocabulary
 * (src/results/vocabulary.ts). With --check, writes nothing and exits 1 when a file differs.
 */
import { readFileSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { dataDictionaryMarkdown, glossaryMarkdown } from '../src/results/vocabulary-docs.js'

const root = fileURLToPath(new URL('../', import.meta.url))
const files: Array<[string, string]> = [['docs/glossary.md', glossaryMarkdown()], ['docs/data-dictionary.md', dataDictionaryMarkdown()]]
const check = process.argv.includes('--check')
let stale = false
for (const [path, text] of files) {
  const full = root + path
  let current = ''
  try { current = readFileSync(full, 'utf8') } catch {}
  if (current === text) continue
  if (check) { console.error(`${path} is out of date: run npm run vocabulary:generate`); stale = true } else { writeFileSync(full, text); console.log(`wrote ${path}`) }
}
if (stale) process.exit(1)
