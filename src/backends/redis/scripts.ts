/**
 * The Lua scripts behind every multi-key state change of a sweep: the Redis form of the
 * lifecycle's moves and counters (src/sweep/state.ts). Each runs atomically in Redis, so
 * two workers finishing chunks at the same moment, or a cancel racing the last chunk, can
 * never double-count or resurrect a sweep: every change checks the status it starts from.
 * The store contract suite (test/sweep/store-contract.ts) holds them to the same rules as
 * the embedded backend's SQL.
 */
import { createHash } from 'node:crypto'
import type { Redis } from 'ioredis'

/** Moves a sweep from queued to running, keeping the status counts in step. */
const START = `
local function start_sweep(record, counts, now_ms)
  redis.call('HSET', record, 'status', 'running', 'startedMs', now_ms)
  redis.call('HINCRBY', counts, 'queued', -1)
  redis.call('HINCRBY', counts, 'running', 1)
end
`

/** One fewer active sweep for the record's owner (never below zero: sweeps from before the count existed). */
const RELEASE_ACTIVE = `
local function release_active(record, active)
  local owner = redis.call('HGET', record, 'owner') or 'null'
  if redis.call('HINCRBY', active, owner, -1) <= 0 then redis.call('HDEL', active, owner) end
end
`

/** HSET of a flat [field, value, ...] list, in slices: unpack() of a long list overflows Lua's stack. */
const SET_FIELDS = `
local function set_fields(key, flat)
  local step = 1000
  for first = 1, #flat, step do
    local last = math.min(first + step - 1, #flat)
    redis.call('HSET', key, unpack(flat, first, last))
  end
end
`

/** The size of a planned chunk, or nil for a sweep stored before plans were (no plan hash). */
const PLANNED_COUNT = `
local function planned_count(plan, index)
  local entry = redis.call('HGET', plan, index)
  if not entry then return nil end
  local _, _, count = string.match(entry, '^(%d+),(%d+),(%d+)$')
  return tonumber(count)
end
`

/**
 * Creates a sweep record with its stored plan, or answers with the sweep an idempotency key
 * already names, or refuses when the owner is at the active cap (checked here, atomically).
 * KEYS: record, index, owner index, counts, idempotency, unenqueued, points-left, reuse source
 *       result, result, plan, active, reuse source chunks, chunks, reuse source plan
 * ARGV: use idempotency ('1'/'0'), idempotency value, idempotency ttl s, record fields (JSON flat
 *       list), index member, createdAt ms, points-left (JSON flat list), reuse source id ('' =
 *       none), retention s, id, plan (JSON flat list), max active ('' = no cap), owner JSON
 * Returns {'existing', idempotency value} | {'over-cap', active} | {'queued', ''} | {'succeeded', ''} (reused).
 */
export const SUBMIT = SET_FIELDS + `
if ARGV[1] == '1' then
  local existing = redis.call('GET', KEYS[5])
  if existing then return {'existing', existing} end
end
local reusing = ARGV[8] ~= '' and redis.call('EXISTS', KEYS[8]) == 1
if not reusing and ARGV[12] ~= '' then
  local active = tonumber(redis.call('HGET', KEYS[11], ARGV[13]) or '0')
  if active >= tonumber(ARGV[12]) then return {'over-cap', tostring(active)} end
end
set_fields(KEYS[1], cjson.decode(ARGV[4]))
set_fields(KEYS[10], cjson.decode(ARGV[11]))
local status = 'queued'
if reusing then
  status = 'succeeded'
  redis.call('COPY', KEYS[8], KEYS[9], 'REPLACE')
  if redis.call('EXISTS', KEYS[12]) == 1 then redis.call('COPY', KEYS[12], KEYS[13], 'REPLACE') end
  if redis.call('EXISTS', KEYS[14]) == 1 then redis.call('COPY', KEYS[14], KEYS[10], 'REPLACE') end
  redis.call('HSET', KEYS[1], 'status', status, 'reusedFrom', ARGV[8], 'startedMs', ARGV[6], 'finishedMs', ARGV[6],
    'pointsDone', redis.call('HGET', KEYS[1], 'pointsTotal'),
    'trialsDone', redis.call('HGET', KEYS[1], 'trialsTotal'),
    'chunksDone', redis.call('HGET', KEYS[1], 'chunksTotal'))
  for _, key in ipairs({KEYS[1], KEYS[9], KEYS[10], KEYS[13]}) do redis.call('EXPIRE', key, ARGV[9]) end
else
  redis.call('HSET', KEYS[1], 'status', status, 'enqueued', '0')
  set_fields(KEYS[7], cjson.decode(ARGV[7]))
  redis.call('ZADD', KEYS[6], ARGV[6], ARGV[10])
  redis.call('HINCRBY', KEYS[11], ARGV[13], 1)
end
redis.call('HINCRBY', KEYS[4], status, 1)
redis.call('ZADD', KEYS[2], 0, ARGV[5])
if KEYS[3] ~= KEYS[2] then redis.call('ZADD', KEYS[3], 0, ARGV[5]) end
if ARGV[1] == '1' then redis.call('SET', KEYS[5], ARGV[2], 'EX', ARGV[3]) end
return {status, ''}
`

/**
 * KEYS: record, counts. ARGV: now ms. Returns the status after the call, or nil if the sweep is gone.
 */
export const MARK_RUNNING = START + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return false end
if status == 'queued' then
  start_sweep(KEYS[1], KEYS[2], ARGV[1])
  return 'running'
end
return status
`

/**
 * Progress of a running attempt of a chunk. The chunk-trials hash keeps the most trials any
 * attempt of the chunk reported, so a retried attempt starting again from zero, or an
 * abandoned one, never lowers trialsDone (a high-water mark: Σ stored chunks + Σ partial
 * maxima). Reports arriving after the chunk is stored are ignored.
 * KEYS: record, chunks, chunk-trials, counts, plan. ARGV: chunk index, trials done, now ms.
 * Returns the status after the call, or nil if the sweep is gone.
 */
export const REPORT_PROGRESS = START + PLANNED_COUNT + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return false end
if status ~= 'queued' and status ~= 'running' then return status end
if status == 'queued' then start_sweep(KEYS[1], KEYS[4], ARGV[3]) end
if redis.call('HEXISTS', KEYS[2], ARGV[1]) == 1 then return 'running' end
local now_done = math.max(0, math.floor(tonumber(ARGV[2])))
local count = planned_count(KEYS[5], ARGV[1])
if count then now_done = math.min(now_done, count) end
local before = tonumber(redis.call('HGET', KEYS[3], ARGV[1]) or '0')
if now_done > before then
  redis.call('HSET', KEYS[3], ARGV[1], now_done)
  redis.call('HINCRBY', KEYS[1], 'trialsDone', now_done - before)
end
return 'running'
`

/**
 * Stores a finished chunk of the stored plan. Its first result advances the counters; a
 * retried chunk's result replaces the stored one and counts nothing, so the counters equal
 * the distinct chunks stored however often chunks were retried. A chunk that is not the
 * plan's chunk at its index is refused.
 * KEYS: record, chunks, chunk-trials, points-left, counts, plan.
 * ARGV: chunk index, encoded result, trials in the chunk, grid point, now ms, compute ms, first trial.
 * Returns {status, stored (1/0), complete (1/0)}; status '' when the sweep is gone.
 */
export const RECORD_CHUNK = START + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {'', 0, 0} end
if status ~= 'queued' and status ~= 'running' then return {status, 0, 0} end
local planned = redis.call('HGET', KEYS[6], ARGV[1])
local expected = ARGV[4] .. ',' .. ARGV[7] .. ',' .. ARGV[3]
if planned and planned ~= expected then
  return redis.error_reply('chunk ' .. ARGV[1] .. ' (' .. expected .. ') is not in the stored plan (' .. planned .. ')')
end
if status == 'queued' then start_sweep(KEYS[1], KEYS[5], ARGV[5]) end
local stored = 0
if redis.call('HSET', KEYS[2], ARGV[1], ARGV[2]) == 1 then
  stored = 1
  local before = tonumber(redis.call('HGET', KEYS[3], ARGV[1]) or '0')
  redis.call('HDEL', KEYS[3], ARGV[1])
  redis.call('HINCRBY', KEYS[1], 'trialsDone', tonumber(ARGV[3]) - before)
  redis.call('HINCRBY', KEYS[1], 'chunksDone', 1)
  redis.call('HINCRBYFLOAT', KEYS[1], 'computeMs', ARGV[6])
  if redis.call('HINCRBY', KEYS[4], ARGV[4], -1) <= 0 then
    redis.call('HDEL', KEYS[4], ARGV[4])
    redis.call('HINCRBY', KEYS[1], 'pointsDone', 1)
  end
end
local done = tonumber(redis.call('HGET', KEYS[1], 'chunksDone'))
local total = tonumber(redis.call('HGET', KEYS[1], 'chunksTotal'))
return {'running', stored, done == total and 1 or 0}
`

/**
 * Stores the assembled result and marks the sweep succeeded: only once, only from an active
 * sweep whose every chunk is stored. The chunks stay (they hold the trial records) and
 * start their retention countdown with the record.
 * KEYS: record, result, counts, reuse, chunks, chunk-trials, points-left, plan, active.
 * ARGV: encoded result, now ms, retention s, id.
 * Returns {1, 'succeeded'} when this call made the change, else {0, status} ('' if gone).
 */
export const SUCCEED = RELEASE_ACTIVE + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {0, ''} end
if status ~= 'queued' and status ~= 'running' then return {0, status} end
if redis.call('HGET', KEYS[1], 'chunksDone') ~= redis.call('HGET', KEYS[1], 'chunksTotal') then
  return redis.error_reply('sweep ' .. ARGV[4] .. ' is not complete: cannot store its result')
end
redis.call('SET', KEYS[2], ARGV[1], 'EX', ARGV[3])
redis.call('HSET', KEYS[1], 'status', 'succeeded', 'finishedMs', ARGV[2])
if redis.call('HGET', KEYS[1], 'startedMs') == '' then redis.call('HSET', KEYS[1], 'startedMs', ARGV[2]) end
redis.call('HINCRBY', KEYS[3], status, -1)
redis.call('HINCRBY', KEYS[3], 'succeeded', 1)
redis.call('SET', KEYS[4], ARGV[4], 'EX', ARGV[3])
redis.call('DEL', KEYS[6], KEYS[7])
for _, key in ipairs({KEYS[1], KEYS[5], KEYS[8]}) do redis.call('EXPIRE', key, ARGV[3]) end
release_active(KEYS[1], KEYS[9])
return {1, 'succeeded'}
`

/**
 * Ends a queued or running sweep as canceled or failed; a no-op on a finished one. Its
 * keys, stored chunks included, start their retention countdown.
 * KEYS: record, counts, chunks, chunk-trials, points-left, unenqueued, plan, active.
 * ARGV: new status, now ms, error JSON ('' = none), retention s, id.
 * Returns {1, new status} when this call made the change, else {0, status} ('' if gone).
 */
export const STOP = RELEASE_ACTIVE + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {0, ''} end
if status ~= 'queued' and status ~= 'running' then return {0, status} end
redis.call('HSET', KEYS[1], 'status', ARGV[1], 'finishedMs', ARGV[2])
if ARGV[3] ~= '' then redis.call('HSET', KEYS[1], 'error', ARGV[3]) end
redis.call('HINCRBY', KEYS[2], status, -1)
redis.call('HINCRBY', KEYS[2], ARGV[1], 1)
redis.call('ZREM', KEYS[6], ARGV[5])
for _, key in ipairs({KEYS[1], KEYS[3], KEYS[4], KEYS[5], KEYS[7]}) do redis.call('EXPIRE', key, ARGV[4]) end
release_active(KEYS[1], KEYS[8])
return {1, ARGV[1]}
`

/**
 * A Lua script called by its SHA1, re-sent in full when Redis answers NOSCRIPT (a restarted
 * server has an empty script cache).
 */
export class LuaScript {
  readonly sha: string

  constructor (readonly name: string, readonly source: string) {
    this.sha = createHash('sha1').update(source).digest('hex')
  }

  async run (redis: Redis, keys: string[], args: Array<string | number | Buffer>): Promise<unknown> {
    try {
      return await redis.evalsha(this.sha, keys.length, ...keys, ...args)
    } catch (error) {
      if (error instanceof Error && error.message.startsWith('NOSCRIPT')) {
        return await redis.eval(this.source, keys.length, ...keys, ...args)
      }
      throw error
    }
  }
}

export const SCRIPTS = {
  submit: new LuaScript('submit', SUBMIT),
  markRunning: new LuaScript('markRunning', MARK_RUNNING),
  reportProgress: new LuaScript('reportProgress', REPORT_PROGRESS),
  recordChunk: new LuaScript('recordChunk', RECORD_CHUNK),
  succeed: new LuaScript('succeed', SUCCEED),
  stop: new LuaScript('stop', STOP)
}
