import { join } from 'node:path'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { VERDICT_LABELS } from '../../shared/conditions/safety'
import { DEFAULT_SETTINGS, makeFormat } from '../../shared/format'
import type { DayPlanResponse } from '../../shared/schemas/day-plan'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { startE2e, type E2e } from '../helpers/e2e'
import { signInAs } from '../helpers/signin'

let e2e: E2e
let base: string

beforeAll(async () => {
  e2e = await startE2e(16)
  base = e2e.base
})
afterAll(() => e2e?.close())

/** Taps the outline at a share of the way along its shoreline path, a few pixels out in the water. */
async function tapShore(page: Page, share: number) {
  // A string, because this file is type-checked without the DOM library.
  const { x, y } = await page.evaluate<{ x: number; y: number }>(`(() => {
    const path = document.querySelector('path.water')
    const p = path.getPointAtLength(path.getTotalLength() * ${share})
    const m = path.getScreenCTM()
    return { x: p.x * m.a + m.e + 3, y: p.y * m.d + m.f + 3 }
  })()`)
  await page.mouse.click(x, y)
}

describe("the angler's day in Chromium", () => {
  it('adds a bank on the map, sees it ranked in the day plan, at phone and desktop sizes', async () => {
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'angler@chopline.test')
    await expectAccessible(page, 'Lakes')
    await page.getByRole('link', { name: 'Quillmere Reservoir' }).click()
    // The map loads when it scrolls into view.
    await page.locator('.banks-slot').scrollIntoViewIfNeeded()
    await page.getByRole('region', { name: 'Banks' }).getByText('No banks saved').waitFor()

    await page.getByRole('button', { name: 'Add a bank' }).click()
    await tapShore(page, 0.1)
    await tapShore(page, 0.12)
    await page.getByText('2 points picked.').waitFor()
    await page.getByLabel('Name').fill('Windy rocks')
    await page.getByRole('checkbox', { name: 'Rock' }).check({ force: true })
    await page.getByLabel(/Depth a cast off the bank/).fill('10')
    await page.getByRole('button', { name: 'Save bank' }).click()
    await page.getByText('Saved Windy rocks.').waitFor()
    const list = page.getByRole('list', { name: 'Your banks on this lake' })
    await expect.poll(() => list.innerText()).toMatch(/Windy rocks[\s\S]*10\.0 ft a cast out/)
    // The exposure table stored on save, one row per compass point.
    await list.getByText('Fetch by wind direction').click()
    await expect.poll(() => list.locator('tbody tr').count()).toBe(16)
    // The bank is drawn on the outline in its exposure colour, titled for screen readers.
    await expect.poll(() => page.locator('g.bank title').textContent()).toMatch(/^Windy rocks: /)
    await expectAccessible(page, 'Lake read')
    await page.screenshot({ path: join(artifactsDir, 'banks-phone.png'), fullPage: true })

    // Late in the evening at the lake the Lake read offers tomorrow's plan instead.
    await page.getByRole('link', { name: /^(Today|Tomorrow)'s day plan →$/ }).click()
    await page.getByRole('heading', { name: /Day plan · Quillmere Reservoir/ }).waitFor()
    const firstWindow = page.locator('section.plan-window').filter({ hasText: 'Windy rocks' })
    await expect.poll(() => firstWindow.count()).toBeGreaterThan(0)
    await expect.poll(() => page.locator('.tackle-call').count()).toBeGreaterThan(0)
    await expect
      .poll(() => page.getByRole('region', { name: 'About these cautions' }).innerText())
      .toMatch(/boating law/)
    // Every window shows its verdict and each of its cautions as the API has them, once.
    const date = page.url().split('/').at(-1)!
    const answer = (await (
      await page.request.get(`${base}/api/lakes/quillmere/plan/${date}`)
    ).json()) as DayPlanResponse
    const f = makeFormat(DEFAULT_SETTINGS)
    let compared = 0
    for (const w of answer.plan!.windows.filter((x) => x.weather)) {
      const section = page.locator('section.plan-window', { has: page.locator(`#window-${w.id}`) })
      const text = await section.innerText()
      expect(text).toContain(VERDICT_LABELS[f.verdict(w.cautions).verdict])
      for (const c of w.cautions.filter((x) => x.kind !== 'authority')) {
        const message = f.caution(c).message
        expect(text.split(message).length - 1, message).toBe(1)
        compared++
      }
    }
    expect(compared).toBeGreaterThan(0)
    await expectAccessible(page, 'Day plan')
    await page.screenshot({ path: join(artifactsDir, 'day-plan-phone.png'), fullPage: true })

    await page.setViewportSize({ width: 1366, height: 900 })
    await page.reload()
    await page.getByRole('heading', { name: /Day plan · Quillmere Reservoir/ }).waitFor()
    await page.screenshot({ path: join(artifactsDir, 'day-plan-desktop.png'), fullPage: true })
    await page.goBack()
    await page.getByRole('heading', { name: 'Quillmere Reservoir' }).waitFor()
    await page.locator('.banks-slot').scrollIntoViewIfNeeded()
    await page
      .getByRole('list', { name: 'Your banks on this lake' })
      .getByText('Windy rocks', { exact: true })
      .waitFor()
    await page.screenshot({ path: join(artifactsDir, 'banks-desktop.png'), fullPage: true })

    // Metric units apply to the plan as well.
    await page.getByRole('link', { name: 'Settings' }).click()
    await expectAccessible(page, 'Settings')
    const units = page.getByRole('region', { name: 'Units and home lake' })
    await units.getByRole('radio', { name: 'metres' }).check({ force: true })
    await units.getByRole('button', { name: 'Save' }).click()
    await page.getByText('Settings saved.').waitFor()
    await page.goto(`${base}/lakes/quillmere`)
    await page.locator('.banks-slot').scrollIntoViewIfNeeded()
    await expect.poll(() => list.innerText()).toMatch(/3\.0 m a cast out/)
    await page.close()
  })

  it('picks a bank with the keyboard alone', async () => {
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await signInAs(page, base, 'guide@chopline.test')
    await page.goto(`${base}/lakes/quillmere`)
    await page.locator('.banks-slot').scrollIntoViewIfNeeded()
    await page.getByRole('button', { name: 'Add a bank' }).click()
    const map = page.getByRole('img', { name: /Adding a bank: arrow keys/ })
    await map.focus()
    await page.keyboard.press('Enter')
    for (let i = 0; i < 3; i++) await page.keyboard.press('Shift+ArrowRight')
    await page.keyboard.press('Enter')
    await page.getByText('2 points picked.').waitFor()
    await page.getByLabel('Name').fill('North cove')
    await page.getByRole('checkbox', { name: 'Wood / laydowns' }).check({ force: true })
    await page.getByRole('button', { name: 'Save bank' }).click()
    await page.getByText('Saved North cove.').waitFor()
    // The dark theme loads on demand and repaints the page.
    const background = () =>
      page.evaluate<string>('getComputedStyle(document.body).backgroundColor')
    const light = await background()
    await page.getByRole('button', { name: 'Dark' }).click()
    await expect.poll(background).not.toBe(light)
    await page.getByRole('button', { name: 'Light' }).waitFor()
    await page.close()
  })
})
