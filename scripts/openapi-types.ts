/**
 * TypeScript types of the API, generated from the OpenAPI document by openapi-typescript:
 * the one source of the shapes the web page and the CLI read (src/api-types/openapi.d.ts).
 */
import openapiTS, { astToString } from 'openapi-typescript'

const HEADER = [
  '/**',
  ' * The API\'s request and response shapes, generated from openapi/openapi.json by',
  ' * openapi-typescript (`npm run openapi:generate`; checked by `npm run openapi:check`).',
  ' * Never edited by hand: change the route schemas in src/api and regenerate.',
  ' */',
  ''
].join('\n')

export async function generateApiTypes (documentText: string): Promise<string> {
  const ast = await openapiTS(documentText, { exportType: true, alphabetize: false, silent: true })
  return HEADER + astToString(ast)
}
