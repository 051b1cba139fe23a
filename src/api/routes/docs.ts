/**
 * The API reference at `/docs`: @fastify/swagger-ui renders the same generated OpenAPI
 * document as `/openapi.json`, from files shipped in the package (no network), under the
 * content security policy of the lab's page, in the page's colours. Public like the page:
 * the document is the repository's openapi/openapi.json, nothing a token protects. The
 * renderer sets one inline style that the policy refuses; nothing shown depends on it
 * (test/web/docs.test.ts checks that no script is refused and every operation is listed).
 */
import { readFile } from 'node:fs/promises'
import fastifySwaggerUi from '@fastify/swagger-ui'
import type { FastifyPluginAsync } from 'fastify'
import { PAGE_CONTENT_SECURITY_POLICY } from '../page-security.js'

export const DOCS_PREFIX = '/docs'

/** The page's palette (web/static/style.css) on the renderer's parts, and no top bar. */
const THEME_CSS = `
body { background: #f5f3ee; margin: 0; }
.swagger-ui .topbar { display: none; }
.swagger-ui, .swagger-ui .info .title, .swagger-ui .opblock-tag, .swagger-ui .opblock .opblock-summary-description {
  font-family: "Source Sans 3", "Segoe UI", system-ui, sans-serif; color: #1a1d21;
}
.swagger-ui .info { margin: 28px 0 12px; border-left: 6px solid #14324a; padding-left: 16px; }
.swagger-ui .info .title { color: #14324a; }
.swagger-ui .info a, .swagger-ui a.nostyle { color: #0d5573; }
.swagger-ui .opblock-tag { border-bottom: 2px solid #d6d1c6; text-transform: lowercase; letter-spacing: 0.02em; }
.swagger-ui .opblock { border-radius: 6px; box-shadow: none; background: #ffffff; border: 1px solid #d6d1c6; }
.swagger-ui .opblock .opblock-summary-method { border-radius: 3px; min-width: 72px; font-family: ui-monospace, "DejaVu Sans Mono", monospace; }
.swagger-ui .opblock.opblock-get .opblock-summary-method { background: #0d5573; }
.swagger-ui .opblock.opblock-post .opblock-summary-method { background: #1b6640; }
.swagger-ui .opblock.opblock-patch .opblock-summary-method { background: #9a5f00; }
.swagger-ui .opblock.opblock-delete .opblock-summary-method { background: #9e2417; }
.swagger-ui .opblock.opblock-get, .swagger-ui .opblock.opblock-post, .swagger-ui .opblock.opblock-patch, .swagger-ui .opblock.opblock-delete { background: #ffffff; border-color: #d6d1c6; }
.swagger-ui .opblock .opblock-summary { border-bottom-color: #d6d1c6; }
.swagger-ui .btn.execute { background: #0d5573; border-color: #0d5573; }
.swagger-ui .scheme-container { background: transparent; box-shadow: none; border-bottom: 1px solid #d6d1c6; }
`

/** The page's icon, from the repository (src/ and dist/ are both three levels below it); none where it is not shipped. */
const ICON = new URL('../../../web/static/icon.svg', import.meta.url)

export const docsRoutes: FastifyPluginAsync = async (app) => {
  const icon = await readFile(ICON).catch(() => null)
  // Every route the renderer adds (the page, its files, the document) is public, as the lab's page is.
  // (They stay under the rate limit: its own onRoute hook, at the root, has already seen them.)
  app.addHook('onRoute', (route) => {
    route.config = { ...(route.config as object | undefined), public: true } as typeof route.config
  })
  await app.register(fastifySwaggerUi, {
    routePrefix: DOCS_PREFIX,
    staticCSP: PAGE_CONTENT_SECURITY_POLICY,
    theme: {
      title: 'memsweep API reference',
      css: [{ filename: 'memsweep.css', content: THEME_CSS }],
      favicon: icon === null ? [] : [{ filename: 'icon.svg', rel: 'icon', sizes: 'any', type: 'image/svg+xml', content: icon }]
    },
    uiConfig: {
      deepLinking: true,
      docExpansion: 'list',
      defaultModelsExpandDepth: 0,
      displayOperationId: true,
      tryItOutEnabled: false
    }
  })
}
