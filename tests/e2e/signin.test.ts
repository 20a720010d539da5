import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../server/db/seed/index'
import { artifactsDir } from '../helpers/browser'
import { startE2e, type E2e } from '../helpers/e2e'
import { openFromNav } from '../helpers/nav'
import { signInAs } from '../helpers/signin'

let e2e: E2e
let base: string

beforeAll(async () => {
  // Fifteen days of readings: enough for trends and the seasonal phase.
  e2e = await startE2e(15)
  base = e2e.base
})
afterAll(() => e2e?.close())

describe('sign-in in Chromium', () => {
  it('signs the demo angler in through the real page and lands on Lakes', async () => {
    const page = await e2e.browser.context.newPage()
    await page.goto(`${base}/lakes`)
    // A guarded page sends a signed-out visitor to sign in, remembering where they were going.
    await page.waitForURL(/\/signin\?redirect=/)
    await page.getByLabel('E-mail').fill('angler@chopline.test')
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL(`${base}/lakes`)
    await expect.poll(() => page.getByRole('heading', { name: 'Lakes' }).isVisible()).toBe(true)
    await page.getByText('Quillmere Reservoir').waitFor()
    await expect
      .poll(() => page.getByRole('navigation', { name: 'Main' }).innerText())
      .not.toContain('Users')
    await page.screenshot({ path: join(artifactsDir, 'signin-lakes.png'), fullPage: true })
    await page.close()
  })

  it('shows the server message for a wrong password and the admin link for an admin', async () => {
    // Signed in, /signin would send us on to Lakes.
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await page.goto(`${base}/signin`)
    await page.getByLabel('E-mail').fill('admin@chopline.test')
    await page.getByLabel('Password').fill('not the password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('alert').filter({ hasText: 'E-mail or password is incorrect.' }).waitFor()
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await openFromNav(page, 'Users')
    await page.getByText('guide@chopline.test').waitFor()
    await page.screenshot({ path: join(artifactsDir, 'admin-users.png'), fullPage: true })
    await page.close()
  })

  it('opens a lake read with its water strip, cautions, wind and season, on a phone and a desktop', async () => {
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'angler@chopline.test')
    await page.getByRole('link', { name: 'Quillmere Reservoir' }).click()
    await page.waitForURL(`${base}/lakes/quillmere`)
    await page.getByRole('heading', { name: 'Quillmere Reservoir' }).waitFor()
    const strip = page.getByRole('region', { name: 'Water' })
    await expect.poll(() => strip.innerText()).toMatch(/°F/)
    await expect
      .poll(() => page.getByRole('region', { name: 'Safety cautions' }).innerText())
      .toMatch(/boating law/)
    await expect
      .poll(() => page.getByRole('region', { name: 'Sky and season' }).innerText())
      .toMatch(/5-day mean/)
    // The map and the charts load as they scroll into view, the charts each a labelled canvas.
    await page.locator('.banks-slot').scrollIntoViewIfNeeded()
    await page
      .getByRole('img', { name: /Outline of Quillmere Reservoir, .* with 2 islands/ })
      .waitFor()
    await page.locator('.charts-slot').scrollIntoViewIfNeeded()
    await page.getByRole('img', { name: 'Water temperature chart' }).waitFor()
    await page.getByRole('radio', { name: '30 days' }).check({ force: true })
    await page.getByRole('heading', { name: 'Last 30 days' }).waitFor()
    await page.screenshot({ path: join(artifactsDir, 'lake-read-phone.png'), fullPage: true })
    // Switch to metric units and see the same lake in them.
    await page.getByRole('link', { name: 'Settings' }).click()
    const units = page.getByRole('region', { name: 'Units and home lake' })
    await units.getByRole('radio', { name: '°C' }).check({ force: true })
    await units.getByRole('radio', { name: 'metres' }).check({ force: true })
    await units.getByRole('button', { name: 'Save' }).click()
    await page.getByText('Settings saved.').waitFor()
    await page.goto(`${base}/lakes/quillmere`)
    await expect.poll(() => page.getByRole('region', { name: 'Water' }).innerText()).toMatch(/°C/)
    await page.setViewportSize({ width: 1366, height: 900 })
    await page.screenshot({ path: join(artifactsDir, 'lake-read-desktop.png'), fullPage: true })
    await page.close()
  })
})
