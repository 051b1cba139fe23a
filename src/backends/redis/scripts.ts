/**
 * The Lua scripts behind every multi-key state change of a sweep. Each runs atomically in
 * Redis, so two workers finishing chunks at the same moment, or a cancel racing the last
 * chunk, can never double-count or resurrect a sweep: every change checks the status it
 * starts from.
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

/**
 * Creates a sweep record, or answers with the sweep an idempotency key already names.
 * KEYS: record, index, owner index, counts, idempotency, unenqueued, points-left, reuse source result, result
 * ARGV: use idempotency ('1'/'0'), idempotency value, idempotency ttl s, record fields (JSON flat list),
 *       index member, createdAt ms, points-left (JSON flat list), reuse source id ('' = none), retention s, id
 * Returns {'existing', idempotency value} | {'queued', ''} | {'succeeded', ''} (reused).
 */
export const SUBMIT = SET_FIELDS + `
if ARGV[1] == '1' then
  local existing = redis.call('GET', KEYS[5])
  if existing then return {'existing', existing} end
end
set_fields(KEYS[1], cjson.decode(ARGV[4]))
local status = 'queued'
if ARGV[8] ~= '' and redis.call('EXISTS', KEYS[8]) == 1 then
  status = 'succeeded'
  redis.call('COPY', KEYS[8], KEYS[9], 'REPLACE')
  redis.call('HSET', KEYS[1], 'status', status, 'reusedFrom', ARGV[8], 'startedMs', ARGV[6], 'finishedMs', ARGV[6],
    'pointsDone', redis.call('HGET', KEYS[1], 'pointsTotal'),
    'trialsDone', redis.call('HGET', KEYS[1], 'trialsTotal'),
    'chunksDone', redis.call('HGET', KEYS[1], 'chunksTotal'))
  redis.call('EXPIRE', KEYS[1], ARGV[9])
  redis.call('EXPIRE', KEYS[9], ARGV[9])
else
  redis.call('HSET', KEYS[1], 'status', status, 'enqueued', '0')
  set_fields(KEYS[7], cjson.decode(ARGV[7]))
  redis.call('ZADD', KEYS[6], ARGV[6], ARGV[10])
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
 * Progress of a chunk's current attempt. A retried chunk starts again from zero, so the
 * sweep's trialsDone moves by the difference from the chunk's last report (possibly
 * negative), never by the raw count. Reports arriving after the chunk's result are ignored.
 * KEYS: record, chunks, chunk-trials, counts. ARGV: chunk index, trials done, now ms.
 * Returns the status after the call, or nil if the sweep is gone.
 */
export const REPORT_PROGRESS = START + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return false end
if status ~= 'queued' and status ~= 'running' then return status end
if status == 'queued' then start_sweep(KEYS[1], KEYS[4], ARGV[3]) end
if redis.call('HEXISTS', KEYS[2], ARGV[1]) == 1 then return 'running' end
local before = tonumber(redis.call('HGET', KEYS[3], ARGV[1]) or '0')
local now_done = tonumber(ARGV[2])
if now_done ~= before then
  redis.call('HSET', KEYS[3], ARGV[1], now_done)
  redis.call('HINCRBY', KEYS[1], 'trialsDone', now_done - before)
end
return 'running'
`

/**
 * Stores a finished chunk's result. The first result of a chunk advances the counters; a
 * retried chunk's result replaces the stored one and counts nothing, so a sweep's counters
 * equal the number of distinct chunks finished however often chunks were retried.
 * KEYS: record, chunks, chunk-trials, points-left, counts.
 * ARGV: chunk index, encoded result, trials in the chunk, grid point, now ms, compute ms.
 * Returns {status, chunksDone, chunksTotal}; the counters are -1 when the sweep no longer runs.
 */
export const RECORD_CHUNK = START + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {'', -1, -1} end
if status ~= 'queued' and status ~= 'running' then return {status, -1, -1} end
if status == 'queued' then start_sweep(KEYS[1], KEYS[5], ARGV[5]) end
if redis.call('HSET', KEYS[2], ARGV[1], ARGV[2]) == 1 then
  local before = tonumber(redis.call('HGET', KEYS[3], ARGV[1]) or '0')
  redis.call('HSET', KEYS[3], ARGV[1], ARGV[3])
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
return {'running', done, total}
`

/**
 * Stores the assembled result and marks the sweep succeeded: only once, only from a running
 * sweep whose every chunk is recorded. The chunk results are dropped: the result holds them.
 * KEYS: record, result, counts, reuse, chunks, chunk-trials, points-left.
 * ARGV: encoded result, now ms, retention s, id.
 * Returns {1, 'succeeded'} when this call made the change, else {0, status} ('' if gone).
 */
export const FINISH = `
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
redis.call('DEL', KEYS[5], KEYS[6], KEYS[7])
redis.call('EXPIRE', KEYS[1], ARGV[3])
return {1, 'succeeded'}
`

/**
 * Ends a queued or running sweep as canceled or failed; a no-op on a finished one. Its keys
 * start their retention countdown.
 * KEYS: record, counts, chunks, chunk-trials, points-left, unenqueued.
 * ARGV: new status, now ms, error JSON ('' = none), retention s, id.
 * Returns {1, new status} when this call made the change, else {0, status} ('' if gone).
 */
export const STOP = `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {0, ''} end
if status ~= 'queued' and status ~= 'running' then return {0, status} end
redis.call('HSET', KEYS[1], 'status', ARGV[1], 'finishedMs', ARGV[2])
if ARGV[3] ~= '' then redis.call('HSET', KEYS[1], 'error', ARGV[3]) end
redis.call('HINCRBY', KEYS[2], status, -1)
redis.call('HINCRBY', KEYS[2], ARGV[1], 1)
redis.call('ZREM', KEYS[6], ARGV[5])
for i = 3, 5 do redis.call('EXPIRE', KEYS[i], ARGV[4]) end
redis.call('EXPIRE', KEYS[1], ARGV[4])
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
  finish: new LuaScript('finish', FINISH),
  stop: new LuaScript('stop', STOP)
}
