import { join } from 'node:path'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { runCheckWatches } from '../../jobs/check-watches'
import { SCENARIOS } from '../../server/fakes/feed/scenarios'
import { TEST_SECRET } from '../helpers/app'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { apiSession, startE2eScenario, type E2eScenario } from '../helpers/e2e'
import { TEST_ORIGIN } from '../helpers/mail'

/**
 * A bank watch from end to end on the blow (2026-04-14 on Quillmere, see the scenario): the demo
 * angler sets "wind onto this bank, 8 to 20 mph" on a bank facing the blow from a phone, the
 * watch check the scheduler runs tells them by mail, and the mail's link opens that window of the
 * Day plan.
 */
const blow = SCENARIOS.blow
let e2e: E2eScenario

beforeAll(async () => {
  // The north-north-east shore faces the blow from 200° (as in tests/server/watch.test.ts).
  e2e = await startE2eScenario('blow', [{ name: 'North point', bearingDeg: 20, cover: ['rock'] }])
  await (await apiSession(e2e.base, 'angler@chopline.test')).into(e2e.browser.context)
}, 60_000)
afterAll(() => e2e?.close())

describe('a bank watch in Chromium on a phone', () => {
  it('is set from the bank, told once by mail, and its link opens the window', async () => {
    const page = await e2e.browser.context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await page.goto(`${e2e.base}/lakes/${blow.lake}`)
    await page.locator('.banks-slot').scrollIntoViewIfNeeded()
    await page.getByRole('link', { name: 'Watch this bank' }).click()
    await page.waitForURL(/\/watches\?/)

    const form = page.getByRole('region', { name: 'New watch' })
    await form.getByLabel('Name').fill('Point on the blow')
    await form.getByLabel('Wind at least (mph)').fill('8')
    await form.getByLabel('Wind at most (mph)').fill('20')
    expect(await form.getByRole('checkbox', { name: /Blowing onto the bank/ }).isChecked()).toBe(
      true,
    )
    await expectAccessible(page, 'New watch form')
    await page.screenshot({ path: join(artifactsDir, 'watch-form-phone.png'), fullPage: true })
    await form.getByRole('button', { name: 'Save watch' }).click()
    await page.getByText('Watching: Point on the blow.').waitFor()
    const item = page.getByRole('list', { name: 'Your watches' }).getByRole('listitem')
    await item.getByText('wind 8 to 20 mph onto the bank').waitFor()
    expect(await item.innerText()).toContain('North point')

    // The job's own path, as the scheduler runs it after an ingest.
    const check = () =>
      runCheckWatches({
        db: e2e.db,
        log: pino({ level: 'silent' }),
        mail: e2e.mail.mail,
        sessionSecret: TEST_SECRET,
      })
    const run = await check()
    expect(run).toMatchObject({ skipped: false })
    const alerts = e2e.mail.smtp.messages().filter((m) => m.subject.startsWith('Point on the blow'))
    // Day 0's dawn (6 m/s, 14 mph, from 200° onto the point) matches; its midday blow is a no-go.
    const dawn = alerts.find((m) => m.subject.includes('dawn to mid-morning on Tue, Apr 14'))!
    expect(dawn.to).toEqual(['angler@chopline.test'])
    expect(dawn.text).toContain('onto it at North point')
    await check()
    expect(
      e2e.mail.smtp.messages().filter((m) => m.subject.startsWith('Point on the blow')),
      'a second run tells nothing again',
    ).toHaveLength(alerts.length)

    // The mail's own link, opened on this server.
    const prefix = `${TEST_ORIGIN}/lakes/${blow.lake}/plan/${blow.day}#window-dawn`
    const at = dawn.text.indexOf(prefix)
    expect(at, 'a link to the window').toBeGreaterThanOrEqual(0)
    const link = new URL(dawn.text.slice(at).split(/\s/)[0]!)
    await page.goto(`${e2e.base}${link.pathname}${link.search}${link.hash}`)
    const window = page.locator('#window-dawn')
    await window.waitFor()
    expect(await window.innerText()).toMatch(/Dawn to mid-morning/)
    await expect.poll(() => window.isVisible()).toBe(true)
    await page.screenshot({ path: join(artifactsDir, 'watch-alert-window-phone.png') })
    await page.close()
  })
})
