/**
 * `npm start` builds only when the build's inputs changed (scripts/build-if-changed.mjs): the
 * decision is tested on a small tree in a temporary folder, with a build that writes the outputs
 * and counts how often it ran (the real one takes tsc's time and is covered by `npm run build`).
 */
import { mkdir, mkdtemp, rm, utimes, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { dirname, join } from 'node:path'
import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { BUILD_INPUTS, BUILD_OUTPUTS, buildFingerprint, buildIfChanged } from '../../scripts/build-if-changed.mjs'

async function put (root: string, file: string, text: string): Promise<void> {
  await mkdir(dirname(join(root, file)), { recursive: true })
  await writeFile(join(root, file), text)
}

describe('the outputs a complete build leaves', () => {
  it('are files the build writes: each compiled entry has its source (a wrong name rebuilt on every start)', () => {
    const project = (file: string): string => fileURLToPath(new URL(`../../${file}`, import.meta.url))
    for (const output of BUILD_OUTPUTS) {
      const source = output === 'dist/web/index.html' ? 'web/static/index.html' : output.replace(/^dist\//, 'src/').replace(/\.js$/, '.ts')
      expect(existsSync(project(source)), `${output} comes from ${source}`).toBe(true)
    }
  })
})

describe('build only when something changed', () => {
  let root: string
  let builds: number
  const build = async (at: string): Promise<void> => {
    builds++
    for (const file of BUILD_OUTPUTS) await put(at, file, `built ${builds}`)
  }

  beforeEach(async () => {
    root = await mkdtemp(join(tmpdir(), 'memsweep-build-'))
    builds = 0
    await put(root, 'src/server.ts', 'export const port = 8080\n')
    await put(root, 'src/api/app.ts', 'export {}\n')
    await put(root, 'web/src/main.ts', 'export {}\n')
    await put(root, 'web/static/index.html', '<!doctype html>\n')
    await put(root, 'examples/room-capacity.json', '{"neurons": 200}\n')
    await put(root, 'tsconfig.json', '{}\n')
    await put(root, 'package-lock.json', '{}\n')
  })
  afterEach(async () => { await rm(root, { recursive: true, force: true }) })

  it('builds the first time, then skips while nothing changed', async () => {
    expect(await buildIfChanged({ root, build })).toMatchObject({ built: true, reason: 'dist/server.js is missing' })
    expect(await buildIfChanged({ root, build })).toMatchObject({ built: false })
    expect(await buildIfChanged({ root, build })).toMatchObject({ built: false })
    expect(builds).toBe(1)
  })

  it.each(['src/api/app.ts', 'web/src/main.ts', 'web/static/index.html', 'examples/room-capacity.json', 'tsconfig.json', 'package-lock.json'])('rebuilds after %s changes', async (file) => {
    await buildIfChanged({ root, build })
    await put(root, file, 'changed\n')
    expect(await buildIfChanged({ root, build })).toMatchObject({ built: true, reason: 'the sources changed since the last build' })
    expect(builds).toBe(2)
  })

  it('rebuilds when a source file is added or an output is missing, and always with force', async () => {
    await buildIfChanged({ root, build })
    await put(root, 'src/new-module.ts', 'export {}\n')
    expect((await buildIfChanged({ root, build })).built).toBe(true)
    await rm(join(root, 'dist/web/index.html'))
    expect(await buildIfChanged({ root, build })).toMatchObject({ built: true, reason: 'dist/web/index.html is missing' })
    expect(await buildIfChanged({ root, build, force: true })).toMatchObject({ built: true, reason: 'asked to (--force)' })
    expect(builds).toBe(4)
  })

  it('goes by contents, not times: touching a file or reading the tree changes nothing', async () => {
    await buildIfChanged({ root, build })
    const before = buildFingerprint(root)
    await utimes(join(root, 'src/server.ts'), new Date(2030, 0, 1), new Date(2030, 0, 1))
    expect(buildFingerprint(root)).toBe(before)
    expect((await buildIfChanged({ root, build })).built).toBe(false)
    // Outputs are not inputs: the build's own files never make the next start rebuild.
    expect(BUILD_INPUTS.some((input) => input.startsWith('dist'))).toBe(false)
  })

  it('does not stamp a failed build, so the next start tries again', async () => {
    await buildIfChanged({ root, build })
    await put(root, 'src/server.ts', 'export const port: number = "oops"\n')
    const failing = async (): Promise<void> => { builds++; throw new Error('tsc failed') }
    await expect(buildIfChanged({ root, build: failing })).rejects.toThrow('tsc failed')
    // The outputs of the previous build are all there; only the stamp says they are stale.
    expect(await buildIfChanged({ root, build })).toMatchObject({ built: true, reason: 'the sources changed since the last build' })
    expect(builds).toBe(3)
  })

  it('fingerprints the real repository in one pass over its inputs', () => {
    const first = buildFingerprint()
    expect(first).toMatch(/^[0-9a-f]{64}$/)
    expect(buildFingerprint()).toBe(first)
  })
})
