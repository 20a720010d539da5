import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { KEPT_URLS, startE2e, type E2e } from '../helpers/e2e'
import { signInAs } from '../helpers/signin'

let e2e: E2e
let base: string

beforeAll(async () => {
  e2e = await startE2e(16)
  base = e2e.base
})
afterAll(() => e2e?.close())

/** Waits until the service worker controls the page (registered after load; it claims at once). */
async function controlled(page: Page) {
  // Strings, because this file is type-checked without the DOM library.
  await expect
    .poll(() => page.evaluate<boolean>('navigator.serviceWorker.controller !== null'), {
      timeout: 10_000,
    })
    .toBe(true)
}

/** The names of the service worker's API caches (one per build). */
const API_CACHES = `caches.keys().then((names) => names.filter((n) => n.startsWith('chopline-api-')))`

describe('at the ramp with no network, in Chromium', () => {
  it('reads the Lake read and the Day plan saved on the device, marked, and refreshes when the network returns', async () => {
    const { context } = e2e.browser
    const page = await context.newPage()
    await signInAs(page, base, 'angler@chopline.test')
    await page.getByRole('link', { name: 'Quillmere Reservoir' }).click()
    await page.getByRole('heading', { name: 'Quillmere Reservoir' }).waitFor()
    await controlled(page)
    // Read once more under the worker's control, so it keeps the answers.
    await page.reload()
    await page.getByRole('heading', { name: 'Quillmere Reservoir' }).waitFor()
    const planLink = page.getByRole('link', { name: /^(Today|Tomorrow)'s day plan →$/ })
    await planLink.click()
    const heading = page.getByRole('heading', { name: /Day plan · Quillmere Reservoir/ })
    await heading.waitFor()
    await expect.poll(() => page.locator('section.plan-window').count()).toBeGreaterThan(0)
    const planUrl = page.url()
    // The worker has kept who is signed in, their settings and each followed lake's read and plans.
    await expect
      .poll(() => page.evaluate<string[]>(KEPT_URLS), { timeout: 10_000 })
      .toEqual(
        expect.arrayContaining([
          `${base}/api/me`,
          `${base}/api/me/settings`,
          `${base}/api/lakes/quillmere/read`,
          planUrl.replace(`${base}/lakes/`, `${base}/api/lakes/`),
        ]),
      )
    const windows = await page.locator('section.plan-window').count()
    const mark = page.getByRole('status').filter({ hasText: /^Saved at .*, offline/ })
    expect(await mark.count()).toBe(0)

    await e2e.offline(context)
    await page.reload()
    await heading.waitFor()
    await mark.waitFor()
    expect(await mark.innerText()).toMatch(/^Saved at \d{1,2}:\d{2}\s?[AP]M, offline/)
    expect(await page.locator('section.plan-window').count()).toBe(windows)

    // The Lake read, opened from the address bar, is read from the device too.
    await page.goto(`${base}/lakes/quillmere`)
    await page.getByRole('heading', { name: 'Quillmere Reservoir' }).waitFor()
    await mark.waitFor()
    // A form says it needs the network and cannot be sent.
    await page.goto(`${base}/settings`)
    await page.getByText('Saving needs a connection.').first().waitFor()
    expect(
      await page
        .getByRole('region', { name: 'Units and home lake' })
        .getByRole('button', { name: 'Save' })
        .isDisabled(),
    ).toBe(true)

    await page.goto(planUrl)
    await heading.waitFor()
    await mark.waitFor()
    // The network returns: the page refreshes itself and the mark goes away.
    const refreshed = page.waitForResponse(
      (r) => r.url().includes('/api/lakes/quillmere/plan/') && r.status() === 200,
    )
    await e2e.online(context)
    await refreshed
    await mark.waitFor({ state: 'detached' })
    expect(await page.locator('section.plan-window').count()).toBe(windows)
    await page.close()
  })

  it("takes a new build over by itself, and keeps none of the old build's answers", async () => {
    // The next version: the same app built again under another label, deployed on the same port.
    const next = mkdtempSync(join(tmpdir(), 'chopline-next-build-'))
    try {
      execFileSync(
        'npx',
        ['vite', 'build', '--outDir', next, '--emptyOutDir', '--logLevel', 'error'],
        {
          env: { ...process.env, CHOPLINE_BUILD: 'e2e-next' },
          stdio: 'pipe',
        },
      )
      const { context } = e2e.browser
      const page = await context.newPage()
      await page.goto(`${base}/settings`)
      const label = page.getByText(/^Chopline build /)
      await label.waitFor()
      expect(await label.innerText()).not.toContain('e2e-next')
      await controlled(page)
      await expect.poll(() => page.evaluate<string[]>(API_CACHES)).toHaveLength(1)
      const [before] = await page.evaluate<string[]>(API_CACHES)

      await e2e.network.down()
      await e2e.network.up(next)
      // The angler only opens the app again; the new worker takes over and the page reloads onto it.
      await page.reload()
      await expect
        .poll(() => label.innerText(), { timeout: 30_000 })
        .toBe('Chopline build e2e-next')
      await expect
        .poll(() => page.evaluate<string[]>(API_CACHES), { timeout: 15_000 })
        .not.toContain(before)
      await page.close()
    } finally {
      await e2e.network.down()
      await e2e.network.up()
      rmSync(next, { recursive: true, force: true })
    }
  }, 120_000)
})
