import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { addDays, localDate } from '../../shared/time'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { startE2e, type E2e } from '../helpers/e2e'
import { signInAs } from '../helpers/signin'

let e2e: E2e
let base: string

beforeAll(async () => {
  e2e = await startE2e(15)
  base = e2e.base
})
afterAll(() => e2e?.close())

describe('on a phone (390 px) in Chromium', () => {
  it('keeps every admin link reachable through "More", with nothing cut off', async () => {
    const page = await e2e.browser.context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await signInAs(page, base, 'admin@chopline.test')
    const nav = page.getByRole('navigation', { name: 'Main' })
    // Nothing runs off the side of the page.
    expect(await page.evaluate<number>('document.documentElement.scrollWidth')).toBeLessThanOrEqual(
      390,
    )
    expect(await nav.getByRole('link', { name: 'Lakes', exact: true }).isVisible()).toBe(true)
    expect(await nav.getByRole('link', { name: 'Quarantine' }).isVisible()).toBe(false)

    const more = nav.getByRole('button', { name: 'More' })
    expect(await more.getAttribute('aria-expanded')).toBe('false')
    await more.click()
    expect(await more.getAttribute('aria-expanded')).toBe('true')
    for (const name of [
      'Settings',
      'Users',
      'Stations',
      'Desk lakes',
      'Quarantine',
      'Audit',
      'Mail',
    ])
      expect(await nav.getByRole('link', { name, exact: true }).isVisible()).toBe(true)
    // The menu fits on the screen.
    const box = (await page.locator('#shell-more-menu').boundingBox())!
    expect(box.x).toBeGreaterThanOrEqual(0)
    expect(box.x + box.width).toBeLessThanOrEqual(390)
    await expectAccessible(page, 'Lakes with the menu open')
    await page.screenshot({ path: join(artifactsDir, 'phone-menu.png') })

    // Escape closes it and gives focus back to the button.
    await page.keyboard.press('Escape')
    expect(await more.getAttribute('aria-expanded')).toBe('false')
    expect(
      await page.evaluate<string | undefined>(
        "document.activeElement?.getAttribute('aria-controls')",
      ),
    ).toBe('shell-more-menu')

    await more.click()
    await nav.getByRole('link', { name: 'Stations', exact: true }).click()
    await page.waitForURL(`${base}/admin/stations`)
    expect(await more.getAttribute('aria-expanded')).toBe('false')

    // On a desktop every link is in the bar and there is no "More".
    await page.setViewportSize({ width: 1366, height: 900 })
    expect(await nav.getByRole('link', { name: 'Quarantine' }).isVisible()).toBe(true)
    expect(await more.isVisible()).toBe(false)
    await page.close()
  })

  it('gives the follow switches a 44 px target', async () => {
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await signInAs(page, base, 'angler@chopline.test')
    const follow = page.getByRole('switch', { name: /^Follow / }).first()
    await follow.waitFor()
    const box = (await follow.boundingBox())!
    expect(box.height).toBeGreaterThanOrEqual(44)
    expect(box.width).toBeGreaterThanOrEqual(44)
    await page.close()
  })

  it('says at once that a lake does not exist, asking the server once', async () => {
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'angler@chopline.test')
    let asked = 0
    page.on('request', (r) => void (r.url().includes('/api/lakes/no-such-lake/read') && asked++))
    const started = Date.now()
    await page.goto(`${base}/lakes/no-such-lake`)
    await page.getByText('There is no lake at this address').waitFor({ timeout: 3_000 })
    expect(Date.now() - started).toBeLessThan(3_000)
    expect(asked).toBe(1)
    await page.close()
  })

  it('says at once why a date has no plan, keeping the days that do', async () => {
    const page = await e2e.browser.context.newPage()
    const later = addDays(localDate(new Date(), 'UTC'), 40)
    await page.goto(`${base}/lakes/quillmere/plan/${later}`)
    await page.getByText('No plan for this day').waitFor({ timeout: 3_000 })
    await expect
      .poll(() => page.getByRole('navigation', { name: 'Days' }).getByRole('link').count())
      .toBe(8)
    await page.getByRole('heading', { name: 'Day plan · Quillmere Reservoir' }).waitFor()
    await expectAccessible(page, 'Day plan outside the forecast')
    await page.screenshot({ path: join(artifactsDir, 'day-plan-outside.png'), fullPage: true })
    await page.close()
  })

  it('rings a focused primary button where the keyboard can see it', async () => {
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await page.goto(`${base}/signin`)
    await page.getByLabel('Password').fill('not yet')
    const focused = () =>
      page.evaluate<boolean>("document.activeElement?.textContent?.trim() === 'Sign in'")
    for (let i = 0; i < 3 && !(await focused()); i++) await page.keyboard.press('Tab')
    expect(await focused()).toBe(true)
    const outline = await page.evaluate<{ style: string; width: number }>(`(() => {
      const style = getComputedStyle(document.activeElement)
      return { style: style.outlineStyle, width: parseFloat(style.outlineWidth) }
    })()`)
    expect(outline).toEqual({ style: 'solid', width: 3 })
    await page.close()
  })
})
