/**
 * Service configuration: the environment parsed once, at start-up, with zod. No other module
 * reads `process.env`; everything else receives the frozen `Config` as an argument.
 * Every variable is listed with its default in .env.example.
 */
import { availableParallelism } from 'node:os'
import { z } from 'zod'
import type { WorkLimitName } from './spec/errors.js'

const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const

const port = z.coerce.number().int().min(0).max(65535)
const positiveInt = z.coerce.number().int().positive()
const flag = z.enum(['true', 'false', '1', '0']).transform((value) => value === 'true' || value === '1')
/** Unset and empty variables both mean "use the default": compose files often pass `VAR=`. */
const emptyAsUnset = (value: unknown): unknown => (value === '' ? undefined : value)

const envSchema = z.object({
  PORT: z.preprocess(emptyAsUnset, port.default(8080)),
  HOST: z.preprocess(emptyAsUnset, z.string().min(1).default('0.0.0.0')),
  DATA_DIR: z.preprocess(emptyAsUnset, z.string().min(1).default('./data')),
  REDIS_URL: z.preprocess(emptyAsUnset, z.url({ protocol: /^rediss?$/ }).optional()),
  REDIS_PREFIX: z.preprocess(emptyAsUnset, z.string().regex(/^[A-Za-z0-9_-]+$/).default('memsweep')),
  SWEEP_RETENTION_DAYS: z.preprocess(emptyAsUnset, positiveInt.max(3650).default(7)),
  WORKER_THREADS: z.preprocess(emptyAsUnset, positiveInt.max(1024).optional()),
  TOKENS_FILE: z.preprocess(emptyAsUnset, z.string().min(1).optional()),
  BODY_LIMIT: z.preprocess(emptyAsUnset, positiveInt.default(256 * 1024)),
  RATE_LIMIT_MAX: z.preprocess(emptyAsUnset, positiveInt.default(600)),
  RATE_LIMIT_WINDOW: z.preprocess(emptyAsUnset, positiveInt.default(60)),
  AUTH_FAILURE_MAX: z.preprocess(emptyAsUnset, positiveInt.default(20)),
  AUTH_FAILURE_WINDOW: z.preprocess(emptyAsUnset, positiveInt.default(300)),
  MAX_ACTIVE_SWEEPS_PER_OWNER: z.preprocess(emptyAsUnset, positiveInt.default(20)),
  SSE_HEARTBEAT_SECONDS: z.preprocess(emptyAsUnset, positiveInt.max(300).default(15)),
  TRUST_PROXY: z.preprocess(emptyAsUnset, flag.default(false)),
  LOG_LEVEL: z.preprocess(emptyAsUnset, z.enum(LOG_LEVELS).default('info')),
  MAX_NEURONS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_GRID_POINTS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_TRIALS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_MEMORY_MB: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_CPU_SECONDS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_STORED_MB: z.preprocess(emptyAsUnset, positiveInt.optional())
})

/** Work limits that override the spec layer's defaults; unset fields keep the default. */
export type WorkLimitOverrides = Partial<Record<WorkLimitName, number>>

export interface Config {
  port: number
  host: string
  dataDir: string
  redisUrl: string | null
  redisPrefix: string
  /** Redis backend: how long finished sweeps and their results are kept, seconds. */
  retentionSeconds: number
  /** Worker threads of the embedded backend (and the default worker concurrency). */
  workerThreads: number
  tokensFile: string | null
  /** Largest accepted request body, bytes. */
  bodyLimit: number
  rateLimit: { max: number, windowSeconds: number }
  /** Failed authentications one client address may make per window before it gets 429 (valid tokens still pass). */
  authFailureLimit: { max: number, windowSeconds: number }
  maxActiveSweepsPerOwner: number
  sseHeartbeatSeconds: number
  trustProxy: boolean
  logLevel: typeof LOG_LEVELS[number]
  limits: WorkLimitOverrides
}

export class ConfigError extends Error {
  constructor (readonly issues: string[]) {
    super(`Invalid configuration:\n  ${issues.join('\n  ')}`)
    this.name = 'ConfigError'
  }
}

/** Parses the environment; throws ConfigError listing every bad variable at once. */
export function loadConfig (env: Record<string, string | undefined>): Config {
  const parsed = envSchema.safeParse(env)
  if (!parsed.success) {
    throw new ConfigError(parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`))
  }
  const e = parsed.data
  const limits: WorkLimitOverrides = {}
  if (e.MAX_NEURONS !== undefined) limits.maxNeurons = e.MAX_NEURONS
  if (e.MAX_GRID_POINTS !== undefined) limits.maxPoints = e.MAX_GRID_POINTS
  if (e.MAX_TRIALS !== undefined) limits.maxTrials = e.MAX_TRIALS
  if (e.MAX_MEMORY_MB !== undefined) limits.maxBytes = e.MAX_MEMORY_MB * 1024 * 1024
  if (e.MAX_CPU_SECONDS !== undefined) limits.maxCpuSeconds = e.MAX_CPU_SECONDS
  if (e.MAX_STORED_MB !== undefined) limits.maxStoredBytes = e.MAX_STORED_MB * 1024 * 1024
  return deepFreeze({
    port: e.PORT,
    host: e.HOST,
    dataDir: e.DATA_DIR,
    redisUrl: e.REDIS_URL ?? null,
    redisPrefix: e.REDIS_PREFIX,
    retentionSeconds: e.SWEEP_RETENTION_DAYS * 86400,
    workerThreads: e.WORKER_THREADS ?? availableParallelism(),
    tokensFile: e.TOKENS_FILE ?? null,
    bodyLimit: e.BODY_LIMIT,
    rateLimit: { max: e.RATE_LIMIT_MAX, windowSeconds: e.RATE_LIMIT_WINDOW },
    authFailureLimit: { max: e.AUTH_FAILURE_MAX, windowSeconds: e.AUTH_FAILURE_WINDOW },
    maxActiveSweepsPerOwner: e.MAX_ACTIVE_SWEEPS_PER_OWNER,
    sseHeartbeatSeconds: e.SSE_HEARTBEAT_SECONDS,
    trustProxy: e.TRUST_PROXY,
    logLevel: e.LOG_LEVEL,
    limits
  })
}

function deepFreeze<T extends object> (value: T): Readonly<T> {
  for (const inner of Object.values(value)) {
    if (inner !== null && typeof inner === 'object') deepFreeze(inner as object)
  }
  return Object.freeze(value)
}
