/**
 * Service configuration: the environment parsed once, at start-up, with zod. No other module
 * reads `process.env`; everything else receives the frozen `Config` as an argument.
 * Every variable is listed with its default in .env.example.
 */
import { BlockList, isIPv4, isIPv6 } from 'node:net'
import { availableParallelism } from 'node:os'
import { z } from 'zod'
import { parseDuration } from './duration.js'
import { LOG_FORMATS, type LogFormat } from './logger.js'
import type { WorkLimitName } from './spec/errors.js'

const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const

const port = z.coerce.number().int().min(0).max(65535)
const positiveInt = z.coerce.number().int().positive()
const flag = z.enum(['true', 'false', '1', '0']).transform((value) => value === 'true' || value === '1')
/** Unset and empty variables both mean "use the default": compose files often pass `VAR=`. */
const emptyAsUnset = (value: unknown): unknown => (value === '' ? undefined : value)
/** A duration (`90s`, `2h`, `1h30m`, `HH:MM:SS`, …) in milliseconds. */
const duration = z.string().transform((text, context) => {
  const ms = parseDuration(text)
  if (ms === null || ms <= 0) {
    context.addIssue({ code: 'custom', message: `not a positive duration: ${JSON.stringify(text)} (write e.g. 90s, 45m, 2h, 1h30m or HH:MM:SS)` })
    return z.NEVER
  }
  return ms
})

const envSchema = z.object({
  PORT: z.preprocess(emptyAsUnset, port.default(8080)),
  HOST: z.preprocess(emptyAsUnset, z.string().min(1).default('127.0.0.1')),
  DATA_DIR: z.preprocess(emptyAsUnset, z.string().min(1).default('./data')),
  REDIS_URL: z.preprocess(emptyAsUnset, z.url({ protocol: /^rediss?$/ }).optional()),
  REDIS_PREFIX: z.preprocess(emptyAsUnset, z.string().regex(/^[A-Za-z0-9_-]+$/).default('memsweep')),
  SWEEP_RETENTION_DAYS: z.preprocess(emptyAsUnset, positiveInt.max(3650).default(7)),
  WORKER_THREADS: z.preprocess(emptyAsUnset, positiveInt.max(1024).optional()),
  WORKER_MAX_RUNTIME: z.preprocess(emptyAsUnset, duration.optional()),
  WORKER_EXIT_WHEN_IDLE: z.preprocess(emptyAsUnset, duration.optional()),
  WORKER_SHUTDOWN_GRACE: z.preprocess(emptyAsUnset, duration.default(60_000)),
  WORKER_HEALTH_PORT: z.preprocess(emptyAsUnset, port.optional()),
  TOKENS_FILE: z.preprocess(emptyAsUnset, z.string().min(1).optional()),
  ALLOW_ANONYMOUS: z.preprocess(emptyAsUnset, flag.default(false)),
  BODY_LIMIT: z.preprocess(emptyAsUnset, positiveInt.default(256 * 1024)),
  RATE_LIMIT_MAX: z.preprocess(emptyAsUnset, positiveInt.default(600)),
  RATE_LIMIT_WINDOW: z.preprocess(emptyAsUnset, positiveInt.default(60)),
  AUTH_FAILURE_MAX: z.preprocess(emptyAsUnset, positiveInt.default(20)),
  AUTH_FAILURE_WINDOW: z.preprocess(emptyAsUnset, positiveInt.default(300)),
  MAX_ACTIVE_SWEEPS_PER_OWNER: z.preprocess(emptyAsUnset, positiveInt.default(20)),
  SSE_HEARTBEAT_SECONDS: z.preprocess(emptyAsUnset, positiveInt.max(300).default(15)),
  TRUST_PROXY: z.preprocess(emptyAsUnset, flag.default(false)),
  LOG_LEVEL: z.preprocess(emptyAsUnset, z.enum(LOG_LEVELS).default('info')),
  LOG_FORMAT: z.preprocess(emptyAsUnset, z.enum(LOG_FORMATS).default('auto')),
  LOG_REQUESTS: z.preprocess(emptyAsUnset, flag.default(false)),
  PUBLIC_URL: z.preprocess(emptyAsUnset, z.url({ protocol: /^https?$/ }).optional()),
  CALLBACK_ALLOWED_HOSTS: z.preprocess(emptyAsUnset, z.string().default('')),
  CALLBACK_SECRET: z.preprocess(emptyAsUnset, z.string().min(16, 'at least 16 characters').optional()),
  CALLBACK_ATTEMPTS: z.preprocess(emptyAsUnset, positiveInt.max(50).default(8)),
  CALLBACK_RETRY_DELAY: z.preprocess(emptyAsUnset, duration.default(2000)),
  MAX_NEURONS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_GRID_POINTS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_TRIALS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_MEMORY_MB: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_CPU_SECONDS: z.preprocess(emptyAsUnset, positiveInt.optional()),
  MAX_STORED_MB: z.preprocess(emptyAsUnset, positiveInt.optional())
})

/** Every variable the service reads (each is listed, with its default, in .env.example). */
export const CONFIG_VARIABLES = Object.keys(envSchema.shape)

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
  /** Redis workers inside a batch allocation or a container: when they stop on their own, and their probes. */
  workerLifetime: {
    /** Take no chunk that would not end within this many ms of the process's start; then exit. */
    maxRuntimeMs: number | null
    /** Exit after this many ms without a job. */
    exitWhenIdleMs: number | null
    /** After SIGTERM, how long running chunks may go on before they are handed back. */
    shutdownGraceMs: number
    /** Port of /livez and /readyz. */
    healthPort: number | null
  }
  tokensFile: string | null
  /** Serve without tokens although others can reach the server (a non-loopback HOST, or TRUST_PROXY). */
  allowAnonymous: boolean
  /** Largest accepted request body, bytes. */
  bodyLimit: number
  rateLimit: { max: number, windowSeconds: number }
  /** Failed authentications one client address may make per window before it gets 429 (valid tokens still pass). */
  authFailureLimit: { max: number, windowSeconds: number }
  maxActiveSweepsPerOwner: number
  sseHeartbeatSeconds: number
  trustProxy: boolean
  logLevel: typeof LOG_LEVELS[number]
  logFormat: LogFormat
  /** Log every request at info (an access log); by default request lines are debug. */
  logRequests: boolean
  limits: WorkLimitOverrides
  /** The server's address as clients reach it (links in callback events); null: links are paths. */
  publicUrl: string | null
  callbacks: {
    /** CALLBACK_ALLOWED_HOSTS as written: host names, addresses and networks callbacks may reach although private. */
    allowedTargets: string
    /** Signing secret of a server without tokens (owners with tokens have theirs in the tokens file). */
    anonymousSecret: string | null
    attempts: number
    /** Wait after the first failed attempt; doubled after each further one. */
    firstRetryDelayMs: number
  }
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
    workerLifetime: {
      maxRuntimeMs: e.WORKER_MAX_RUNTIME ?? null,
      exitWhenIdleMs: e.WORKER_EXIT_WHEN_IDLE ?? null,
      shutdownGraceMs: e.WORKER_SHUTDOWN_GRACE,
      healthPort: e.WORKER_HEALTH_PORT ?? null
    },
    tokensFile: e.TOKENS_FILE ?? null,
    allowAnonymous: e.ALLOW_ANONYMOUS,
    bodyLimit: e.BODY_LIMIT,
    rateLimit: { max: e.RATE_LIMIT_MAX, windowSeconds: e.RATE_LIMIT_WINDOW },
    authFailureLimit: { max: e.AUTH_FAILURE_MAX, windowSeconds: e.AUTH_FAILURE_WINDOW },
    maxActiveSweepsPerOwner: e.MAX_ACTIVE_SWEEPS_PER_OWNER,
    sseHeartbeatSeconds: e.SSE_HEARTBEAT_SECONDS,
    trustProxy: e.TRUST_PROXY,
    logLevel: e.LOG_LEVEL,
    logFormat: e.LOG_FORMAT,
    logRequests: e.LOG_REQUESTS,
    limits,
    publicUrl: e.PUBLIC_URL === undefined ? null : e.PUBLIC_URL.replace(/\/+$/, ''),
    callbacks: {
      allowedTargets: e.CALLBACK_ALLOWED_HOSTS,
      anonymousSecret: e.CALLBACK_SECRET ?? null,
      attempts: e.CALLBACK_ATTEMPTS,
      firstRetryDelayMs: e.CALLBACK_RETRY_DELAY
    }
  })
}

/**
 * Whether a listen address only admits connections from this machine: the IPv4 loopback
 * network 127.0.0.0/8 (also IPv4-mapped), the IPv6 loopback ::1, or `localhost`. Any other
 * name may resolve to an outside interface, and 0.0.0.0 / :: are every interface.
 */
export function isLoopbackHost (host: string): boolean {
  const bare = host.startsWith('[') && host.endsWith(']') ? host.slice(1, -1) : host
  if (bare.toLowerCase() === 'localhost') return true
  if (isIPv4(bare)) return LOOPBACK.check(bare, 'ipv4')
  if (isIPv6(bare)) return LOOPBACK.check(bare, 'ipv6')
  return false
}

const LOOPBACK = new BlockList()
LOOPBACK.addSubnet('127.0.0.0', 8, 'ipv4')
LOOPBACK.addAddress('::1', 'ipv6')

/** How the server decided about authentication, for the start-up line. */
export interface AccessDecision {
  authentication: boolean
  /** Why, in words: which tokens file, or why serving without tokens is safe or allowed. */
  reason: string
}

/**
 * Secure by default: without TOKENS_FILE the server only serves this machine (a loopback HOST
 * and no reverse proxy in front). Serving others anonymously takes ALLOW_ANONYMOUS=true.
 * Throws ConfigError otherwise, so the server refuses to start rather than serve the network open.
 */
export function decideAccess (config: Config): AccessDecision {
  if (config.tokensFile !== null) return { authentication: true, reason: `tokens from ${config.tokensFile}` }
  const loopback = isLoopbackHost(config.host)
  if (loopback && !config.trustProxy) return { authentication: false, reason: 'only this machine can connect' }
  if (config.allowAnonymous) return { authentication: false, reason: 'anonymous access allowed by ALLOW_ANONYMOUS' }
  const exposure = loopback
    ? `TRUST_PROXY=true says a reverse proxy forwards other machines' requests to ${config.host}`
    : `HOST=${config.host} is reachable from other machines`
  throw new ConfigError([
    `refusing to serve without authentication: ${exposure} and TOKENS_FILE is not set. ` +
    'Set TOKENS_FILE to require bearer tokens (see .env.example), set HOST=127.0.0.1 to serve this machine only, ' +
    'or set ALLOW_ANONYMOUS=true to let anyone who can reach the server use it.'
  ])
}

function deepFreeze<T extends object> (value: T): Readonly<T> {
  for (const inner of Object.values(value)) {
    if (inner !== null && typeof inner === 'object') deepFreeze(inner as object)
  }
  return Object.freeze(value)
}
