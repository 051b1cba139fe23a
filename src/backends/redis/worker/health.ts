/**
 * Probes for an orchestrator: `/livez` answers 200 while the process runs (a liveness probe
 * must not check dependencies, or a Redis outage restarts every worker); `/readyz` answers
 * 200 while the worker takes chunks and Redis answers, 503 with the reason otherwise
 * (draining after SIGTERM or at its run-time limit, Redis unreachable).
 */
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import type { Logger } from 'pino'

export interface HealthServerOptions {
  port: number
  host: string
  logger: Logger
  readiness: () => Promise<{ ready: boolean, reason: string }>
}

export interface HealthServer {
  readonly port: number
  close: () => Promise<void>
}

export async function startHealthServer (options: HealthServerOptions): Promise<HealthServer> {
  const server = createServer((request, response) => {
    const answer = (status: number, body: Record<string, unknown>): void => {
      response.writeHead(status, { 'content-type': 'application/json', 'cache-control': 'no-store' })
      response.end(JSON.stringify(body))
    }
    const path = (request.url ?? '/').split('?')[0]
    if (request.method !== 'GET' && request.method !== 'HEAD') return answer(405, { status: 'method not allowed' })
    if (path === '/livez') return answer(200, { status: 'alive' })
    if (path !== '/readyz') return answer(404, { status: 'not found', routes: ['/livez', '/readyz'] })
    options.readiness().then(
      ({ ready, reason }) => answer(ready ? 200 : 503, { status: ready ? 'ready' : 'not ready', reason }),
      (err: unknown) => answer(503, { status: 'not ready', reason: err instanceof Error ? err.message : String(err) })
    )
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(options.port, options.host, () => {
      server.off('error', reject)
      resolve()
    })
  })
  const port = (server.address() as AddressInfo).port
  options.logger.info({ host: options.host, port }, 'worker probes on /livez and /readyz')
  return {
    port,
    close: () => new Promise((resolve) => {
      server.closeAllConnections()
      server.close(() => resolve())
    })
  }
}
