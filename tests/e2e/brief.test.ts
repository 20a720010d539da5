import { join } from 'node:path'
import { eq } from 'drizzle-orm'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { briefSettings, users } from '../../server/db/schema/index'
import { runSendBriefs } from '../../jobs/send-briefs'
import { TEST_SECRET } from '../helpers/app'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { startE2e, type E2e } from '../helpers/e2e'
import { openFromNav } from '../helpers/nav'
import { signInAs } from '../helpers/signin'

let e2e: E2e
let base: string

beforeAll(async () => {
  e2e = await startE2e(16)
  base = e2e.base
})
afterAll(() => e2e?.close())

/** The path and query of the first link in `text` that starts with `prefix`, opened on this server. */
function linkOnThisServer(text: string, prefix: string): string {
  const at = text.indexOf(prefix)
  expect(at, `a ${prefix} link`).toBeGreaterThanOrEqual(0)
  const url = new URL(text.slice(at).split(/\s/)[0]!)
  return `${base}${url.pathname}${url.search}`
}

describe('the morning brief in Chromium', () => {
  it('confirms the address from the e-mailed link and saves the brief settings', async () => {
    const page = await e2e.browser.context.newPage()
    await page.goto(`${base}/signup`)
    await page.getByLabel('E-mail').fill('early@riser.test')
    await page.getByLabel('Password').fill('a long enough password')
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.getByText('Check your inbox').waitFor()
    const welcome = await vi.waitFor(() => {
      const found = e2e.mail.smtp.messages().find((m) => m.to.includes('early@riser.test'))
      if (!found) throw new Error('no sign-up mail yet')
      return found
    })
    await page.goto(linkOnThisServer(welcome.text, 'http://app.test/welcome'))
    await page.waitForURL(`${base}/lakes`)
    // As an account from before sign-up confirmed addresses: the brief asks for its own link.
    await e2e.db
      .update(users)
      .set({ emailVerifiedAt: null })
      .where(eq(users.email, 'early@riser.test'))
    await page.getByRole('switch', { name: /Follow Quillmere/ }).click()
    await page.getByRole('link', { name: 'Settings' }).click()

    const brief = page.getByRole('region', { name: 'Morning brief' })
    await brief.getByText('not confirmed').waitFor()
    await brief.getByText('Quillmere Reservoir').waitFor()
    await expectAccessible(page, 'Settings with the brief')
    await brief.getByRole('button', { name: 'Send confirmation link' }).click()
    await page.getByText(/A confirmation link is on its way to early@riser\.test/).waitFor()

    const message = e2e.mail.smtp
      .messages()
      .find((m) => m.to.includes('early@riser.test') && /morning brief/.test(m.subject))
    expect(message!.to).toEqual(['early@riser.test'])
    await page.goto(linkOnThisServer(message!.text, 'http://app.test/verify-email'))
    await page.getByText('Address confirmed').waitFor()
    await expectAccessible(page, 'Address confirmed')

    await page.getByRole('link', { name: 'Brief settings' }).click()
    await brief.getByText('confirmed', { exact: true }).waitFor()
    await brief.getByRole('checkbox', { name: 'Sun' }).uncheck({ force: true })
    // The followed lake goes in the brief; the brief is written in the account's units.
    expect(await brief.getByRole('checkbox', { name: 'Quillmere Reservoir' }).isChecked()).toBe(
      true,
    )
    await brief.getByText('Written in your units (°F, feet, mph, 12-hour clock)').waitFor()
    await brief.getByRole('button', { name: 'Save brief' }).click()
    await page
      .getByText('Morning brief saved.')
      .waitFor()
      .catch(async (err: unknown) => {
        await page.screenshot({ path: join(artifactsDir, 'brief-save-failed.png'), fullPage: true })
        throw err
      })
    const [user] = await e2e.db.select().from(users).where(eq(users.email, 'early@riser.test'))
    const [saved] = await e2e.db
      .select()
      .from(briefSettings)
      .where(eq(briefSettings.userId, user!.id))
    expect(saved).toMatchObject({ enabled: true, days: [1, 2, 3, 4, 5, 6] })
    expect(saved!.sendTime).toBe('05:00:00')
    await page.screenshot({ path: join(artifactsDir, 'brief-settings-phone.png'), fullPage: true })
    await page.close()
  })

  it('lets an admin read the brief the job sent, and its unsubscribe link works without signing in', async () => {
    e2e.mail.smtp.clear()
    // The demo angler follows Quillmere and takes the brief at 05:00 Chicago time: send it now.
    const tomorrow = new Date(Date.now() + 86_400_000)
    tomorrow.setUTCHours(12, 0, 0, 0)
    const run = await runSendBriefs({
      db: e2e.db,
      log: pino({ level: 'silent' }),
      mail: e2e.mail.mail,
      sessionSecret: TEST_SECRET,
      now: () => tomorrow,
    })
    expect(run).toMatchObject({ skipped: false })
    const brief = e2e.mail.smtp.messages().find((m) => m.to.includes('angler@chopline.test'))!
    expect(brief.subject).toMatch(/^Morning brief, /)

    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'admin@chopline.test')
    await openFromNav(page, 'Mail')
    await page.getByRole('heading', { name: 'Caught mail' }).waitFor()
    await page.getByText('Every brief has gone out.').waitFor()
    await page
      .getByRole('button', { name: brief.subject })
      .filter({ hasText: 'angler@chopline.test' })
      .click()
    await page.getByText('List-Unsubscribe').waitFor()
    const html = page.frameLocator('iframe[title="HTML part"]')
    await html.getByRole('heading', { name: 'Quillmere Reservoir' }).waitFor()
    await expectAccessible(page, 'Mail')
    await page.getByRole('radio', { name: 'Plain text' }).check({ force: true })
    await page.getByText(/Full day plan: http:\/\/app\.test\/lakes\/quillmere\/plan\//).waitFor()
    await page.setViewportSize({ width: 1366, height: 900 })
    await page.screenshot({ path: join(artifactsDir, 'admin-mail-desktop.png'), fullPage: true })

    // The brief as a narrow mail client shows it.
    const narrow = await e2e.browser.context.newPage()
    await narrow.setContent(brief.html!)
    await narrow.screenshot({ path: join(artifactsDir, 'brief-email-phone.png'), fullPage: true })
    const width = await narrow.evaluate<number>('document.documentElement.scrollWidth')
    expect(width).toBeLessThanOrEqual(390)
    await narrow.close()

    // Signed out, the link from the e-mail still unsubscribes.
    await e2e.browser.context.clearCookies()
    await page.goto(linkOnThisServer(brief.text, 'http://app.test/unsubscribe'))
    await page.getByText('You are unsubscribed').waitFor()
    await expectAccessible(page, 'Unsubscribed')
    const [angler] = await e2e.db
      .select()
      .from(users)
      .where(eq(users.email, 'angler@chopline.test'))
    const [settings] = await e2e.db
      .select()
      .from(briefSettings)
      .where(eq(briefSettings.userId, angler!.id))
    expect(settings!.enabled).toBe(false)
    // A link that has been tampered with says so.
    await page.goto(`${base}/unsubscribe?token=not-a-real-token-at-all`)
    await page.getByText('The brief could not be turned off').waitFor()
    await page.close()
  })
})
