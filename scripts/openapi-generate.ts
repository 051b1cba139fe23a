/**
 * Writes openapi/openapi.json from the route schemas and src/api-types/openapi.d.ts from that
 * document (`npm run openapi:generate`), or with --check fails when a committed file differs
 * from what the code generates (`npm run openapi:check`). Neither file is edited by hand.
 */
import { readFile, writeFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import { buildOpenApiDocument, serialiseOpenApiDocument } from '../src/api/openapi-build.js'
import { generateApiTypes } from './openapi-types.js'

const documentPath = fileURLToPath(new URL('../openapi/openapi.json', import.meta.url))
const typesPath = fileURLToPath(new URL('../src/api-types/openapi.d.ts', import.meta.url))
const documentText = serialiseOpenApiDocument(await buildOpenApiDocument())
const outputs = [
  { path: documentPath, name: 'openapi/openapi.json', text: documentText, source: 'the route schemas' },
  { path: typesPath, name: 'src/api-types/openapi.d.ts', text: await generateApiTypes(documentText), source: 'openapi/openapi.json' }
]

if (process.argv.includes('--check')) {
  let stale = false
  for (const output of outputs) {
    const committed = await readFile(output.path, 'utf8').catch(() => '')
    if (committed === output.text) {
      console.log(`${output.name} matches ${output.source}.`)
    } else {
      console.error(`${output.name} is out of date with ${output.source}: run \`npm run openapi:generate\` and commit the result.`)
      stale = true
    }
  }
  if (stale) process.exit(1)
} else {
  for (const output of outputs) {
    await writeFile(output.path, output.text)
    console.log(`wrote ${output.path}`)
  }
}
