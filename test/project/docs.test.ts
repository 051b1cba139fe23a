/**
 * The README's and the curl walk-through's commands, run as a reader runs them, against the
 * real server process (src/server.ts on a free port of 127.0.0.1, a temporary DATA_DIR): every
 * block marked `doc-test: run` runs in bash, one shell per page so variables carry over, and
 * what it prints must have the shapes, status lines and headers the page shows after it
 * (test/project/helpers/doc-blocks.ts says how pages are compared). So the pages cannot drift
 * from the service again.
 *
 * The commands run in a temporary folder holding copies of examples/ cut to 10 trials per
 * point (the shapes shown do not depend on the number of trials, and the full examples would
 * take most of a minute), a package.json with the repository's `memsweep` script, and links to
 * src/ and node_modules/, so `npm run -s memsweep -- …` works as in the repository. Every curl
 * call's HTTP status is recorded; unless a block says otherwise (`statuses=`), all must be 2xx/3xx.
 */
import { spawn } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { mkdir, mkdtemp, readdir, readFile, rm, stat, symlink, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServerProcess, type ServerProcess } from '../api/helpers/server-process.js'
import { extractDocBlocks, outputMismatches, parseAbridgedJson, shapeMismatches, type DocBlock, type OutputBlock, type RunBlock } from './helpers/doc-blocks.js'

const ROOT = fileURLToPath(new URL('../../', import.meta.url))
const PAGES = ['README.md', 'docs/curl-walkthrough.md']
/** The address the pages use; replaced by the live server's in the commands. */
const DOCUMENTED_SERVER = 'http://127.0.0.1:8080'
const TRIALS = 10

interface BlockRun { block: RunBlock, stdout: string, stderr: string, statuses: number[] }
interface PageRun { page: string, blocks: DocBlock[], runs: BlockRun[], workdir: string }

/** A folder to run one page's commands in (see the header). */
async function workdirFor (base: string, page: string): Promise<string> {
  const dir = join(base, page.replace(/[^A-Za-z0-9]+/g, '-'))
  await mkdir(join(dir, 'examples'), { recursive: true })
  for (const name of await readdir(join(ROOT, 'examples'))) {
    if (!name.endsWith('.json')) continue
    const spec = JSON.parse(await readFile(join(ROOT, 'examples', name), 'utf8')) as Record<string, unknown>
    if (typeof spec.trials === 'number') spec.trials = Math.min(spec.trials, TRIALS)
    if (typeof spec.trialsPerNetwork === 'number') spec.trialsPerNetwork = Math.min(spec.trialsPerNetwork, TRIALS)
    await writeFile(join(dir, 'examples', name), JSON.stringify(spec, null, 2))
  }
  const manifest = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { type: string, scripts: Record<string, string> }
  await writeFile(join(dir, 'package.json'), JSON.stringify({ name: 'memsweep-docs-check', private: true, type: manifest.type, scripts: { memsweep: manifest.scripts.memsweep } }))
  await symlink(join(ROOT, 'src'), join(dir, 'src'))
  await symlink(join(ROOT, 'node_modules'), join(dir, 'node_modules'))
  return dir
}

/** One bash script for the page: each run block's output goes to its own files. */
function scriptFor (runs: RunBlock[], serverUrl: string, outDir: string): string {
  const lines = [
    'set -eo pipefail',
    // Every curl call reports its status on standard error; a block's own -w comes later and wins.
    'curl () { command curl -w \'%{stderr}@@status %{http_code}\\n\' "$@"; }'
  ]
  runs.forEach((block, i) => {
    lines.push(
      `echo ${i} > '${outDir}/current'`,
      `exec >'${outDir}/${i}.out' 2>'${outDir}/${i}.err'`,
      block.code.replaceAll(DOCUMENTED_SERVER, serverUrl)
    )
  })
  return lines.join('\n') + '\n'
}

async function runPage (page: string, base: string, serverUrl: string): Promise<PageRun> {
  const blocks = extractDocBlocks(readFileSync(join(ROOT, page), 'utf8'))
  const runBlocks = blocks.filter((b): b is RunBlock => b.kind === 'run')
  const workdir = await workdirFor(base, page)
  const outDir = join(workdir, '.doc-test')
  await mkdir(outDir)
  const script = join(outDir, 'page.sh')
  await writeFile(script, scriptFor(runBlocks, serverUrl, outDir))
  const child = spawn('bash', [script], { cwd: workdir, stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, NO_COLOR: '1' } })
  const code = await new Promise<number | null>((resolve) => child.on('close', resolve))
  const runs: BlockRun[] = []
  for (const [i, block] of runBlocks.entries()) {
    const read = async (suffix: string): Promise<string | null> => await readFile(join(outDir, `${i}.${suffix}`), 'utf8').catch(() => null)
    const [stdout, stderrWithStatuses] = [await read('out'), await read('err')]
    if (stdout === null || stderrWithStatuses === null) break
    const statuses = [...stderrWithStatuses.matchAll(/^@@status (\d+)$/gm)].map((m) => Number(m[1]))
    runs.push({ block, stdout, stderr: stderrWithStatuses.replace(/^@@status \d+\n/gm, ''), statuses })
  }
  if (code !== 0) {
    const failed = runs.at(-1)
    throw new Error(`${page}: the block at line ${failed?.block.line ?? '?'} failed (bash exit ${code ?? 'signal'}):\n${failed?.block.code ?? ''}\n--- stdout\n${failed?.stdout ?? ''}\n--- stderr\n${failed?.stderr ?? ''}`)
  }
  return { page, blocks, runs, workdir }
}

/** Each output block with the run block it follows. */
function outputsAfterRuns (blocks: DocBlock[]): Array<{ run: RunBlock, output: OutputBlock }> {
  const pairs: Array<{ run: RunBlock, output: OutputBlock }> = []
  let last: RunBlock | null = null
  for (const block of blocks) {
    if (block.kind === 'run') last = block
    else if (block.kind === 'output') {
      if (last === null) throw new Error(`output block at line ${block.line} follows no run block`)
      pairs.push({ run: last, output: block })
      last = null
    }
  }
  return pairs
}

describe('the pages\' commands against a live server', () => {
  let base: string
  let server: ServerProcess
  const pages = new Map<string, PageRun>()

  beforeAll(async () => {
    base = await mkdtemp(join(tmpdir(), 'memsweep-docs-'))
    server = await startServerProcess({ DATA_DIR: join(base, 'data'), WORKER_THREADS: '2' })
    // The two pages share the server, as two readers would; they run side by side.
    const done = await Promise.all(PAGES.map(async (page) => await runPage(page, base, server.url)))
    for (const run of done) pages.set(run.page, run)
  }, 120_000)

  afterAll(async () => {
    server?.child.kill('SIGTERM')
    await server?.exited
    await rm(base, { recursive: true, force: true })
  })

  it.each(PAGES)('%s: every marked block ran, and its curl calls answered as the page says', (page) => {
    const run = pages.get(page)!
    const marked = run.blocks.filter((b) => b.kind === 'run')
    expect(marked.length).toBeGreaterThanOrEqual(2)
    expect(run.runs.map((r) => r.block)).toEqual(marked)
    for (const { block, statuses } of run.runs) {
      const allowed = (status: number): boolean => block.statuses === null ? status >= 200 && status < 400 : block.statuses.includes(status)
      expect(statuses.filter((s) => !allowed(s)), `curl statuses of the block at ${page}:${block.line}: ${statuses.join(', ')}`).toEqual([])
      if (block.statuses !== null) expect(statuses.length, `${page}:${block.line}`).toBeGreaterThan(0)
    }
  })

  it.each(PAGES)('%s: the outputs shown are what the commands print', (page) => {
    const run = pages.get(page)!
    const pairs = outputsAfterRuns(run.blocks)
    if (page === 'docs/curl-walkthrough.md') expect(pairs.length).toBeGreaterThanOrEqual(10)
    // Every drift at once, each named by the line of the page that shows the output.
    const problems = pairs.flatMap(({ run: block, output }) => {
      const printed = run.runs.find((r) => r.block === block)!.stdout
      return outputMismatches(output, printed).map((problem) => `${page}:${output.line}: ${problem}`)
    })
    expect(problems).toEqual([])
  })

  it.each(PAGES)('%s: the files the commands write are there and of their kind', async (page) => {
    const run = pages.get(page)!
    for (const { block } of run.runs) {
      for (const file of block.creates) {
        const path = join(run.workdir, file)
        expect((await stat(path)).size, `${page}:${block.line} wrote ${file}`).toBeGreaterThan(0)
        const text = await readFile(path, 'utf8')
        if (file.endsWith('.svg')) expect(text).toMatch(/^(<\?xml[^>]*>\s*)?<svg[\s>]/)
        if (file.endsWith('.json')) expect(JSON.parse(text)).toMatchObject({ specHash: expect.any(String), rows: expect.any(Array) })
        if (file.endsWith('.csv')) expect(text.split(/\r?\n/)[0]).toMatch(/^[\w.-]+(,[\w.-]+)+$/)
      }
    }
  })

  it.each(PAGES)('%s: the start-up line shown is the server\'s, for the default settings', (page) => {
    const shown = pages.get(page)!.blocks.filter((b) => b.kind === 'startup-line')
    expect(shown).toHaveLength(1)
    const line = server.logLines.find((l) => l.listening !== undefined)
    const listening = line!.listening as { address: string, dataDir: string }
    // The live server runs on a free port with a temporary folder; the page shows the defaults.
    const asDocumented = String(line!.msg).replace(listening.address, DOCUMENTED_SERVER).replace(`data in ${listening.dataDir}`, 'data in ./data')
    expect(shown[0]!.text).toBe(asDocumented)
  })
})

describe('the page checker', () => {
  it('finds the marked blocks and reads abridged JSON', () => {
    const page = '<!-- doc-test: run statuses=409 creates=a.svg -->\n```sh\ncurl -s $S\n```\n\n<!-- doc-test: output json exact=code -->\n```json\n{"code":"X", …, "errors":[{"path":"a"}, ...]}\n```\n'
    const blocks = extractDocBlocks(page)
    expect(blocks.map((b) => b.kind)).toEqual(['run', 'output'])
    expect(blocks[0]).toMatchObject({ code: 'curl -s $S', statuses: [409], creates: ['a.svg'] })
    expect(parseAbridgedJson((blocks[1] as OutputBlock).text)).toEqual([{ code: 'X', errors: [{ path: 'a' }] }])
    expect(parseAbridgedJson('{"status":"ok"}\n{"status":"ready"}')).toEqual([{ status: 'ok' }, { status: 'ready' }])
    expect(() => extractDocBlocks('<!-- doc-test: run -->\nno block here\n')).toThrow(/not followed by a fenced block/)
  })

  it('fails a missing member, a changed type, an exact value that differs, and a wrong status line or header', () => {
    const exact = new Set(['status'])
    expect(shapeMismatches({ a: 1, b: { c: 'x' } }, { a: 2, b: { c: 'y', d: 0 }, e: 1 }, exact)).toEqual([])
    expect(shapeMismatches({ a: 1, timing: { wallSeconds: 1 } }, { a: 1 }, exact)).toEqual(["$: the page shows member 'timing', the service gave none"])
    expect(shapeMismatches({ a: 1 }, { a: '1' }, exact)).toHaveLength(1)
    expect(shapeMismatches({ status: 'running' }, { status: 'succeeded' }, exact)).toHaveLength(1)
    const http: OutputBlock = { kind: 'output', line: 1, format: 'http', exact, text: 'HTTP/1.1 202 Accepted\nretry-after: 2\nlocation: /v1/sweeps/d3b0557e-283f-4d1d-8ac1-6631fafb5682\n\n{"status":"running"}' }
    expect(outputMismatches(http, 'HTTP/1.1 202 Accepted\r\nlocation: /v1/sweeps/11111111-2222-3333-4444-555555555555\r\nretry-after: 2\r\n\r\n{"status":"running","id":"x"}')).toEqual([])
    expect(outputMismatches(http, 'HTTP/1.1 200 OK\r\nlocation: /v1/sweeps/11111111-2222-3333-4444-555555555555\r\n\r\n{"status":"succeeded"}')).toEqual([
      "status line: the page shows 'HTTP/1.1 202 Accepted', the service sent 'HTTP/1.1 200 OK'",
      "header 'retry-after': shown on the page, not sent",
      'body $.status: the page shows "running", the service gave "succeeded"'
    ])
  })

  it('fails an event stream that does not end with the event the page shows last', () => {
    const sse: OutputBlock = { kind: 'output', line: 1, format: 'sse', exact: new Set(), text: 'retry: 3000\n\nid: 1\nevent: snapshot\ndata: {"status":"running"}\n\nid: 2\nevent: state\ndata: {"status":"succeeded"}\n' }
    expect(outputMismatches(sse, 'retry: 3000\n\nid: 1\nevent: snapshot\ndata: {"status":"succeeded"}\n\nid: 2\nevent: state\ndata: {"status":"succeeded"}\n\n')).toEqual([])
    expect(outputMismatches(sse, 'retry: 3000\n\nid: 1\nevent: snapshot\ndata: {"status":"succeeded"}\n\n')).toEqual(["last event: the page shows 'state', the service sent 'snapshot'"])
  })
})
