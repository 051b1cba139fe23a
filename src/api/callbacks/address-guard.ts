/**
 * Where completion callbacks may go. A callback makes the server send a request to an
 * address a user names, so without a guard a user could make it reach what only the server
 * reaches (server-side request forgery): loopback, the private networks, link-local
 * addresses (cloud metadata services live at 169.254.169.254 and fd00:ec2::254), and the
 * other special-purpose ranges. Names are resolved and every address they resolve to is
 * checked, at submission and again on each delivery, where the checked address is the one
 * connected to (no second lookup a rebinding name could answer differently). The operator
 * may allow hosts or networks (CALLBACK_ALLOWED_HOSTS: a receiver on the lab's own network).
 */
import { lookup as dnsLookup } from 'node:dns/promises'
import { BlockList, isIP } from 'node:net'
import type { LookupFunction } from 'node:net'

/** Special-purpose ranges (IANA registries for IPv4 and IPv6), refused unless allowed. */
const REFUSED = new BlockList()
for (const [network, prefix] of [
  ['0.0.0.0', 8], ['10.0.0.0', 8], ['100.64.0.0', 10], ['127.0.0.0', 8], ['169.254.0.0', 16], ['172.16.0.0', 12],
  ['192.0.0.0', 24], ['192.0.2.0', 24], ['192.88.99.0', 24], ['192.168.0.0', 16], ['198.18.0.0', 15], ['198.51.100.0', 24],
  ['203.0.113.0', 24], ['224.0.0.0', 4], ['240.0.0.0', 4]
] as const) REFUSED.addSubnet(network, prefix, 'ipv4')
for (const [network, prefix] of [
  ['::', 128], ['::1', 128], ['::ffff:0:0', 96], ['64:ff9b::', 96], ['64:ff9b:1::', 48], ['100::', 64], ['2001::', 23], ['2001:db8::', 32],
  ['2002::', 16], ['fc00::', 7], ['fe80::', 10], ['fec0::', 10], ['ff00::', 8]
] as const) REFUSED.addSubnet(network, prefix, 'ipv6')

export interface CallbackTargetPolicy {
  /** Host names allowed whatever they resolve to (lower case). */
  hosts: ReadonlySet<string>
  /** Networks whose addresses are allowed. */
  networks: BlockList
}

/**
 * Parses CALLBACK_ALLOWED_HOSTS: host names, addresses and CIDR networks separated by commas.
 * @throws {RangeError} naming the first entry that is none of these.
 */
export function parseAllowedTargets (text: string): CallbackTargetPolicy {
  const hosts = new Set<string>()
  const networks = new BlockList()
  for (const raw of text.split(',')) {
    const entry = raw.trim().toLowerCase()
    if (entry === '') continue
    const [address, prefix] = entry.split('/') as [string, string | undefined]
    const family = isIP(address)
    if (family !== 0) {
      const bits = prefix === undefined ? (family === 4 ? 32 : 128) : Number(prefix)
      if (!Number.isInteger(bits) || bits < 0 || bits > (family === 4 ? 32 : 128)) throw new RangeError(`invalid argument. Not a network: ${raw.trim()}.`)
      networks.addSubnet(address, bits, family === 4 ? 'ipv4' : 'ipv6')
    } else if (prefix === undefined && /^[a-z0-9]([a-z0-9-]*[a-z0-9])?(\.[a-z0-9]([a-z0-9-]*[a-z0-9])?)*$/.test(entry)) {
      hosts.add(entry)
    } else {
      throw new RangeError(`invalid argument. Not a host name, address or network: ${raw.trim()}.`)
    }
  }
  return { hosts, networks }
}

/** Why an address may not be called, or null when it may. */
export function refusedAddress (address: string, policy: CallbackTargetPolicy): string | null {
  const family = isIP(address) === 6 ? 'ipv6' : 'ipv4'
  if (policy.networks.check(address, family)) return null
  // IPv4-mapped IPv6 addresses are judged as the IPv4 address they carry.
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(address)
  if (mapped !== null) return refusedAddress(mapped[1]!, policy)
  if (REFUSED.check(address, family)) return `${address} is a private, loopback, link-local or otherwise special-purpose address`
  return null
}

export type TargetCheck = { ok: true, url: URL } | { ok: false, reason: string }

/** Checks a callback URL as submitted: http(s), no credentials, and every address its host resolves to. */
export async function checkCallbackTarget (text: string, policy: CallbackTargetPolicy): Promise<TargetCheck> {
  let url: URL
  try {
    url = new URL(text)
  } catch {
    return { ok: false, reason: 'not an absolute URL' }
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') return { ok: false, reason: `the scheme must be https or http, not ${url.protocol.replace(/:$/, '')}` }
  if (url.username !== '' || url.password !== '') return { ok: false, reason: 'credentials in the URL are not accepted (the event is signed instead)' }
  const host = bareHost(url.hostname)
  if (policy.hosts.has(host)) return { ok: true, url }
  let addresses: string[]
  try {
    addresses = isIP(host) !== 0 ? [host] : (await dnsLookup(host, { all: true, verbatim: true })).map((entry) => entry.address)
  } catch {
    return { ok: false, reason: `the host ${host} does not resolve` }
  }
  for (const address of addresses) {
    const refused = refusedAddress(address, policy)
    if (refused !== null) return { ok: false, reason: `the host ${host} resolves to ${refused}; the operator may allow it (CALLBACK_ALLOWED_HOSTS)` }
  }
  return { ok: true, url }
}

/** A `lookup` for node's http(s).request: resolves, then refuses the connection unless every address passes. */
export function guardedLookup (policy: CallbackTargetPolicy): LookupFunction {
  return (hostname, options, callback) => {
    const host = bareHost(hostname)
    dnsLookup(host, { all: true, verbatim: true }).then((entries) => {
      const allowedByName = policy.hosts.has(host)
      for (const entry of entries) {
        const refused = allowedByName ? null : refusedAddress(entry.address, policy)
        if (refused !== null) throw new Error(`refused: ${refused}`)
      }
      if (options.all === true) callback(null, entries)
      else callback(null, entries[0]!.address, entries[0]!.family)
    }).catch((error: unknown) => callback(error as NodeJS.ErrnoException, '', 4))
  }
}

function bareHost (hostname: string): string {
  const lower = hostname.toLowerCase()
  return lower.startsWith('[') && lower.endsWith(']') ? lower.slice(1, -1) : lower
}
