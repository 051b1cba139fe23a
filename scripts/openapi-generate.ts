/**
 * Writes openapi/openapi.json from the route schemas (`npm run openapi:generate`), or with
 * --check fails when the committed file differs from what the code generates
 * (`npm run openapi:check`). The file is never edited by hand.
 */
import { readFile, writeFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import { buildOpenApiDocument, serialiseOpenApiDocument } from '../src/api/openapi-build.js'

const target = fileURLToPath(new URL('../openapi/openapi.json', import.meta.url))
const text = serialiseOpenApiDocument(await buildOpenApiDocument())

if (process.argv.includes('--check')) {
  const committed = await readFile(target, 'utf8').catch(() => '')
  if (committed !== text) {
    console.error('openapi/openapi.json is out of date with the route schemas: run `npm run openapi:generate` and commit the result.')
    process.exit(1)
  }
  console.log('openapi/openapi.json matches the route schemas.')
} else {
  await writeFile(target, text)
  console.log(`wrote ${target}`)
}
