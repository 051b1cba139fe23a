/**
 * Builds the OpenAPI document exactly as the running service serves it at /openapi.json,
 * without a backend: the routes are registered but never called. Used by
 * `npm run openapi:generate` / `openapi:check` and by the drift test.
 */
import type { SweepQueue } from '../backends/port.js'
import { loadConfig } from '../config.js'
import { createLogger } from '../logger.js'
import { buildApp } from './app.js'

/** A queue that refuses every call: building the document must never reach a backend. */
function documentOnlyQueue (): SweepQueue {
  const refuse = (): never => { throw new Error('the OpenAPI build has no queue backend') }
  // It sends no callbacks either: starting them is the one call every app makes when ready.
  return new Proxy({ kind: 'embedded', close: async () => {}, startCallbacks: () => {} } as unknown as SweepQueue, {
    get: (target, property) => Reflect.get(target, property) ?? refuse
  })
}

export async function buildOpenApiDocument (): Promise<Record<string, unknown>> {
  const app = buildApp({
    config: loadConfig({}),
    queue: documentOnlyQueue(),
    logger: createLogger({ level: 'silent' }),
    tokens: null
  })
  try {
    await app.ready()
    return app.swagger() as Record<string, unknown>
  } finally {
    await app.close()
  }
}

/** The committed file's exact text: two-space indentation and a final newline. */
export function serialiseOpenApiDocument (document: Record<string, unknown>): string {
  return JSON.stringify(document, null, 2) + '\n'
}
