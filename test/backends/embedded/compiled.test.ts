/**
 * The embedded backend as shipped: compiled JavaScript, compute threads loading
 * chunk-worker.js with no TypeScript loader. The sources it needs are transpiled here
 * (no type check: `npm run typecheck` does that) into a scratch directory, and a separate
 * plain `node` process, started with the engine flags as `npm start` is, runs a sweep from them.
 */
import { execFile } from 'node:child_process'
import { mkdirSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs'
import { dirname, join, relative } from 'node:path'
import { fileURLToPath } from 'node:url'
import { promisify } from 'node:util'
import ts from 'typescript'
import { afterAll, describe, expect, it } from 'vitest'
import { makeDataDir } from './helpers.js'
import { ENGINE_PROCESS_FLAGS } from '../../../src/runtime/node-flags.js'

const repoRoot = fileURLToPath(new URL('../../../', import.meta.url))
/** The backend and everything it imports; the API, CLI, server and Redis backend are not needed. */
const SOURCES = ['src/backends/port.ts', 'src/backends/errors.ts', 'src/backends/embedded', 'src/spec', 'src/sweep', 'src/results', 'src/engine', 'src/runtime']

function typeScriptFiles (path: string): string[] {
  const absolute = join(repoRoot, path)
  if (absolute.endsWith('.ts')) return [absolute]
  return readdirSync(absolute, { recursive: true, encoding: 'utf8' }).filter(file => file.endsWith('.ts')).map(file => join(absolute, file))
}

function transpileInto (outDir: string): void {
  const options: ts.CompilerOptions = { module: ts.ModuleKind.ES2022, target: ts.ScriptTarget.ES2022, verbatimModuleSyntax: true }
  for (const path of SOURCES) {
    for (const source of typeScriptFiles(path)) {
      const target = join(outDir, relative(join(repoRoot, 'src'), source)).replace(/\.ts$/, '.js')
      const output = ts.transpileModule(readFileSync(source, 'utf8'), { compilerOptions: options, fileName: source })
      mkdirSync(dirname(target), { recursive: true })
      writeFileSync(target, output.outputText)
    }
  }
  writeFileSync(join(outDir, 'package.json'), '{ "type": "module" }\n')
  symlinkSync(join(repoRoot, 'node_modules'), join(outDir, 'node_modules'), 'dir')
}

const SWEEP_SCRIPT = `
import { createEmbeddedQueue } from './backends/embedded/index.js'
import { normaliseSpec } from './spec/index.js'
import { resultToCsv } from './results/index.js'
const queue = await createEmbeddedQueue({ dataDir: process.argv[2], threads: 2 })
const sweep = await queue.submit({ spec: normaliseSpec(JSON.parse(process.argv[3])), owner: null })
const status = await new Promise(resolve => queue.subscribe(sweep.id, event => {
  if (event.type === 'state' && event.sweep.status !== 'running') resolve(event.sweep.status)
}))
process.stdout.write(JSON.stringify({ status, csv: resultToCsv({ ...await queue.results(sweep.id), trials: await queue.trials(sweep.id) }, { perTrial: true }) }))
await queue.close()
`

describe('embedded queue from compiled JavaScript', () => {
  const scratch = makeDataDir()
  afterAll(() => scratch.remove())

  it('runs a sweep on plain-node compute threads, with the same bytes as the TypeScript build', async () => {
    const outDir = join(scratch.dir, 'dist')
    transpileInto(outDir)
    writeFileSync(join(outDir, 'sweep.mjs'), SWEEP_SCRIPT)
    const input = { neurons: 100, load: { values: [0.05, 0.1] }, trials: 20, seed: 5 }
    const { stdout } = await promisify(execFile)(process.execPath, [...ENGINE_PROCESS_FLAGS, join(outDir, 'sweep.mjs'), join(scratch.dir, 'data'), JSON.stringify(input)], { timeout: 60_000 })
    const compiled = JSON.parse(stdout) as { status: string, csv: string }
    expect(compiled.status).toBe('succeeded')

    const { normaliseSpec } = await import('../../../src/spec/index.js')
    const { planSweep, computeChunk, assembleResult, makeProvenance } = await import('../../../src/sweep/index.js')
    const { resultToCsv } = await import('../../../src/results/index.js')
    const { runtimeFacts } = await import('../../../src/runtime/facts.js')
    const spec = normaliseSpec(input)
    const local = assembleResult(spec, planSweep(spec).chunks.map(chunk => computeChunk(spec, chunk)), makeProvenance(spec, runtimeFacts(), { wallSeconds: 0, cpuSeconds: 0 }))
    expect(compiled.csv).toBe(resultToCsv(local, { perTrial: true }))
  })
})
