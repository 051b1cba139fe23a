/**
 * Bearer tokens of a shared lab server, read from TOKENS_FILE.
 *
 * One token per line: `owner:token` or `owner:token:role`. Blank lines and lines starting
 * with `#` are ignored. `owner` is a name of letters, digits, `.`, `_` or `-`; a token is at
 * least 16 characters of letters, digits and `-._~+/=`; several tokens may share an owner
 * (one per laptop, say). Roles:
 *   - `submit` (default): submit, read and cancel one's own sweeps;
 *   - `read`: read one's own sweeps only (dashboards, monitoring scripts);
 *   - `admin`: read, list and cancel every owner's sweeps, and read /metrics (the lab admin).
 * A line `owner:secret:callback-secret` is no token: it sets the secret the owner's completion
 * callbacks are signed with (docs/callbacks.md), at most one per owner.
 */
import { createHash, timingSafeEqual } from 'node:crypto'
import { readFile } from 'node:fs/promises'

export const ROLES = ['submit', 'read', 'admin'] as const
export type Role = typeof ROLES[number]

export interface Principal {
  /** Owner name; null when the server runs without tokens (a single-user machine). */
  owner: string | null
  role: Role
}

export interface TokenTable {
  /** The principal a presented token belongs to, or null. */
  lookup (token: string): Principal | null
  readonly size: number
  /** The secret an owner's completion callbacks are signed with, or null. */
  callbackSecret (owner: string): string | null
}

const CALLBACK_SECRET_ROLE = 'callback-secret'

/** Owner names: in the tokens file, and wherever a request names an owner. */
export const OWNER_NAME = /^[A-Za-z0-9._-]{1,64}$/
const TOKEN = /^[A-Za-z0-9\-._~+/=]{16,512}$/

export class TokenFileError extends Error {
  constructor (readonly file: string, readonly line: number, reason: string) {
    super(`${file}:${line}: ${reason}`)
    this.name = 'TokenFileError'
  }
}

function digest (token: string): Buffer {
  return createHash('sha256').update(token).digest()
}

/** Parses the text of a tokens file; `file` only names the source in error messages. */
export function parseTokens (text: string, file = 'TOKENS_FILE'): TokenTable {
  // Keyed by the token's sha256 so the lookup time says nothing about the token's characters.
  const byDigest = new Map<string, { digest: Buffer, principal: Principal }>()
  const secrets = new Map<string, string>()
  const lines = text.split(/\r?\n/)
  lines.forEach((raw, index) => {
    const line = raw.trim()
    if (line === '' || line.startsWith('#')) return
    const fields = line.split(':')
    if (fields.length < 2 || fields.length > 3) {
      throw new TokenFileError(file, index + 1, 'expected owner:token or owner:token:role')
    }
    const [owner = '', token = '', role = 'submit'] = fields
    if (!OWNER_NAME.test(owner)) throw new TokenFileError(file, index + 1, `owner '${owner}' must be 1-64 letters, digits, '.', '_' or '-'`)
    if (!TOKEN.test(token)) throw new TokenFileError(file, index + 1, 'token must be 16-512 characters of letters, digits and -._~+/=')
    if (role === CALLBACK_SECRET_ROLE) {
      if (secrets.has(owner)) throw new TokenFileError(file, index + 1, `owner '${owner}' has a callback secret already`)
      secrets.set(owner, token)
      return
    }
    if (!(ROLES as readonly string[]).includes(role)) throw new TokenFileError(file, index + 1, `role '${role}' must be one of ${ROLES.join(', ')} (or ${CALLBACK_SECRET_ROLE})`)
    const d = digest(token)
    const key = d.toString('hex')
    if (byDigest.has(key)) throw new TokenFileError(file, index + 1, 'the same token appears twice')
    byDigest.set(key, { digest: d, principal: { owner, role: role as Role } })
  })
  return {
    size: byDigest.size,
    callbackSecret: (owner: string) => secrets.get(owner) ?? null,
    lookup (token: string): Principal | null {
      const d = digest(token)
      const entry = byDigest.get(d.toString('hex'))
      if (entry === undefined || !timingSafeEqual(entry.digest, d)) return null
      return entry.principal
    }
  }
}

export async function loadTokens (file: string): Promise<TokenTable> {
  const table = parseTokens(await readFile(file, 'utf8'), file)
  if (table.size === 0) throw new TokenFileError(file, 0, 'no tokens: remove TOKENS_FILE to run without tokens')
  return table
}
