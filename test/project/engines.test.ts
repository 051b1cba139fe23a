/**
 * `npm ci` prints no engine warning on the Node versions package.json declares: every package
 * in the lockfile must accept every version of the declared range (npm warns with EBADENGINE
 * for each installed package whose engines.node excludes the running Node).
 */
import { readFileSync } from 'node:fs'
import Fastify from 'fastify'
import semver from 'semver'
import { describe, expect, it } from 'vitest'

interface LockEntry { version?: string, engines?: Record<string, string> | string[] }

const root = new URL('../../', import.meta.url)
const manifest = JSON.parse(readFileSync(new URL('package.json', root), 'utf8')) as { engines?: { node?: string } }
const lock = JSON.parse(readFileSync(new URL('package-lock.json', root), 'utf8')) as { lockfileVersion: number, packages: Record<string, LockEntry> }

/** The packages of the lockfile whose engines.node leaves out part of `declared`. */
function packagesExcluding (declared: string, packages: Record<string, LockEntry>): string[] {
  const excluding: string[] = []
  for (const [path, entry] of Object.entries(packages)) {
    if (path === '') continue
    // An array is the long-obsolete form of "engines" that npm no longer reads.
    const wanted = entry.engines === undefined || Array.isArray(entry.engines) ? undefined : entry.engines.node
    if (wanted === undefined) continue
    const name = `${path.replace(/^.*node_modules\//, '')}@${entry.version ?? '?'} (engines.node "${wanted}")`
    if (semver.validRange(wanted) === null || !semver.subset(declared, wanted)) excluding.push(name)
  }
  return excluding
}

describe('declared Node versions', () => {
  const declared = manifest.engines?.node

  it('package.json declares a precise Node range within Node 20', () => {
    expect(declared).toBeDefined()
    expect(semver.validRange(declared!)).not.toBeNull()
    // The stack is Node 20: the range names its first supported release and stops before 21.
    expect(semver.minVersion(declared!)?.major).toBe(20)
    expect(semver.intersects(declared!, '>=21')).toBe(false)
  })

  it('no package in the lockfile requires a Node version outside the declared range', () => {
    expect(lock.lockfileVersion).toBeGreaterThanOrEqual(2)
    expect(Object.keys(lock.packages).length).toBeGreaterThan(100)
    expect(packagesExcluding(declared!, lock.packages)).toEqual([])
  })

  it('the check catches a package that needs a newer Node (the cookie@2 case)', () => {
    const packages = {
      '': {},
      'node_modules/light-my-request/node_modules/cookie': { version: '2.0.2', engines: { node: '>=22' } },
      'node_modules/fine': { version: '1.0.0', engines: { node: '>=18' } },
      'node_modules/narrow': { version: '1.0.0', engines: { node: '^20.20.0' } }
    }
    expect(packagesExcluding('^20.19.0', packages)).toEqual([
      'cookie@2.0.2 (engines.node ">=22")',
      'narrow@1.0.0 (engines.node "^20.20.0")'
    ])
  })

  it('inject (light-my-request) works with the cookie version the override pins for Node 20', async () => {
    const app = Fastify()
    app.get('/echo', async (request) => ({ cookie: request.headers.cookie ?? null }))
    try {
      const res = await app.inject({ method: 'GET', url: '/echo', cookies: { room: 'north wing', floor: '2' } })
      expect(res.json()).toEqual({ cookie: 'room=north%20wing; floor=2' })
    } finally {
      await app.close()
    }
  })
})
