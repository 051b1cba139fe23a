/** `memsweep submit`, `extend`, `resume`, `purge` and `bundle` against a real server (the app on the embedded backend, listening on a port). */
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { unzipSync } from 'fflate'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createHarness, isTerminal, type Harness } from '../api/helpers/harness.js'
import { heldSpec } from '../api/helpers/specs.js'
import { sharedChunkGate } from '../helpers/chunk-gate.js'
import { cli } from './helpers.js'
import { withoutSweepId } from '../helpers/tables.js'

const gate = sharedChunkGate()
const TOKEN = 'alice-laptop-7f3a9c2e1b'
const spec = { label: 'rooms of a museum', neurons: 100, load: { values: [0.05, 0.12] }, trials: 20, seed: 17 }

let h: Harness
let url = ''
let dir = ''

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'memsweep-cli-submit-'))
  await writeFile(join(dir, 'spec.json'), JSON.stringify(spec))
  await writeFile(join(dir, 'held.json'), JSON.stringify(heldSpec()))
  await writeFile(join(dir, 'bad.json'), JSON.stringify({ neurons: 100, load: 0.1, dynamics: { update: 'teleport' } }))
  h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 2 }), { tokens: [`alice:${TOKEN}`] })
  url = await h.app.listen({ port: 0, host: '127.0.0.1' })
})
afterAll(async () => {
  await h.close()
  await rm(dir, { recursive: true, force: true })
})

describe('memsweep submit', () => {
  it('submits, follows the sweep and downloads the CSV the server serves', async () => {
    const res = await cli(['submit', join(dir, 'spec.json'), '--server', url, '--wait', '--output', join(dir, 'out.csv')], { env: { MEMSWEEP_TOKEN: TOKEN } })
    expect(res.code, res.stderr).toBe(0)
    const id = res.stdout.trim()
    expect(id).toMatch(/^[0-9a-f-]{36}$/)
    expect(res.stderr).toContain(`Sweep ${id} succeeded.`)
    const served = await h.app.inject({ method: 'GET', url: `/v1/sweeps/${id}/results?format=csv`, headers: { authorization: `Bearer ${TOKEN}` } })
    expect(await readFile(join(dir, 'out.csv'), 'utf8')).toBe(served.body)
  })

  it('downloads the trajectory series with --series trajectory, as the server serves it', async () => {
    await writeFile(join(dir, 'traj.json'), JSON.stringify({ ...spec, measures: { overlapTrajectory: true }, trials: 5 }))
    const res = await cli(['submit', join(dir, 'traj.json'), '--server', url, '--output', join(dir, 'traj.csv'), '--series', 'trajectory'], { env: { MEMSWEEP_TOKEN: TOKEN } })
    expect(res.code, res.stderr).toBe(0)
    const served = await h.app.inject({ method: 'GET', url: `/v1/sweeps/${res.stdout.trim()}/results?format=csv&series=trajectory`, headers: { authorization: `Bearer ${TOKEN}` } })
    expect(served.statusCode).toBe(200)
    const written = await readFile(join(dir, 'traj.csv'), 'utf8')
    expect(written).toBe(served.body)
    expect(written.split('\r\n')[0]).toContain('sweep,running,overlap.mean')
  })

  it('without --wait prints the id and returns at once', async () => {
    const res = await cli(['submit', join(dir, 'spec.json'), '--server', url, '--token', TOKEN])
    expect(res.code).toBe(0)
    const record = await h.queue.get(res.stdout.trim())
    expect(record?.owner).toBe('alice')
    await h.waitFor(record!.id, isTerminal)
  })

  it('exits 1 when the sweep is canceled while it waits', async () => {
    gate.hold()
    const waiting = cli(['submit', join(dir, 'held.json'), '--server', url, '--token', TOKEN, '--wait'])
    await gate.untilWaiting()
    const id = (await h.queue.list({ owner: 'alice', status: 'running', limit: 1 })).items[0]?.id
    if (id === undefined) throw new Error('the held sweep is not running')
    await h.app.inject({ method: 'DELETE', url: `/v1/sweeps/${id}`, headers: { authorization: `Bearer ${TOKEN}` } })
    gate.open()
    const res = await waiting
    expect(res.code).toBe(1)
    expect(res.stderr).toContain('was canceled')
  })

  it('exits 2 with the server\'s reasons for a refused spec, a missing token or a refused callback address', async () => {
    const bad = await cli(['submit', join(dir, 'bad.json'), '--server', url, '--token', TOKEN, '--wait'])
    expect(bad.code).toBe(2)
    expect(bad.stderr).toContain('422 MEMSWEEP_SPEC_INVALID')
    expect(bad.stderr).toMatch(/dynamics\.update: /)
    const anonymous = await cli(['submit', join(dir, 'spec.json'), '--server', url])
    expect(anonymous.code).toBe(2)
    expect(anonymous.stderr).toContain('401 MEMSWEEP_UNAUTHENTICATED')
    const loopback = await cli(['submit', join(dir, 'spec.json'), '--server', url, '--token', TOKEN, '--callback-url', 'http://127.0.0.1:9/done'])
    expect(loopback.code).toBe(2)
    expect(loopback.stderr).toContain('422 MEMSWEEP_CALLBACK_REFUSED')
  })

  it('exits 3 when the server cannot be reached', async () => {
    const res = await cli(['submit', join(dir, 'spec.json'), '--server', 'http://127.0.0.1:9'])
    expect(res.code).toBe(3)
    expect(res.stderr).toContain('Cannot reach http://127.0.0.1:9')
  })
})

describe('memsweep extend, resume and purge', () => {
  const auth = { authorization: `Bearer ${TOKEN}` }

  it('extends a sweep with more trials and new loads, computing only what is missing, and downloads what a fresh run gives', async () => {
    const first = await cli(['submit', join(dir, 'spec.json'), '--server', url, '--token', TOKEN, '--wait'])
    expect(first.code, first.stderr).toBe(0)
    const parent = first.stdout.trim()
    const extended = await cli(['extend', parent, '--trials', '40', '--add', 'load=0.13,0.15', '--add', 'load=0.2', '--tag', 'museum', '--server', url, '--token', TOKEN, '--output', join(dir, 'extended.csv')])
    expect(extended.code, extended.stderr).toBe(0)
    const child = extended.stdout.trim()
    // 2 loads × 20 trials of the parent are reused; 5 loads × 40 trials in all.
    expect(extended.stderr).toContain(`Extended ${parent} as sweep ${child}`)
    expect(extended.stderr).toContain('40 of its 200 trials taken from earlier sweeps, 160 to compute')
    const record = (await h.app.inject({ method: 'GET', url: `/v1/sweeps/${child}`, headers: auth })).json()
    expect(record).toMatchObject({ extends: parent, tags: ['museum'], spec: { trials: 40, load: { values: [0.05, 0.12, 0.13, 0.15, 0.2] } } })
    const fresh = await h.app.inject({ method: 'POST', url: '/v1/sweeps?reusePoints=false', headers: auth, payload: record.spec })
    await h.waitFor(fresh.json().id, isTerminal)
    const freshRows = (await h.app.inject({ method: 'GET', url: `/v1/sweeps/${fresh.json().id as string}/results`, headers: auth })).json().rows
    const childRows = (await h.app.inject({ method: 'GET', url: `/v1/sweeps/${child}/results`, headers: auth })).json().rows
    expect(JSON.stringify(childRows)).toBe(JSON.stringify(freshRows))
    const served = await h.app.inject({ method: 'GET', url: `/v1/sweeps/${child}/results?format=csv`, headers: auth })
    expect(await readFile(join(dir, 'extended.csv'), 'utf8')).toBe(served.body)
  })

  it('refuses an extension with nothing to add, or an --add that is not parameter=numbers, before calling the server', async () => {
    expect((await cli(['extend', 'some-sweep', '--server', 'http://127.0.0.1:9'])).code).toBe(2)
    const malformed = await cli(['extend', 'some-sweep', '--add', 'load=high', '--server', 'http://127.0.0.1:9'])
    expect(malformed.code).toBe(2)
    expect(malformed.stderr).toContain('must be numbers')
  })

  it('resumes a canceled sweep and waits for it; purges it only with --yes', async () => {
    gate.hold()
    const submitted = await cli(['submit', join(dir, 'held.json'), '--server', url, '--token', TOKEN])
    const id = submitted.stdout.trim()
    try {
      await gate.untilWaiting()
      await h.app.inject({ method: 'DELETE', url: `/v1/sweeps/${id}`, headers: auth })
      await h.waitFor(id, isTerminal)
    } finally {
      gate.open()
    }
    const resumed = await cli(['resume', id, '--server', url, '--token', TOKEN, '--wait'])
    expect(resumed.code, resumed.stderr).toBe(0)
    expect(resumed.stderr).toContain(`Resumed sweep ${id}`)
    expect(resumed.stderr).toContain(`Sweep ${id} succeeded.`)

    const unconfirmed = await cli(['purge', id, '--server', url, '--token', TOKEN])
    expect(unconfirmed.code).toBe(2)
    expect(unconfirmed.stderr).toContain('--yes')
    expect((await h.app.inject({ method: 'GET', url: `/v1/sweeps/${id}`, headers: auth })).statusCode).toBe(200)
    const purged = await cli(['purge', id, '--yes', '--server', url, '--token', TOKEN])
    expect(purged.code, purged.stderr).toBe(0)
    expect((await h.app.inject({ method: 'GET', url: `/v1/sweeps/${id}`, headers: auth })).statusCode).toBe(404)
    const again = await cli(['purge', id, '--yes', '--server', url, '--token', TOKEN])
    expect(again.code).toBe(2)
    expect(again.stderr).toContain('404 MEMSWEEP_SWEEP_NOT_FOUND')
  })
})

describe('memsweep bundle', () => {
  const auth = { authorization: `Bearer ${TOKEN}` }

  it('writes the server\'s zip, and the README\'s one command reproduces its results.csv byte for byte', async () => {
    const created = await h.app.inject({ method: 'POST', url: '/v1/sweeps', headers: auth, payload: { ...spec, label: 'rooms of a gallery', seed: 23 } })
    const id = created.json().id as string
    await h.waitFor(id, isTerminal)
    const zipPath = join(dir, 'supplement.zip')
    const res = await cli(['bundle', id, '--server', url, '--token', TOKEN, '-o', zipPath])
    expect(res.code, res.stderr).toBe(0)
    expect(res.stderr).toContain(`Bundle of sweep ${id} written to ${zipPath}`)
    const served = Buffer.from(await (await fetch(`${url}/v1/sweeps/${id}/bundle.zip`, { headers: auth })).arrayBuffer())
    const written = await readFile(zipPath)
    expect(Buffer.compare(written, served)).toBe(0)

    const folder = join(dir, `memsweep-${id}`)
    await mkdir(folder)
    for (const [name, bytes] of Object.entries(unzipSync(new Uint8Array(written)))) await writeFile(join(dir, name), bytes)
    const readme = await readFile(join(folder, 'README.md'), 'utf8')
    const command = /```\n(memsweep run .+)\n```/.exec(readme)?.[1]
    expect(command).toBe('memsweep run spec.json -o results.csv')
    const args = command!.split(' ').slice(1).map((arg) => (arg === 'spec.json' ? join(folder, arg) : arg === 'results.csv' ? join(dir, 'again.csv') : arg))
    const rerun = await cli([...args, '--threads', '1'])
    expect(rerun.code, rerun.stderr).toBe(0)
    // The same numbers byte for byte; only the sweepId column tells the server's sweep from a local run.
    expect(withoutSweepId(await readFile(join(dir, 'again.csv'), 'utf8'))).toBe(withoutSweepId(await readFile(join(folder, 'results.csv'), 'utf8')))
  })

  it('exits 2 with the server\'s problem for an unknown sweep', async () => {
    const res = await cli(['bundle', 'no-such-sweep', '--server', url, '--token', TOKEN])
    expect(res.code).toBe(2)
    expect(res.stderr).toContain('404 MEMSWEEP_SWEEP_NOT_FOUND')
  })
})
