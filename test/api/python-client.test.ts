/**
 * clients/python/memsweep_client.py against the real server (embedded backend, listening on
 * a port): the command-line path (submit, follow the events, download CSV) and the module's
 * other calls. Needs python3 with `requests`, as the client does.
 */
import { spawn, spawnSync } from 'node:child_process'
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createHarness, type Harness } from './helpers/harness.js'

const CLIENT_DIR = fileURLToPath(new URL('../../clients/python/', import.meta.url))
const TOKEN = 'python-notebook-5b2c9e71d0'
const spec = { label: 'rooms of a school', neurons: 100, load: { values: [0.05, 0.15] }, trials: 16, seed: 29 }

let h: Harness
let url = ''
let dir = ''

/** Runs python3 without blocking this process, which is also the server answering it. */
async function python (args: string[]): Promise<{ status: number | null, stdout: string, stderr: string }> {
  const child = spawn('python3', args, { cwd: CLIENT_DIR, env: { ...process.env, MEMSWEEP_TOKEN: TOKEN }, timeout: 60_000 })
  let stdout = ''
  let stderr = ''
  child.stdout.on('data', (chunk: Buffer) => { stdout += chunk.toString('utf8') })
  child.stderr.on('data', (chunk: Buffer) => { stderr += chunk.toString('utf8') })
  const status = await new Promise<number | null>((resolve) => child.on('close', (code) => resolve(code)))
  return { status, stdout, stderr }
}

beforeAll(async () => {
  const check = spawnSync('python3', ['-c', 'import requests'], { encoding: 'utf8' })
  if (check.status !== 0) throw new Error(`the Python client needs python3 with requests: ${check.stderr}`)
  dir = await mkdtemp(join(tmpdir(), 'memsweep-py-'))
  await writeFile(join(dir, 'spec.json'), JSON.stringify(spec))
  h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 2 }), { tokens: [`ada:${TOKEN}`] })
  url = await h.app.listen({ port: 0, host: '127.0.0.1' })
})
afterAll(async () => {
  await h?.close()
  if (dir !== '') await rm(dir, { recursive: true, force: true })
})

describe('Python client', () => {
  it('submits from the command line, follows the sweep and downloads the CSV', async () => {
    const out = join(dir, 'school.csv')
    const res = await python(['memsweep_client.py', join(dir, 'spec.json'), '--server', url, '--output', out])
    expect(res.status, res.stderr).toBe(0)
    const id = res.stdout.trim()
    expect(res.stderr).toMatch(/succeeded 100%/)
    const served = await h.app.inject({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv`, headers: { authorization: `Bearer ${TOKEN}` } })
    expect(await readFile(out, 'utf8')).toBe(served.body)
  })

  it('validates, evaluates theory, lists, reads JSON results and reports problems', async () => {
    const script = `
import json, sys
from memsweep_client import MemsweepClient, MemsweepError
c = MemsweepClient(${JSON.stringify(url)}, ${JSON.stringify(TOKEN)})
spec = json.load(open(${JSON.stringify(join(dir, 'spec.json'))}))
v = c.validate(spec)
t = c.theory(spec)
s = c.submit(spec, idempotency_key="py-1")
again = c.submit(spec, idempotency_key="py-1")
final = c.wait(s["id"])
rows = c.results(s["id"])["rows"]
listed = [x["id"] for x in c.sweeps(page_size=1)]
try:
    c.submit({"neurons": 0, "patterns": 1})
    problem = None
except MemsweepError as e:
    problem = {"status": e.status, "code": e.code, "paths": [i["path"] for i in e.problem["errors"]]}
print(json.dumps({"trials": v["work"]["trials"], "theory": len(t["points"]), "same": s["id"] == again["id"],
                  "final": final["status"], "rows": len(rows), "listed": s["id"] in listed, "problem": problem}))
`
    const res = await python(['-c', script])
    expect(res.status, res.stderr).toBe(0)
    expect(JSON.parse(res.stdout)).toEqual({
      trials: 32,
      theory: 2,
      same: true,
      final: 'succeeded',
      rows: 2,
      listed: true,
      problem: { status: 422, code: 'MEMSWEEP_SPEC_INVALID', paths: ['neurons'] }
    })
  })
})
