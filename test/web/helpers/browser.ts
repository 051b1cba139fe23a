/**
 * Debian's Chromium driven by playwright-core (no browser download): the flags keep it from
 * reaching out to the network at start, and playwright gives each launch a fresh profile.
 */
import { existsSync, mkdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { chromium, type Browser } from 'playwright-core'

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

/** Screenshots land here; the folder is git-ignored. */
export const ARTIFACTS = fileURLToPath(new URL('../../artifacts/', import.meta.url))

export async function launchChromium (): Promise<Browser> {
  if (!existsSync(CHROMIUM)) {
    throw new Error(`Chromium is not at ${CHROMIUM}: install the OS package (apt-get install -y chromium) or set CHROMIUM_PATH`)
  }
  mkdirSync(ARTIFACTS, { recursive: true })
  return await chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync'
    ]
  })
}
