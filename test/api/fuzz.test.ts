/**
 * Hostile and malformed bodies at the submit route (fast-check): every answer is a 4xx
 * problem document or a 202 for the rare valid spec, never a 5xx, a hang or a crash; grids
 * over the limits are refused with the limit named, before anything is allocated.
 */
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createEmbeddedQueue } from '../../src/backends/embedded/index.js'
import { createHarness, type Harness } from './helpers/harness.js'

/** Longest a single answer may take before we call it a hang. */
const ANSWER_WITHIN_MS = 5000

let h: Harness

beforeAll(async () => {
  // Tight limits: a fuzzed spec that happens to be valid must stay tiny.
  h = await createHarness(async ({ dataDir }) => await createEmbeddedQueue({ dataDir, threads: 1 }), {
    env: { MAX_NEURONS: '64', MAX_TRIALS: '64', MAX_GRID_POINTS: '16', RATE_LIMIT_MAX: '100000', MAX_ACTIVE_SWEEPS_PER_OWNER: '1000' }
  })
})
afterAll(async () => { await h.close() })

async function submitRaw (payload: string, contentType = 'application/json'): Promise<{ status: number, body: string, type: string }> {
  const answer = h.request({ method: 'POST', url: '/v1/sweeps', payload, headers: { 'content-type': contentType } })
  const timeout = new Promise<never>((_resolve, reject) => setTimeout(() => reject(new Error(`no answer within ${ANSWER_WITHIN_MS} ms`)), ANSWER_WITHIN_MS).unref())
  const res = await Promise.race([answer, timeout])
  return { status: res.statusCode, body: res.body, type: String(res.headers['content-type'] ?? '') }
}

function expectClientAnswer (answer: { status: number, body: string, type: string }): void {
  if (answer.status === 202) return
  expect(answer.status, answer.body).toBeGreaterThanOrEqual(400)
  expect(answer.status, answer.body).toBeLessThan(500)
  expect(answer.type).toMatch(/^application\/problem\+json/)
  const problem = JSON.parse(answer.body)
  expect(problem.status).toBe(answer.status)
  expect(problem.code).toMatch(/^MEMSWEEP_/)
}

/** Values a careless or hostile client might put anywhere. */
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.integer({ min: -1e12, max: 1e12 }),
  fc.double({ noNaN: false }),
  fc.constantFrom(0, -0, 1e308, -1e308, 5e-324, 2 ** 53, 2 ** 53 + 2, Number.MAX_VALUE),
  fc.string({ maxLength: 40 }),
  fc.constantFrom(null, true, false, '', '64', 'NaN', 'Infinity'),
  fc.array(fc.integer({ min: -5, max: 5 }), { maxLength: 6 }),
  fc.record({
    from: fc.double(), to: fc.double(), step: fc.double(), count: fc.integer({ min: -10, max: 1e9 }), scale: fc.constantFrom('linear', 'log', 'cubic')
  }, { requiredKeys: [] }),
  fc.record({ values: fc.array(fc.double(), { maxLength: 8 }) }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.integer(), { maxKeys: 4 })
)

const specKeys = ['version', 'label', 'seed', 'neurons', 'patterns', 'load', 'coding', 'family', 'rule', 'dilution', 'cue', 'dynamics', 'measures', 'successThreshold', 'trials', 'trialsPerNetwork', '__proto__', 'constructor', 'extra'] as const

const specShaped = fc.record(Object.fromEntries(specKeys.map((key) => [key, hostileValue])), { requiredKeys: [] })
const nestedShapes = fc.record({
  neurons: fc.oneof(fc.constant(32), hostileValue),
  patterns: fc.oneof(fc.constant(2), hostileValue),
  trials: fc.oneof(fc.constant(2), hostileValue),
  family: fc.oneof(fc.record({ kind: fc.constantFrom('random', 'correlated', 'supplied', 'other'), activity: hostileValue, parents: hostileValue, parentOverlap: hostileValue, data: fc.array(fc.array(hostileValue, { maxLength: 4 }), { maxLength: 3 }) }, { requiredKeys: ['kind'] }), hostileValue),
  rule: fc.oneof(fc.record({ kind: fc.constantFrom('hebbian', 'pseudo-inverse', 'storkey', 'covariance', 'mystery'), selfCoupling: hostileValue, threshold: hostileValue }, { requiredKeys: ['kind'] }), hostileValue),
  cue: fc.oneof(fc.record({ kind: fc.constantFrom('flip', 'erase', 'random', 'mixture'), fraction: hostileValue, fill: hostileValue, components: hostileValue }, { requiredKeys: ['kind'] }), hostileValue),
  dynamics: fc.oneof(fc.record({ update: fc.constantFrom('sync', 'async-random', 'teleport'), temperature: hostileValue, maxSweeps: hostileValue, burnIn: hostileValue }, { requiredKeys: [] }), hostileValue)
}, { requiredKeys: [] })

describe('fuzzing POST /v1/sweeps', () => {
  it('answers arbitrary JSON with 4xx problem+json (or 202 for a valid tiny spec), never 5xx', async () => {
    await fc.assert(fc.asyncProperty(fc.jsonValue({ maxDepth: 4 }), async (value) => {
      expectClientAnswer(await submitRaw(JSON.stringify(value)))
    }), { numRuns: 150 })
  })

  it('answers spec-shaped hostile objects the same way', async () => {
    await fc.assert(fc.asyncProperty(fc.oneof(specShaped, nestedShapes), async (value) => {
      expectClientAnswer(await submitRaw(JSON.stringify(value)))
    }), { numRuns: 250 })
  })

  it('answers raw text that claims to be JSON with 4xx', async () => {
    await fc.assert(fc.asyncProperty(fc.string({ maxLength: 200 }), async (text) => {
      const answer = await submitRaw(text)
      expect(answer.status).not.toBe(202)
      expectClientAnswer(answer)
    }), { numRuns: 100 })
  })

  it.each([
    ['prototype pollution', '{"__proto__": {"polluted": true}, "neurons": 32, "patterns": 2}'],
    ['constructor pollution', '{"constructor": {"prototype": {"polluted": true}}, "neurons": 32, "patterns": 2}'],
    ['deep nesting', '['.repeat(2000) + ']'.repeat(2000)],
    ['deep nesting inside a field', `{"neurons": 32, "patterns": 2, "family": {"kind": "supplied", "data": ${'['.repeat(1000)}1${']'.repeat(1000)}}}`],
    ['a huge number', '{"neurons": 1e400, "patterns": 2}'],
    ['duplicate keys', '{"neurons": 32, "neurons": 1000000000, "patterns": 2}'],
    ['a long label', JSON.stringify({ neurons: 32, patterns: 2, label: 'r'.repeat(100_000) })],
    ['an empty body', '']
  ])('answers %s with 4xx', async (_name, payload) => {
    const answer = await submitRaw(payload)
    expect(answer.status).not.toBe(202)
    expectClientAnswer(answer)
    expect(({} as Record<string, unknown>).polluted).toBeUndefined()
  })

  it('refuses oversized grids and networks naming the limit, before allocating anything', async () => {
    const before = await h.queue.stats()
    const cases: Array<[unknown, string]> = [
      [{ neurons: 32, patterns: 2, trials: 1, dynamics: { temperature: { from: 0, to: 1, count: 17 } } }, 'maxPoints'],
      [{ neurons: 32, load: { from: 0.05, to: 0.5, count: 4 }, trials: 17 }, 'maxTrials'],
      [{ neurons: 1_000_000, patterns: 2, trials: 1 }, 'maxNeurons']
    ]
    for (const [spec, limit] of cases) {
      const answer = await submitRaw(JSON.stringify(spec))
      expect(answer.status, answer.body).toBe(422)
      const problem = JSON.parse(answer.body)
      expect(problem.code, answer.body).toBe('MEMSWEEP_WORK_LIMIT_EXCEEDED')
      expect(problem.limit.name).toBe(limit)
      expect(problem.detail).toContain(limit)
    }
    // Beyond the format's own ceiling (10^8 points here) the spec layer refuses it and says the ceiling.
    const huge = await submitRaw(JSON.stringify({ neurons: 32, patterns: 2, trials: 1, cue: { kind: 'flip', fraction: { from: 0, to: 1, count: 10_000 } }, dynamics: { temperature: { from: 0, to: 2, count: 10_000 } } }))
    expect(huge.status).toBe(422)
    expect(JSON.parse(huge.body).errors[0].message).toMatch(/at most 100000/)
    const after = await h.queue.stats()
    expect(after.queued + after.running + after.succeeded + after.failed).toBe(before.queued + before.running + before.succeeded + before.failed)
  })
})
