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

/**
 * Arms a sweep's completion callback on a terminal move (src/sweep/callbacks.ts): the event
 * of this end is due now, its attempts start again, its generation is one more.
 */
const ARM_CALLBACK = `
local function arm_callback(record, due, id, status, now_ms)
  local url = redis.call('HGET', record, 'callbackUrl')
  if not url or url == '' then return end
  redis.call('HSET', record, 'callbackState', 'pending', 'callbackAttempts', 0, 'callbackError', '',
    'callbackStatus', status, 'callbackFinishedMs', now_ms)
  redis.call('HINCRBY', record, 'callbackGen', 1)
  redis.call('ZADD', due, now_ms, id)
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
 *       result, result, plan, active, reuse source chunks, chunks, reuse source plan, open points,
 *       callbacks due
 * ARGV: use idempotency ('1'/'0'), idempotency value, idempotency ttl s, record fields (JSON flat
 *       list), index member, createdAt ms, points-left (JSON flat list), reuse source id ('' =
 *       none), retention s, id, plan (JSON flat list), max active ('' = no cap), owner JSON,
 *       open points (JSON flat list point → planned extent)
 * Returns {'existing', idempotency value} | {'over-cap', active} | {'queued', ''} | {'succeeded', ''} (reused).
 */
export const SUBMIT = SET_FIELDS + ARM_CALLBACK + `
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
    'chunksDone', redis.call('HGET', KEYS[1], 'chunksTotal'),
    'reusedPoints', redis.call('HGET', KEYS[1], 'pointsTotal'),
    'reusedTrials', redis.call('HGET', KEYS[1], 'trialsTotal'))
  for _, key in ipairs({KEYS[1], KEYS[9], KEYS[10], KEYS[13]}) do redis.call('EXPIRE', key, ARGV[9]) end
  arm_callback(KEYS[1], KEYS[16], ARGV[10], 'succeeded', ARGV[6])
else
  redis.call('HSET', KEYS[1], 'status', status, 'enqueued', '0')
  set_fields(KEYS[7], cjson.decode(ARGV[7]))
  local open = cjson.decode(ARGV[14])
  if #open > 0 then set_fields(KEYS[15], open) end
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

/** Whether every chunk of the plan is stored and no point is open. */
const IS_COMPLETE = `
local function is_complete(record, open)
  return redis.call('HGET', record, 'chunksDone') == redis.call('HGET', record, 'chunksTotal') and redis.call('HLEN', open) == 0
end
`

/**
 * Stores a chunk of the stored plan (the body given, or nil to copy it from another sweep's
 * chunks) and adds what it completes. Its first result advances the counters; a repeated
 * chunk's result replaces the stored one and counts nothing, so the counters equal the
 * distinct chunks stored however often chunks were retried. A chunk that is not the plan's
 * chunk at its index is refused.
 * keys: record, chunks, chunk-trials, points-left, counts, plan, open points.
 * Returns {status, stored (1/0), complete (1/0), point due (1/0)}; status '' when the sweep is gone.
 */
const STORE_CHUNK = START + IS_COMPLETE + `
local function store_chunk(k, index, point, first, count, now_ms, compute_ms, body)
  local status = redis.call('HGET', k.record, 'status')
  if not status then return {'', 0, 0, 0} end
  if status ~= 'queued' and status ~= 'running' then return {status, 0, 0, 0} end
  local planned = redis.call('HGET', k.plan, index)
  local expected = point .. ',' .. first .. ',' .. count
  if planned and planned ~= expected then
    return redis.error_reply('chunk ' .. index .. ' (' .. expected .. ') is not in the stored plan (' .. planned .. ')')
  end
  if status == 'queued' then start_sweep(k.record, k.counts, now_ms) end
  local stored = 0
  if redis.call('HSET', k.chunks, index, body) == 1 then
    stored = 1
    local before = tonumber(redis.call('HGET', k.trials, index) or '0')
    redis.call('HDEL', k.trials, index)
    redis.call('HINCRBY', k.record, 'trialsDone', tonumber(count) - before)
    redis.call('HINCRBY', k.record, 'chunksDone', 1)
    redis.call('HINCRBYFLOAT', k.record, 'computeMs', compute_ms)
    if redis.call('HINCRBY', k.left, point, -1) <= 0 then
      redis.call('HDEL', k.left, point)
      if redis.call('HEXISTS', k.open, point) == 0 then redis.call('HINCRBY', k.record, 'pointsDone', 1) end
    end
  end
  -- Due whenever the open point's planned chunks are all stored, a repeat included: a decision lost in a crash is asked again.
  local due = (redis.call('HEXISTS', k.left, point) == 0 and redis.call('HEXISTS', k.open, point) == 1) and 1 or 0
  return {'running', stored, is_complete(k.record, k.open) and 1 or 0, due}
end
`

/**
 * Stores a finished chunk of the stored plan (see store_chunk).
 * KEYS: record, chunks, chunk-trials, points-left, counts, plan, open points.
 * ARGV: chunk index, encoded result, trials in the chunk, grid point, now ms, compute ms, first trial.
 */
export const RECORD_CHUNK = STORE_CHUNK + `
local k = { record = KEYS[1], chunks = KEYS[2], trials = KEYS[3], left = KEYS[4], counts = KEYS[5], plan = KEYS[6], open = KEYS[7] }
return store_chunk(k, ARGV[1], ARGV[4], ARGV[7], ARGV[3], ARGV[5], ARGV[6], ARGV[2])
`

/**
 * Stores, as this sweep's chunk, a copy of another sweep's stored chunk with the same trials
 * (see store_chunk); stored 0 when the source chunk is gone.
 * KEYS: record, chunks, chunk-trials, points-left, counts, plan, open points, source chunks, source plan.
 * ARGV: chunk index, grid point, first trial, trials, now ms, source chunk index.
 */
export const INHERIT_CHUNK = STORE_CHUNK + `
local k = { record = KEYS[1], chunks = KEYS[2], trials = KEYS[3], left = KEYS[4], counts = KEYS[5], plan = KEYS[6], open = KEYS[7] }
local source_plan = redis.call('HGET', KEYS[9], ARGV[6])
if source_plan then
  local _, source_first, source_count = string.match(source_plan, '^(%d+),(%d+),(%d+)$')
  if source_first ~= ARGV[3] or source_count ~= ARGV[4] then return {redis.call('HGET', KEYS[1], 'status') or '', 0, 0, 0} end
end
local body = redis.call('HGET', KEYS[8], ARGV[6])
if not body or not source_plan then return {redis.call('HGET', KEYS[1], 'status') or '', 0, 0, 0} end
if redis.call('HEXISTS', KEYS[2], ARGV[1]) == 1 then return {redis.call('HGET', KEYS[1], 'status') or '', 0, is_complete(KEYS[1], KEYS[7]) and 1 or 0, 0} end
return store_chunk(k, ARGV[1], ARGV[2], ARGV[3], ARGV[4], ARGV[5], '0', body)
`

/**
 * Appends runs of trials to an open point's plan, only if its planned trials end at the given
 * trial (a repeated decision appends nothing).
 * KEYS: record, plan, open points, points-left. ARGV: point, from trial, pieces (JSON [[first, count], …]).
 * Returns the index of the first appended chunk, or -1.
 */
export const EXTEND_POINT = `
local status = redis.call('HGET', KEYS[1], 'status')
if status ~= 'queued' and status ~= 'running' then return -1 end
local extent = redis.call('HGET', KEYS[3], ARGV[1])
if not extent or extent ~= ARGV[2] then return -1 end
local pieces = cjson.decode(ARGV[3])
if #pieces == 0 then return -1 end
local first_index = tonumber(redis.call('HGET', KEYS[1], 'chunksTotal'))
local trials = 0
local last = tonumber(extent)
for i, piece in ipairs(pieces) do
  redis.call('HSET', KEYS[2], first_index + i - 1, ARGV[1] .. ',' .. piece[1] .. ',' .. piece[2])
  trials = trials + piece[2]
  last = piece[1] + piece[2]
end
redis.call('HINCRBY', KEYS[1], 'chunksTotal', #pieces)
redis.call('HINCRBY', KEYS[1], 'trialsTotal', trials)
redis.call('HINCRBY', KEYS[4], ARGV[1], #pieces)
redis.call('HSET', KEYS[3], ARGV[1], last)
return first_index
`

/**
 * Closes an open point. KEYS: record, open points, points-left. ARGV: point.
 * Returns {closed (1/0), complete (1/0)}.
 */
export const CLOSE_POINT = IS_COMPLETE + `
local status = redis.call('HGET', KEYS[1], 'status')
if (status ~= 'queued' and status ~= 'running') or redis.call('HDEL', KEYS[2], ARGV[1]) == 0 then return {0, 0} end
if tonumber(redis.call('HGET', KEYS[3], ARGV[1]) or '0') <= 0 then redis.call('HINCRBY', KEYS[1], 'pointsDone', 1) end
return {1, is_complete(KEYS[1], KEYS[2]) and 1 or 0}
`

/**
 * Stores the assembled result and marks the sweep succeeded: only once, only from an active
 * sweep whose every chunk is stored. The chunks stay (they hold the trial records) and
 * start their retention countdown with the record.
 * KEYS: record, result, counts, reuse, chunks, chunk-trials, points-left, plan, active, open points, callbacks due.
 * ARGV: encoded result, now ms, retention s, id.
 * Returns {1, 'succeeded'} when this call made the change, else {0, status} ('' if gone).
 */
export const SUCCEED = RELEASE_ACTIVE + IS_COMPLETE + ARM_CALLBACK + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {0, ''} end
if status ~= 'queued' and status ~= 'running' then return {0, status} end
if not is_complete(KEYS[1], KEYS[10]) then
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
arm_callback(KEYS[1], KEYS[11], ARGV[4], 'succeeded', ARGV[2])
return {1, 'succeeded'}
`

/**
 * Ends a queued or running sweep as canceled or failed; a no-op on a finished one. Its
 * keys, stored chunks included, start their retention countdown.
 * KEYS: record, counts, chunks, chunk-trials, points-left, unenqueued, plan, active, open points, callbacks due.
 * ARGV: new status, now ms, error JSON ('' = none), retention s, id.
 * Returns {1, new status} when this call made the change, else {0, status} ('' if gone).
 */
export const STOP = RELEASE_ACTIVE + ARM_CALLBACK + `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {0, ''} end
if status ~= 'queued' and status ~= 'running' then return {0, status} end
redis.call('HSET', KEYS[1], 'status', ARGV[1], 'finishedMs', ARGV[2])
if ARGV[3] ~= '' then redis.call('HSET', KEYS[1], 'error', ARGV[3]) end
redis.call('HINCRBY', KEYS[2], status, -1)
redis.call('HINCRBY', KEYS[2], ARGV[1], 1)
redis.call('ZREM', KEYS[6], ARGV[5])
for _, key in ipairs({KEYS[1], KEYS[3], KEYS[4], KEYS[5], KEYS[7], KEYS[9]}) do redis.call('EXPIRE', key, ARGV[4]) end
release_active(KEYS[1], KEYS[8])
arm_callback(KEYS[1], KEYS[10], ARGV[5], ARGV[1], ARGV[2])
return {1, ARGV[1]}
`

/**
 * canceled or failed → queued, keeping its stored chunks and counters; its keys stop expiring.
 * KEYS: record, counts, chunks, chunk-trials, points-left, plan, active, open points, unenqueued.
 * ARGV: now ms, id, max active ('' = no cap).
 * Returns {1, 'queued'} when this call made the change, {0, status, active} when the owner is at
 * the cap, else {0, status} ('' if gone).
 */
export const REOPEN = `
local status = redis.call('HGET', KEYS[1], 'status')
if not status then return {0, ''} end
if status ~= 'canceled' and status ~= 'failed' then return {0, status} end
if ARGV[3] ~= '' then
  local active = tonumber(redis.call('HGET', KEYS[7], redis.call('HGET', KEYS[1], 'owner') or 'null') or '0')
  if active >= tonumber(ARGV[3]) then return {0, status, active} end
end
redis.call('HSET', KEYS[1], 'status', 'queued', 'finishedMs', '', 'error', '', 'enqueued', '0')
redis.call('HINCRBY', KEYS[1], 'run', 1)
local callback = redis.call('HGET', KEYS[1], 'callbackState')
if callback and callback ~= '' and callback ~= 'pending' then redis.call('HSET', KEYS[1], 'callbackState', 'waiting') end
redis.call('HINCRBY', KEYS[2], status, -1)
redis.call('HINCRBY', KEYS[2], 'queued', 1)
for i = 1, 8 do if i ~= 2 and i ~= 7 then redis.call('PERSIST', KEYS[i]) end end
redis.call('HINCRBY', KEYS[7], redis.call('HGET', KEYS[1], 'owner') or 'null', 1)
redis.call('ZADD', KEYS[9], ARGV[1], ARGV[2])
return {1, 'queued'}
`

/**
 * Leases one due completion callback to the caller: only if it is still due (another API
 * instance has not claimed it) and pending; a stale entry (the sweep gone or its event
 * settled) is dropped.
 * KEYS: callbacks due, record. ARGV: id, now ms, lease end ms.
 * Returns [owner JSON, url, generation, status, finished ms, attempts], or nil.
 */
export const CLAIM_CALLBACK = `
local score = redis.call('ZSCORE', KEYS[1], ARGV[1])
if not score or tonumber(score) > tonumber(ARGV[2]) then return nil end
if redis.call('HGET', KEYS[2], 'callbackState') ~= 'pending' then
  redis.call('ZREM', KEYS[1], ARGV[1])
  return nil
end
redis.call('ZADD', KEYS[1], ARGV[3], ARGV[1])
return redis.call('HMGET', KEYS[2], 'owner', 'callbackUrl', 'callbackGen', 'callbackStatus', 'callbackFinishedMs', 'callbackAttempts')
`

/**
 * Records an attempt at a callback of this generation: delivered, failed for good, or pending
 * again until the retry time; ignored for an older generation or a settled event.
 * KEYS: callbacks due, record. ARGV: id, generation, new state, error ('' = none), retry at ms ('' = none).
 */
export const SETTLE_CALLBACK = `
if redis.call('HGET', KEYS[2], 'callbackGen') ~= ARGV[2] or redis.call('HGET', KEYS[2], 'callbackState') ~= 'pending' then return 0 end
redis.call('HSET', KEYS[2], 'callbackState', ARGV[3], 'callbackError', ARGV[4])
redis.call('HINCRBY', KEYS[2], 'callbackAttempts', 1)
if ARGV[5] == '' then redis.call('ZREM', KEYS[1], ARGV[1]) else redis.call('ZADD', KEYS[1], ARGV[5], ARGV[1]) end
return 1
`

/**
 * Removes a finished sweep and everything stored for it.
 * KEYS: record, counts, index, owner index, then the sweep's other keys. ARGV: index member.
 * Returns 1 when removed, 0 for an active or unknown sweep.
 */
export const PURGE = `
local status = redis.call('HGET', KEYS[1], 'status')
if status ~= 'succeeded' and status ~= 'failed' and status ~= 'canceled' then return 0 end
redis.call('HINCRBY', KEYS[2], status, -1)
redis.call('ZREM', KEYS[3], ARGV[1])
if KEYS[4] ~= KEYS[3] then redis.call('ZREM', KEYS[4], ARGV[1]) end
redis.call('DEL', KEYS[1])
for i = 5, #KEYS do redis.call('DEL', KEYS[i]) end
return 1
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
  inheritChunk: new LuaScript('inheritChunk', INHERIT_CHUNK),
  extendPoint: new LuaScript('extendPoint', EXTEND_POINT),
  closePoint: new LuaScript('closePoint', CLOSE_POINT),
  reopen: new LuaScript('reopen', REOPEN),
  purge: new LuaScript('purge', PURGE),
  succeed: new LuaScript('succeed', SUCCEED),
  claimCallback: new LuaScript('claimCallback', CLAIM_CALLBACK),
  settleCallback: new LuaScript('settleCallback', SETTLE_CALLBACK),
  stop: new LuaScript('stop', STOP)
}
