#!/usr/bin/env node
/**
 * Builds the web page into dist/web (or --out DIR): the TypeScript modules of web/src compiled
 * by tsc as they are (the browser loads ES modules, so no bundler), the files of web/static,
 * and the example specs of examples/ as one JSON file for the submit page. Runs in `npm run
 * build` (type-checked; `npm run typecheck` checks web/ too); the web tests build into a
 * temporary folder without the type check, which takes the bulk of the time.
 */
import { spawnSync } from 'node:child_process'
import { cpSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { dirname, join, relative, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

const root = fileURLToPath(new URL('..', import.meta.url))

function outDirFromArgs (argv) {
  const at = argv.indexOf('--out')
  if (at === -1) return join(root, 'dist', 'web')
  const value = argv[at + 1]
  if (value === undefined || value.startsWith('--')) throw new Error('--out needs a folder')
  return resolve(value)
}

/** Every examples/*.json with its file name; the submit page offers each as a starting point. */
function readExamples () {
  const folder = join(root, 'examples')
  return readdirSync(folder).filter((name) => name.endsWith('.json')).sort().map((name) => ({
    name: name.replace(/\.json$/, ''),
    spec: JSON.parse(readFileSync(join(folder, name), 'utf8'))
  }))
}

/** tsc on web/tsconfig.json: type-checks the whole page and writes it to `assets`. */
function compileChecked (assets) {
  const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc')
  const compiled = spawnSync(process.execPath, [tsc, '-p', join(root, 'web', 'tsconfig.json'), '--outDir', assets], { encoding: 'utf8' })
  if (compiled.status !== 0) {
    throw new Error(`tsc failed on web/src:\n${compiled.stdout}${compiled.stderr}`)
  }
}

/** Each module translated on its own with the same compiler options, without the type check. */
function compileFast (assets) {
  const ts = createRequire(import.meta.url)('typescript')
  const configFile = join(root, 'web', 'tsconfig.json')
  const { config } = ts.readConfigFile(configFile, ts.sys.readFile)
  const parsed = ts.parseJsonConfigFileContent(config, ts.sys, dirname(configFile))
  const sourceRoot = join(root, 'web', 'src')
  for (const file of parsed.fileNames) {
    const target = join(assets, relative(sourceRoot, file)).replace(/\.ts$/, '.js')
    const output = ts.transpileModule(readFileSync(file, 'utf8'), { compilerOptions: { ...parsed.options, sourceMap: false, inlineSourceMap: true }, fileName: file })
    mkdirSync(dirname(target), { recursive: true })
    writeFileSync(target, output.outputText)
  }
}

export function buildWeb (out, { typecheck = true } = {}) {
  rmSync(out, { recursive: true, force: true })
  const assets = join(out, 'assets')
  mkdirSync(assets, { recursive: true })
  if (typecheck) compileChecked(assets)
  else compileFast(assets)
  cpSync(join(root, 'web', 'static', 'index.html'), join(out, 'index.html'))
  for (const name of readdirSync(join(root, 'web', 'static'))) {
    if (name !== 'index.html') cpSync(join(root, 'web', 'static', name), join(out, 'assets', name))
  }
  writeFileSync(join(out, 'assets', 'examples.json'), JSON.stringify(readExamples()) + '\n')
  return out
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  try {
    const out = buildWeb(outDirFromArgs(process.argv.slice(2)))
    console.log(`web page built in ${out}`)
  } catch (error) {
    console.error(error instanceof Error ? error.message : error)
    process.exit(1)
  }
}
