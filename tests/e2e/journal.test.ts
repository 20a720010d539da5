import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { and, count, eq } from 'drizzle-orm'
import exifr from 'exifr'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Position } from '../../shared/geo/types'
import { addDays, localDate } from '../../shared/time'
import { SKY_LABELS } from '../../shared/conditions/tackle-rules'
import { TIME_OF_DAY_LABELS } from '../../shared/schemas/journal'
import { catches, catchPhotos, lakes, users } from '../../server/db/schema/index'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { IMPERIAL, METRIC } from '../helpers/units'
import { cameraPhoto } from '../helpers/camera-photo'
import { apiSession, KEPT_URLS, startE2e, type E2e } from '../helpers/e2e'
import { startTestS3, type TestS3 } from '../helpers/s3'

let e2e: E2e
let s3: TestS3
let base: string
let anglerId: string
let shore: Position[]
let timeZone: string

const ANGLER = 'angler@chopline.test'

beforeAll(async () => {
  s3 = await startTestS3()
  e2e = await startE2e(16, { photos: s3.photos })
  base = e2e.base
  const [lake] = await e2e.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  shore = (lake!.shoreline as { coordinates: Position[][] }).coordinates[0]!
  timeZone = lake!.timeZone
  anglerId = (await e2e.db.select().from(users).where(eq(users.email, ANGLER)))[0]!.id
  // A bank of the demo angler's where the photos below are taken.
  const api = await apiSession(base, ANGLER)
  await api('POST', '/api/lakes/quillmere/banks', {
    name: 'Heron shelf',
    points: [shore[20], shore[23]],
    cover: ['wood'],
  })
  await api.into(e2e.browser.context)
})
afterAll(async () => {
  await e2e?.close()
  await s3?.close()
})

const anglersCatches = async () =>
  (await e2e.db.select({ n: count() }).from(catches).where(eq(catches.userId, anglerId)))[0]!.n

/** Waits until the service worker controls the page and has kept who is signed in. */
async function controlled(page: Page) {
  await expect
    // The worker installs (precaches every built file) once per browser profile: on a busy
    // machine that takes a while.
    .poll(() => page.evaluate<boolean>('navigator.serviceWorker.controller !== null'), {
      timeout: 30_000,
    })
    .toBe(true)
  await page.reload()
  await expect
    .poll(() => page.evaluate<string[]>(KEPT_URLS), { timeout: 10_000 })
    .toEqual(expect.arrayContaining([`${base}/api/me`, `${base}/api/me/settings`]))
}

/** The parts of a wall-clock time at the lake, as a camera would write and a form would show. */
function lakeClock(at: Date) {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-US', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .formatToParts(at)
      .map((p) => [p.type, p.value]),
  )
  const { year, month, day, hour, minute } = parts as Record<string, string>
  return { exif: `${year}:${month}:${day} ${hour}:${minute}:00`, hour, minute }
}

/** The journal, as the demo angler (the session was put in the browser's context). */
async function asAngler(page: Page) {
  await page.goto(`${base}/journal`)
  await page.getByRole('heading', { name: 'Catch journal' }).waitFor()
}

async function openLogForm(page: Page) {
  await page.goto(`${base}/journal`)
  await page.getByRole('heading', { name: 'Catch journal' }).waitFor()
  await page.getByRole('button', { name: 'Log a catch' }).click()
}

describe('the catch journal on a phone (390 × 844) in Chromium', () => {
  it('logs a catch from a photo: EXIF time and nearest bank filled, conditions shown, insights up, CSV out, no location stored', async () => {
    const page = await e2e.browser.context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await asAngler(page)

    await page.goto(`${base}/journal/insights`)
    await page.getByRole('heading', { name: 'Insights' }).waitFor()
    const totalLine = page.getByText(/^(\d+) catches\. Groups under|^No catches here yet/)
    await totalLine.waitFor()
    const totalOf = async () =>
      Number((await totalLine.innerText()).match(/^(\d+) catches/)?.[1] ?? 0)
    const before = await totalOf()

    // Taken two hours ago at the lake, on the shore of the angler's bank.
    const takenAt = new Date(Date.now() - 2 * 3_600_000)
    takenAt.setUTCSeconds(0, 0)
    const taken = lakeClock(takenAt)
    const jpeg = await cameraPhoto({ at: taken.exif, gps: shore[21] })
    expect(await exifr.gps(jpeg)).toBeTruthy()

    await openLogForm(page)
    await page.getByLabel('Photo').setInputFiles({
      name: 'IMG_2041.JPG',
      mimeType: 'image/jpeg',
      buffer: jpeg,
    })
    await page
      .getByRole('status')
      .filter({ hasText: 'Photo added; nearest bank: Heron shelf.' })
      .waitFor()
    // The form now holds the camera's time and the bank nearest to where it was taken.
    const form = page.locator('form.catch-form')
    const chosen = form.locator('.n-base-selection-input__content')
    expect(await chosen.allInnerTexts()).toEqual(
      expect.arrayContaining(['Quillmere Reservoir', 'Heron shelf']),
    )
    // "When" holds the camera's moment on the phone's own clock, not the time the form opened.
    const cameraMoment = await page.evaluate<string>(`(() => {
      const d = new Date(${takenAt.getTime()})
      return new Date(d.getTime() - d.getTimezoneOffset() * 60000).toISOString().slice(0, 16)
    })()`)
    expect(await page.getByLabel('When').inputValue()).toBe(cameraMoment)

    await expectAccessible(page, 'Log a catch')
    await page.getByLabel('Length').fill('17.5')
    await page.getByLabel('Lure').fill('spinnerbait')
    await page.getByRole('heading', { name: 'Catch journal' }).click()
    await page.getByRole('button', { name: 'Log catch' }).click()
    await page.getByText('Catch logged.').waitFor()

    const rows = page.getByRole('list', { name: 'Your catches' })
    await rows
      .getByRole('link', { name: /largemouth bass/ })
      .first()
      .click()
    await page.getByRole('heading', { name: 'largemouth bass' }).waitFor()
    const entry = await page.locator('section.catch-entry').innerText()
    expect(entry).toContain('Heron shelf')
    // The lake's wall clock the camera wrote (e.g. "7:30 AM" or "07:30", as the angler's clock says).
    expect(entry).toMatch(
      new RegExp(
        `\\b0?${Number(taken.hour) % 12 || 12}:${taken.minute}\\b|\\b${taken.hour}:${taken.minute}\\b`,
      ),
    )
    // Conditions attached by the server from the stored readings, not typed.
    const conditions = page.locator('dl.catch-conditions')
    await conditions.waitFor()
    await expectAccessible(page, 'Catch entry')
    expect(
      await conditions.locator('dt', { hasText: 'Water' }).locator('+ dd').innerText(),
    ).toMatch(/^\d+(\.\d)? °[FC]$/)
    expect(
      await conditions.locator('dt', { hasText: 'Clarity' }).locator('+ dd').innerText(),
    ).not.toBe('not measured')
    expect(entry).toContain('17.5 in')
    await page.screenshot({
      path: join(artifactsDir, 'journal-entry-imperial-phone.png'),
      fullPage: true,
    })

    // The same entry for a metric reader: 17.5 in is 44 cm (NIST SP 811: 1 in = 2.54 cm), water
    // in °C, wind in km/h, and nothing in the other system's units.
    const settings = await apiSession(base, ANGLER)
    await settings('PUT', '/api/me/settings', METRIC)
    try {
      await page.reload()
      await conditions.waitFor()
      const metricEntry = await page.locator('section.catch-entry').innerText()
      expect(metricEntry).toContain('44 cm')
      expect(
        await conditions.locator('dt', { hasText: 'Water' }).locator('+ dd').innerText(),
      ).toMatch(/^\d+(\.\d)? °C$/)
      expect(metricEntry).not.toMatch(/°F|mph|inHg|\d in\b/)
      await page.screenshot({
        path: join(artifactsDir, 'journal-entry-metric-phone.png'),
        fullPage: true,
      })
    } finally {
      await settings('PUT', '/api/me/settings', IMPERIAL)
    }

    await page.goto(`${base}/journal/insights`)
    await totalLine.waitFor()
    await expect.poll(totalOf).toBe(before + 1)
    // Each group is named in words, as the Day plan names its windows and skies.
    for (const [title, words] of [
      ['Time of day', Object.values(TIME_OF_DAY_LABELS)],
      ['Sky', Object.values(SKY_LABELS)],
    ] as const) {
      const groups = await page
        .locator('figure.insight', { has: page.locator('figcaption', { hasText: title }) })
        .locator('tbody th')
        .allInnerTexts()
      expect(groups.length, title).toBeGreaterThan(0)
      for (const label of groups) expect(words, title).toContain(label)
    }

    await page.goto(`${base}/journal`)
    const download = page.waitForEvent('download')
    await page.getByRole('link', { name: 'Export CSV' }).click()
    const csv = readFileSync((await (await download).path())!, 'utf8')
    const [header, ...lines] = csv
      .replace(/^\uFEFF/, '')
      .trim()
      .split(/\r\n/)
    expect(header!.split(',').slice(0, 3)).toEqual(['caught_at', 'lake', 'species'])
    const row = lines.find((l) => l.includes('Heron shelf'))
    expect(row).toBeDefined()
    expect(row).toContain(',quillmere,largemouth,')
    expect(row).toContain(',spinnerbait,')

    // Every stored copy of the photo, read straight from the object store, carries no location.
    const [photo] = await e2e.db.select().from(catchPhotos).where(eq(catchPhotos.userId, anglerId))
    expect(photo?.catchId).toBeTruthy()
    for (const key of [photo!.displayKey, photo!.thumbKey])
      expect(await exifr.gps(await s3.photos.get(key))).toBeUndefined()
    await page.close()
  })

  it('keeps a catch logged offline on the phone through a reload, and sends it once when back online', async () => {
    const { context } = e2e.browser
    const page = await context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await asAngler(page)
    await controlled(page)
    const before = await anglersCatches()

    await openLogForm(page)
    await page.locator('form.catch-form .n-select').first().click()
    await page.locator('.n-base-select-option', { hasText: 'Quillmere Reservoir' }).click()
    await page.getByLabel('Length').fill('14')
    await page.getByLabel('Lure').fill('jig')
    await page.getByLabel('Note').fill('Logged at the ramp with no signal')

    // The signal drops before the catch is sent: the form says where it goes.
    await e2e.offline(context)
    await page
      .getByText("Saved on this phone; will send when you're back online.")
      .first()
      .waitFor()
    await page.getByRole('button', { name: 'Log catch' }).click()
    const waiting = page.getByRole('list', { name: 'Waiting to send' })
    await waiting.getByText('Waiting to send').waitFor()
    expect(await waiting.getByText(/jig/).isVisible()).toBe(true)
    await expectAccessible(page, 'Journal, offline')

    // A reload with no network: the catch is still on the phone, still waiting.
    await page.reload()
    await page.getByRole('heading', { name: 'Catch journal' }).waitFor()
    await waiting.getByText('Waiting to send').waitFor()
    expect(await anglersCatches()).toBe(before)

    // The network returns: it is sent, once, and listed as logged.
    await e2e.online(context)
    await waiting.waitFor({ state: 'detached' })
    await expect.poll(anglersCatches).toBe(before + 1)
    const sent = await e2e.db
      .select()
      .from(catches)
      .where(
        and(eq(catches.userId, anglerId), eq(catches.note, 'Logged at the ramp with no signal')),
      )
    expect(sent).toHaveLength(1)
    expect(sent[0]!.clientId).toBeTruthy()
    await page.reload()
    await page.getByRole('list', { name: 'Your catches' }).getByText(/jig/).waitFor()
    expect(await page.getByRole('list', { name: 'Waiting to send' }).count()).toBe(0)
    expect(await anglersCatches()).toBe(before + 1)
    await page.close()
  })

  it("lets a guide log a catch from the trip page, and the trip's clients see it on theirs", async () => {
    const guide = await apiSession(base, 'guide@chopline.test')
    const bank = await guide<{ id: string }>('POST', '/api/lakes/quillmere/banks', {
      name: 'Guide cove',
      points: [shore[40], shore[43]],
      cover: ['rock'],
    })
    const trip = await guide<{ id: string }>('POST', '/api/guide/trips', {
      lakeSlug: 'quillmere',
      date: localDate(new Date(), timeZone),
      meetingPoint: 'South ramp',
      meetingTime: '06:00',
      bankIds: [bank.id],
    })
    const shares = await guide<{ items: { url: string }[] }>(
      'POST',
      `/api/guide/trips/${trip.id}/shares`,
      { expiresOn: addDays(localDate(new Date(), timeZone), 7) },
    )
    const clientUrl = `${base}${new URL(shares.items[0]!.url).pathname}`
    await guide.into(e2e.browser.context)

    const page = await e2e.browser.context.newPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await page.goto(`${base}/guide/trips/${trip.id}`)
    await page.getByRole('heading', { name: 'Trip on Quillmere Reservoir' }).waitFor()
    await page.getByText('No catches on this trip yet.').waitFor()
    await page.getByRole('button', { name: 'Log a catch on this trip' }).click()
    // The trip's lake, fixed.
    const form = page.locator('form.catch-form')
    expect(await form.locator('.n-base-selection-input__content').first().innerText()).toBe(
      'Quillmere Reservoir',
    )
    await page.getByLabel('Length').fill('19')
    await page.getByLabel('Lure').fill('crankbait')
    await page.getByLabel('Note').fill('Client landed it off the cove')
    await page.getByRole('heading', { name: 'Catches on this trip' }).click()
    await page.getByRole('button', { name: 'Log catch' }).click()
    await page.getByText('Catch logged.').waitFor()
    const listed = page.getByRole('list', { name: 'Catches on this trip' })
    await listed.getByText(/crankbait/).waitFor()
    await expectAccessible(page, 'Trip with its catches')

    const [logged] = await e2e.db
      .select()
      .from(catches)
      .where(eq(catches.note, 'Client landed it off the cove'))
    expect(logged?.tripId).toBe(trip.id)

    // The client's page, opened from the share link: the fish is there.
    await page.goto(clientUrl)
    await page.getByRole('heading', { name: 'Your trip on Quillmere Reservoir' }).waitFor()
    const theirs = page.getByRole('list', { name: 'Fish caught on this trip' })
    await theirs.getByText(/crankbait/).waitFor()
    expect(await theirs.innerText()).toMatch(/largemouth bass/)
    await expectAccessible(page, 'Shared trip with its catches')
    await page.close()
  })
})
