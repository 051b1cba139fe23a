#!/usr/bin/env node
/**
 * `npm start` and `npm run worker` build first, but only when something the build reads has
 * changed since the last build: the sources of the service (src/), of the web page (web/), the
 * examples the page offers, the compiler settings and the lockfile. Their contents are hashed
 * (not their times, which a checkout or a copy changes) and compared with the stamp the last
 * build left in dist/. `--force` (used by `npm run build`) always builds.
 */
import { spawnSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { join, relative, resolve, sep } from 'node:path'
import { fileURLToPath } from 'node:url'

const repoRoot = fileURLToPath(new URL('..', import.meta.url))

/** Folders and files whose contents decide the build's output. */
export const BUILD_INPUTS = ['src', 'web', 'examples', 'scripts/build-web.mjs', 'scripts/build-if-changed.mjs', 'tsconfig.json', 'tsconfig.build.json', 'package.json', 'package-lock.json']
/** Files a complete build leaves; if one is missing the build runs whatever the stamp says. */
export const BUILD_OUTPUTS = ['dist/server.js', 'dist/worker.js', 'dist/cli/main.js', 'dist/web/index.html']
export const STAMP = 'dist/.build-stamp.json'

function listFiles (root, entry) {
  const path = join(root, entry)
  if (!existsSync(path)) return []
  if (!statSync(path).isDirectory()) return [path]
  return readdirSync(path, { recursive: true, withFileTypes: true })
    .filter((item) => item.isFile())
    .map((item) => join(item.parentPath, item.name))
}

/** sha256 over every input file's path and bytes, in a fixed order. */
export function buildFingerprint (root = repoRoot) {
  const files = BUILD_INPUTS.flatMap((entry) => listFiles(root, entry))
    .map((file) => relative(root, file).split(sep).join('/'))
    .sort()
  const hash = createHash('sha256')
  for (const file of files) {
    hash.update(file).update('\0').update(readFileSync(join(root, file))).update('\0')
  }
  return hash.digest('hex')
}

function readStamp (root) {
  try {
    return JSON.parse(readFileSync(join(root, STAMP), 'utf8')).fingerprint ?? null
  } catch {
    return null
  }
}

/** The full build: the service with tsc, then the web page (type-checked). */
async function defaultBuild (root) {
  const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc')
  const compiled = spawnSync(process.execPath, [tsc, '-p', join(root, 'tsconfig.build.json')], { stdio: 'inherit' })
  if (compiled.status !== 0) throw new Error('tsc failed (see above)')
  const { buildWeb } = await import('./build-web.mjs')
  buildWeb(join(root, 'dist', 'web'))
}

/**
 * Builds unless the stamp matches the inputs and every output is there. Returns whether it
 * built and why. `build` is the build itself (the real one by default).
 */
export async function buildIfChanged ({ root = repoRoot, force = false, build = defaultBuild } = {}) {
  const fingerprint = buildFingerprint(root)
  const missing = BUILD_OUTPUTS.filter((file) => !existsSync(join(root, file)))
  let reason = null
  if (force) reason = 'asked to (--force)'
  else if (missing.length > 0) reason = `${missing[0]} is missing`
  else if (readStamp(root) !== fingerprint) reason = 'the sources changed since the last build'
  if (reason === null) return { built: false, reason: 'nothing changed since the last build', fingerprint }
  await build(root)
  mkdirSync(join(root, 'dist'), { recursive: true })
  // The stamp names the inputs as they were when the build started: an edit during the build
  // leaves a stale stamp, so the next start builds again.
  writeFileSync(join(root, STAMP), JSON.stringify({ fingerprint, builtAt: new Date().toISOString() }) + '\n')
  return { built: true, reason, fingerprint }
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  try {
    const started = Date.now()
    const outcome = await buildIfChanged({ force: process.argv.includes('--force') })
    if (outcome.built) console.error(`built dist/ in ${((Date.now() - started) / 1000).toFixed(1)} s (${outcome.reason})`)
    else console.error('dist/ is up to date: nothing changed since the last build')
  } catch (error) {
    console.error(error instanceof Error ? error.message : error)
    process.exit(1)
  }
}
