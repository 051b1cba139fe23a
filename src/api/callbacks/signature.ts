/**
 * The signature of a completion callback: `Memsweep-Signature: t=<unix seconds>,v1=<hex>`,
 * where v1 is HMAC-SHA256 with the owner's callback secret over `<t>.<raw body>`. Signing the
 * time with the body lets a receiver refuse replays of an old event (docs/callbacks.md).
 */
import { createHmac, timingSafeEqual } from 'node:crypto'

export const SIGNATURE_HEADER = 'memsweep-signature'

export function signCallback (secret: string, body: string, unixSeconds: number): string {
  return `t=${unixSeconds},v1=${createHmac('sha256', secret).update(`${unixSeconds}.${body}`).digest('hex')}`
}

/**
 * A receiver's check: the header parses, some v1 matches, and its time is within
 * `toleranceSeconds` of `nowSeconds`.
 */
export function verifyCallback (secret: string, body: string, header: string, nowSeconds: number, toleranceSeconds = 300): boolean {
  const fields = header.split(',').map((part) => part.trim().split('=', 2) as [string, string | undefined])
  const time = Number(fields.find(([name]) => name === 't')?.[1])
  if (!Number.isSafeInteger(time) || Math.abs(nowSeconds - time) > toleranceSeconds) return false
  const expected = Buffer.from(signCallback(secret, body, time).split('v1=')[1]!, 'hex')
  return fields.some(([name, value]) => {
    if (name !== 'v1' || value === undefined || !/^[0-9a-f]{64}$/.test(value)) return false
    return timingSafeEqual(Buffer.from(value, 'hex'), expected)
  })
}
