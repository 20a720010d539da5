import { join } from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, it } from 'vitest'
import { datastreams, lakes, quarantine, stations } from '../../server/db/schema/index'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { startE2e, type E2e } from '../helpers/e2e'
import { openFromNav } from '../helpers/nav'
import { signInAs } from '../helpers/signin'

let e2e: E2e
let base: string

beforeAll(async () => {
  e2e = await startE2e(3)
  base = e2e.base
})
afterAll(() => e2e?.close())

describe('the gauge desk in Chromium', () => {
  it('lets an admin release a quarantined reading and find the decision in the audit log', async () => {
    // A station the demo history reached, so its water-temperature unit is known.
    const [stream] = await e2e.db
      .select()
      .from(datastreams)
      .where(eq(datastreams.parameter, 'water_temp'))
    const observed = new Date(Date.now() - 86_400_000)
    await e2e.db.insert(quarantine).values({
      stationId: stream!.stationId,
      parameter: 'water_temp',
      feedId: 'e2e-1',
      observedAt: observed,
      raw: { result: 21.5, phenomenonTime: observed.toISOString() },
      reason: 'rate_of_change',
      detail: 'rose 6 °C in 15 minutes',
    })

    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'admin@chopline.test')
    await openFromNav(page, 'Quarantine')
    await page.getByText('rose 6 °C in 15 minutes').waitFor()
    await page.getByText('Changed too fast').waitFor()
    await expectAccessible(page, 'Quarantine')
    // The button is named for the reading it releases, in words, not for a row number.
    await page.getByRole('button', { name: /^Release Water temperature of .+ at / }).click()
    await page.getByText('Released: stored as a reading.').waitFor()
    await page.getByText('Nothing here: no held readings match.').waitFor()

    await openFromNav(page, 'Audit')
    await page.getByRole('cell', { name: 'Released a held reading' }).waitFor()
    await expectAccessible(page, 'Audit log')
    await page.setViewportSize({ width: 1366, height: 900 })
    await page.screenshot({ path: join(artifactsDir, 'admin-audit-desktop.png'), fullPage: true })
    await page.close()
  })

  it('lets an admin upload a lake outline, see it drawn before it replaces the old one, and refuses a broken one', async () => {
    const [lake] = await e2e.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'admin@chopline.test')
    await openFromNav(page, 'Desk lakes')
    await page.locator('.n-base-selection', { hasText: 'Choose a lake to edit' }).click()
    await page.locator('.n-base-select-option', { hasText: 'Quillmere Reservoir' }).click()
    await page.getByRole('heading', { name: 'Edit Quillmere Reservoir' }).waitFor()

    const input = page.locator('input[type=file]')
    await input.setInputFiles({
      name: 'broken.geojson',
      mimeType: 'application/geo+json',
      buffer: Buffer.from('{"type": "Polygon", "coordinates": [[[0, 0], [1, 1]'),
    })
    await page.getByText('This outline cannot be used').waitFor()
    await page.getByText('The file is not JSON.').waitFor()

    await input.setInputFiles({
      name: 'quillmere.geojson',
      mimeType: 'application/geo+json',
      buffer: Buffer.from(
        JSON.stringify({ type: 'Feature', properties: {}, geometry: lake!.shoreline }),
      ),
    })
    await page.getByRole('img', { name: 'Preview of the uploaded outline' }).waitFor()
    await page.getByText(/km² of water, \d+ vertices/).waitFor()
    await expectAccessible(page, 'Desk lakes with a preview')
    await page.screenshot({
      path: join(artifactsDir, 'desk-outline-preview-phone.png'),
      fullPage: true,
    })
    await page.getByRole('button', { name: 'Replace the outline' }).click()
    await page.getByText('Outline replaced and banks recomputed.').waitFor()
    await page.close()
  })

  it('lists stations with their health and adds one', async () => {
    await e2e.browser.context.clearCookies()
    const page = await e2e.browser.context.newPage()
    await signInAs(page, base, 'admin@chopline.test')
    await openFromNav(page, 'Stations')
    await page
      .getByRole('list', { name: 'Stations' })
      .getByText(/Last good reading/)
      .first()
      .waitFor()
    await expectAccessible(page, 'Stations')
    const form = page.getByRole('region', { name: 'Add a station' })
    await form.getByLabel('Station name').fill('Spillway gauge')
    await form.locator('.n-base-selection', { hasText: 'Choose a lake' }).click()
    await page.locator('.n-base-select-option', { hasText: 'Quillmere Reservoir' }).click()
    await form.getByLabel('Feed identifier').fill('spill-1')
    await form.getByRole('button', { name: 'Add station' }).click()
    await page.getByText('Added Spillway gauge.').waitFor()
    await page.getByRole('button', { name: 'Edit Spillway gauge' }).waitFor()

    // History from a CSV for a station the demo reads: checked row by row, then imported.
    const [stream] = await e2e.db
      .select()
      .from(datastreams)
      .where(eq(datastreams.parameter, 'water_temp'))
    const name = (
      await e2e.db.select().from(stations).where(eq(stations.id, stream!.stationId))
    )[0]!.name
    await page.getByText(`Import readings for ${name} (CSV)`).click()
    await page.getByLabel(`Readings file for ${name}`).setInputFiles({
      name: 'history.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(
        'parameter,observed_at,value,unit\nwater_temp,2026-01-05T12:00:00Z,6.5,°C\nwater_temp,2026-01-05T12:15:00Z,60,°C\n',
      ),
    })
    await page.getByText('Ready: 1 to store, 1 for quarantine, 0 unusable.').waitFor()
    await expectAccessible(page, 'Readings import preview')
    await page.getByRole('button', { name: 'Import 2 rows' }).click()
    await page.getByText('Imported: 1 to store, 1 for quarantine, 0 unusable.').waitFor()
    await page.close()
  })
})
