import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { chromium, type BrowserContext } from 'playwright-core'

export const artifactsDir = fileURLToPath(new URL('../e2e/artifacts', import.meta.url))

/** Debian's Chromium (package `chromium`); `tests/setup/chromium.ts` makes sure it is there. */
export const CHROMIUM_PATH = '/usr/bin/chromium'

/** Headless, no first-run work, and no network beyond loopback (this machine has none). */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE 127.0.0.1',
]

/** Debian's Chromium, headless, with a fresh profile and no network beyond loopback. */
export async function launchBrowser(): Promise<{
  context: BrowserContext
  close: () => Promise<void>
}> {
  mkdirSync(artifactsDir, { recursive: true })
  const profile = mkdtempSync(join(tmpdir(), 'chopline-chromium-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    viewport: { width: 390, height: 844 },
    args: CHROMIUM_ARGS,
  })
  context.setDefaultTimeout(10_000)
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(profile, { recursive: true, force: true })
    },
  }
}
