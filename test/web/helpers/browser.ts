/**
 * Debian's Chromium driven by playwright-core (no browser download): the flags keep it from
 * reaching out to the network at start, and playwright gives each launch a fresh profile.
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type Browser } from 'playwright-core'
import { afterAll } from 'vitest'

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

/**
 * Screenshots land in MEMSWEEP_TEST_ARTIFACTS when set (`MEMSWEEP_TEST_ARTIFACTS=test/artifacts
 * npm test` keeps them in the git-ignored folder, to look at), else in a temporary folder of
 * this test file: a test writes to no fixed path of its own accord.
 */
export const ARTIFACTS = process.env.MEMSWEEP_TEST_ARTIFACTS ?? temporaryShots()

function temporaryShots (): string {
  const dir = mkdtempSync(join(tmpdir(), 'memsweep-shots-'))
  // Registered on the importing test file: its shots go when it ends.
  afterAll(() => rmSync(dir, { recursive: true, force: true }))
  return dir
}

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
