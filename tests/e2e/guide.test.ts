import { join } from 'node:path'
import { chromium } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir, CHROMIUM_ARGS, CHROMIUM_PATH } from '../helpers/browser'
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

describe('a guide shares a trip in Chromium', () => {
  it('creates a trip, shares it, the client opens it with no account, and revoking makes it 410', async () => {
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'guide@chopline.test')
    await openFromNav(page, 'Clients')
    await page.getByLabel('Name').fill('Robin Tackle')
    await page.getByLabel('E-mail').fill('robin@client.test')
    await page.getByRole('button', { name: 'Add client' }).click()
    await page.getByText('Added Robin Tackle.').waitFor()
    await expectAccessible(page, 'Clients')

    await openFromNav(page, 'Trips')
    await page.getByText('No trips yet').waitFor()
    // The name and contact clients see on every shared trip.
    await page.getByLabel('Your name, as clients see it').fill('Jory Wend')
    await page.getByLabel('Phone for clients').fill('+1 555 0142')
    await page
      .getByRole('region', { name: 'You, on shared trips' })
      .getByRole('button', { name: 'Save' })
      .click()
    await page.getByText('Saved: your trips show this name and contact.').waitFor()
    await page.locator('.n-base-selection', { hasText: 'Choose a lake' }).click()
    await page.locator('.n-base-select-option', { hasText: 'Quillmere Reservoir' }).click()
    await page.getByLabel('Meeting point').fill('North ramp')
    await page.getByLabel('What to bring').fill('Rain gear, sunglasses')
    await page.getByRole('button', { name: 'Create trip' }).click()
    await page.getByRole('heading', { name: 'Trip on Quillmere Reservoir' }).waitFor()
    await expectAccessible(page, 'Trip')

    await page.getByRole('button', { name: 'Make a link' }).click()
    const link = page.getByLabel('Share link')
    await link.waitFor()
    const shared = new URL(await link.inputValue())
    const clientUrl = `${base}${shared.pathname}`
    await page.getByRole('checkbox', { name: 'Robin Tackle' }).check({ force: true })
    await page.getByRole('button', { name: 'E-mail the link' }).click()
    await page.getByText(/Sent to Robin Tackle \(robin@client\.test\)/).waitFor()
    expect(e2e.mail.smtp.messages()[0]!.to).toEqual(['robin@client.test'])
    await page.screenshot({ path: join(artifactsDir, 'guide-trip-phone.png'), fullPage: true })

    // The client: another browser, no account, no cookies.
    const other = await chromium.launch({
      executablePath: CHROMIUM_PATH,
      args: CHROMIUM_ARGS,
    })
    try {
      const client = await (
        await other.newContext({ viewport: { width: 390, height: 844 } })
      ).newPage()
      await client.goto(clientUrl)
      await client.getByRole('heading', { name: 'Your trip on Quillmere Reservoir' }).waitFor()
      await client.getByText('North ramp').waitFor()
      await client.getByText(/Follow local authorities/).waitFor()
      await client.getByText('Jory Wend · +1 555 0142').waitFor()
      // The link ends on the day chosen (the day after the trip by default), at the lake.
      expect(await client.locator('.link-ends').innerText()).toMatch(
        /^This link works through \w+day, \w+ \d+, to midnight at the lake \(C[DS]T\)\.$/,
      )
      await client.getByText(/The day:/).waitFor()
      expect(await client.content()).not.toContain('guide@chopline.test')
      await expectAccessible(client, 'Shared trip')
      await client.screenshot({ path: join(artifactsDir, 'shared-trip-phone.png'), fullPage: true })
      await client.emulateMedia({ media: 'print' })
      expect(await client.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
      await client.setViewportSize({ width: 816, height: 1056 })
      await client.screenshot({ path: join(artifactsDir, 'shared-trip-print.png'), fullPage: true })
      // Printed, the trip fits one US Letter page.
      const pdf = (await client.pdf({ format: 'Letter' })).toString('latin1')
      expect(pdf.match(/\/Type\s*\/Page[^s]/g)).toHaveLength(1)
      // On paper each fishing window keeps its open tackle call; the folded ones leave no row.
      const printed = await client.evaluate<{ open: boolean; shown: boolean }[]>(`
        [...document.querySelectorAll('.tackle-call')].map((li) => ({
          open: li.querySelector('details').open,
          shown: li.offsetHeight > 0,
        }))`)
      expect(printed.some((call) => call.open)).toBe(true)
      for (const call of printed) expect(call.shown).toBe(call.open)
      await client.emulateMedia({ media: 'screen' })

      await page.getByRole('button', { name: 'Revoke link' }).click()
      await page.getByText('Link revoked: it no longer opens the trip.').waitFor()
      const gone = await client.request.get(
        `${base}/api/shared/trips/${shared.pathname.split('/').pop()}`,
      )
      expect(gone.status()).toBe(410)
      await client.reload()
      await client.getByText('This trip link cannot be opened').waitFor()
      await client.getByText('Your guide has withdrawn this link.').waitFor()
    } finally {
      await other.close()
    }
    await page.close()
  })
})
