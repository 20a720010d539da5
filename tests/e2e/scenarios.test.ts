import { join } from 'node:path'
import { pino } from 'pino'
import type { Locator, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { runSendBriefs } from '../../jobs/send-briefs'
import { briefSends } from '../../server/db/schema/index'
import { SCENARIOS, scenarioClock, type ScenarioName } from '../../server/fakes/feed/scenarios'
import type { WindowId } from '../../shared/conditions/day-plan'
import { VERDICT_LABELS, VERDICT_SHAPES, type Verdict } from '../../shared/conditions/safety'
import { DEFAULT_SETTINGS, makeFormat, type Format } from '../../shared/format'
import type { DayPlanResponse } from '../../shared/schemas/day-plan'
import type { ShareView, SharedTrip } from '../../shared/schemas/guides'
import type { LakeRead } from '../../shared/schemas/lake-read'
import type { Settings } from '../../shared/schemas/settings'
import { METRIC } from '../helpers/units'
import { TEST_SECRET } from '../helpers/app'
import { expectAccessible } from '../helpers/axe'
import { artifactsDir } from '../helpers/browser'
import { apiSession, startE2eScenario, type E2eBank, type E2eScenario } from '../helpers/e2e'

/**
 * The named scenario days as people read them: the Lake read, the Day plan and the shared trip
 * page in Chromium, and the morning brief as it was mailed. Each day is read twice, once in each
 * unit system, one on a phone and one on a desktop, the pairing alternating from day to day, so
 * both unit systems are read at both sizes without reading every day four times
 * (`E2E_ALL_PASSES=1` reads each day in all four). What the pages say is compared with what the
 * API answers, worded by `makeFormat(settings)` as the screens word it.
 */

const SIZES = { phone: { width: 390, height: 844 }, desktop: { width: 1366, height: 900 } }

/** Three banks round the lake: the blow's lee shore, its windward point, and a side shore. */
const BANKS: E2eBank[] = [
  { name: 'Lee laydowns', bearingDeg: 200, cover: ['wood'] },
  { name: 'Windward rocks', bearingDeg: 20, cover: ['rock', 'sparse-grass'] },
  { name: 'East grass flat', bearingDeg: 110, cover: ['sparse-grass'] },
]

/** What each day must say, besides matching the API (from tests/server/scenario-reads.test.ts). */
const DAYS: { name: ScenarioName; day: Verdict; noGo: WindowId[] }[] = [
  { name: 'blow', day: 'no-go', noGo: ['midday', 'afternoon'] },
  { name: 'storm-afternoon', day: 'no-go', noGo: ['midday', 'afternoon'] },
  { name: 'calm-sunny-prespawn', day: 'caution', noGo: [] },
  { name: 'heat-wave', day: 'no-go', noGo: ['midday', 'afternoon'] },
  { name: 'cold-front', day: 'caution', noGo: [] },
  { name: 'rain-event', day: 'go', noGo: [] },
  { name: 'early-winter-warm-spell', day: 'go', noGo: [] },
]

const times = (text: string, part: string) => text.split(part).length - 1

/** Each caution's message once in `text`, and the list holds one line per caution. */
async function expectCautionsOnce(
  band: Locator,
  cautions: Parameters<Format['caution']>[0][],
  f: Format,
  what: string,
) {
  const text = await band.innerText()
  for (const c of cautions) {
    const message = f.caution(c).message
    expect(times(text, message), `${what}: ${message}`).toBe(1)
  }
  expect(await band.locator('li').count(), `${what}: one line per caution`).toBe(cautions.length)
}

type PlanWindow = NonNullable<DayPlanResponse['plan']>['windows'][number]

/**
 * One window of a plan as drawn: its verdict, its cautions (where the page shows them per
 * window), the banks in the API's order or not to launch, and the tackle calls.
 */
async function expectWindow(
  page: Page,
  w: PlanWindow,
  f: Format,
  what: string,
  withCautions: boolean,
) {
  const section = page.locator('section.plan-window', { has: page.locator(`#window-${w.id}`) })
  const verdict = f.verdict(w.cautions)
  const badge = section.locator('.verdict')
  expect(await badge.getAttribute('class'), `${what} ${w.id}`).toContain(
    `verdict-${verdict.verdict}`,
  )
  const badgeText = await badge.innerText()
  expect(badgeText).toContain(VERDICT_LABELS[verdict.verdict])
  for (const reason of verdict.reasons) expect(badgeText).toContain(reason)
  if (withCautions) {
    const cautions = w.cautions.filter((c) => c.kind !== 'authority')
    if (cautions.length)
      await expectCautionsOnce(
        section.getByRole('region', { name: /^Cautions, / }),
        cautions,
        f,
        `${what} ${w.id}`,
      )
  }
  const text = await section.innerText()
  // A passed front is said in the window, its pressures in the reader's units.
  if (w.weather?.coldFront)
    expect(text).toContain(`After a cold front: ${f.prose(w.weather.coldFront)}`)
  else expect(text).not.toContain('After a cold front')
  const banks = await section.locator('.ranked-bank strong').allInnerTexts()
  const calls = await section.locator('.tackle-call summary').allInnerTexts()
  if (verdict.verdict === 'no-go') {
    expect(w.banks, `${what} ${w.id}: the API ranks no banks`).toEqual([])
    expect(text).toContain('Do not launch in this window')
    expect(banks).toEqual([])
    expect(calls).toEqual([])
  } else {
    expect(text).not.toContain('Do not launch in this window')
    expect(banks, `${what} ${w.id}: banks in order`).toEqual(w.banks.map((b) => b.name))
    // The page capitalises the family's name.
    expect(
      calls.map((c) => c.toLowerCase()),
      `${what} ${w.id}: tackle calls`,
    ).toEqual(w.tackle.map((c) => c.family.toLowerCase()))
  }
  return verdict.verdict
}

type Pass = { units: 'imperial' | 'metric'; settings: Settings; size: keyof typeof SIZES }
const IMPERIAL_PHONE: Pass = { units: 'imperial', settings: DEFAULT_SETTINGS, size: 'phone' }
const METRIC_DESKTOP: Pass = { units: 'metric', settings: METRIC, size: 'desktop' }
const METRIC_PHONE: Pass = { units: 'metric', settings: METRIC, size: 'phone' }
const IMPERIAL_DESKTOP: Pass = { units: 'imperial', settings: DEFAULT_SETTINGS, size: 'desktop' }
/** Day by day, imperial on a phone and metric on a desktop, then the other way round. */
const passesOf = (i: number): Pass[] =>
  process.env.E2E_ALL_PASSES
    ? [IMPERIAL_PHONE, METRIC_PHONE, IMPERIAL_DESKTOP, METRIC_DESKTOP]
    : i % 2
      ? [METRIC_PHONE, IMPERIAL_DESKTOP]
      : [IMPERIAL_PHONE, METRIC_DESKTOP]

describe.each(DAYS.map((d, i) => ({ ...d, passes: passesOf(i) })))(
  'the $name day, as read',
  ({ name, day, noGo, passes }) => {
    const scenario = SCENARIOS[name]
    let e2e: E2e
    let page: Page
    let tripPath: string
    type E2e = E2eScenario

    beforeAll(async () => {
      e2e = await startE2eScenario(name, BANKS)
      // The guide's trip on the day with their three banks, shared by link through the API.
      const guide = await apiSession(e2e.base, 'guide@chopline.test')
      const trip = await guide<{ id: string }>('POST', '/api/guide/trips', {
        lakeSlug: scenario.lake,
        date: scenario.day,
        meetingPoint: 'North ramp',
        meetingTime: '06:30',
        bankIds: e2e.bankIds['guide@chopline.test'],
        tackle: '',
        notes: '',
      })
      const shares = await guide<{ items: ShareView[] }>(
        'POST',
        `/api/guide/trips/${trip.id}/shares`,
        { expiresOn: scenario.day },
      )
      tripPath = new URL(shares.items[0]!.url).pathname
      await (await apiSession(e2e.base, 'angler@chopline.test')).into(e2e.browser.context)
      page = await e2e.browser.context.newPage()
    }, 60_000)
    afterAll(async () => {
      await e2e?.close()
    })

    for (const { units, settings, size } of passes) {
      const f = makeFormat(settings)
      const shot = (what: string) =>
        page.screenshot({
          path: join(artifactsDir, `scenario-${name}-${what}-${units}-${size}.png`),
          fullPage: true,
        })

      it(`the Lake read, Day plan and shared trip in ${units} units on a ${size}`, async () => {
        // The pass before may have left the other units.
        const angler = await apiSession(e2e.base, 'angler@chopline.test')
        await angler('PUT', '/api/me/settings', settings)
        await page.setViewportSize(SIZES[size])
        const api = async <T>(path: string) =>
          (await (await page.request.get(`${e2e.base}${path}`)).json()) as T

        // The Lake read: the next 12 hours' verdict and cautions.
        await page.goto(`${e2e.base}/lakes/${scenario.lake}`)
        await page.getByRole('heading', { level: 1 }).waitFor()
        const read = await api<LakeRead>(`/api/lakes/${scenario.lake}/read`)
        const readVerdict = f.verdict(read.cautions)
        const badge = page.locator('.verdict', { hasText: 'Next 12 hours' })
        expect(await badge.getAttribute('class')).toContain(`verdict-${readVerdict.verdict}`)
        expect(await badge.innerText()).toContain(VERDICT_LABELS[readVerdict.verdict])
        await expectCautionsOnce(
          page.getByRole('region', { name: 'Safety cautions, next 12 hours' }),
          read.cautions,
          f,
          'Lake read',
        )
        if (name === 'blow') expect(readVerdict.verdict).toBe('no-go')
        await expectAccessible(page, `${name} Lake read`)
        await shot('lake-read')

        // The Day plan: each window's verdict, cautions, banks and calls.
        await page.goto(`${e2e.base}/lakes/${scenario.lake}/plan/${scenario.day}`)
        await page.getByRole('heading', { name: /^Day plan · / }).waitFor()
        const answer = await api<DayPlanResponse>(
          `/api/lakes/${scenario.lake}/plan/${scenario.day}`,
        )
        const plan = answer.plan!
        await page
          .locator('section.plan-window')
          .nth(plan.windows.length - 1)
          .waitFor()
        const dayBadge = page.locator('.verdict', { hasText: 'The day' })
        expect(await dayBadge.getAttribute('class')).toContain(`verdict-${day}`)
        expect(f.verdict(plan.cautions).verdict).toBe(day)
        const verdicts: Partial<Record<WindowId, Verdict>> = {}
        for (const w of plan.windows.filter((x) => x.weather))
          verdicts[w.id] = await expectWindow(page, w, f, 'Day plan', true)
        expect(
          Object.entries(verdicts)
            .filter(([, v]) => v === 'no-go')
            .map(([id]) => id),
        ).toEqual(noGo)
        await expect
          .poll(() => page.getByRole('region', { name: 'About these cautions' }).innerText())
          .toMatch(/boating law/)
        await expectAccessible(page, `${name} Day plan`)
        await shot('day-plan')

        // The shared trip: the day's cautions once each, naming their windows; the windows below.
        await page.goto(`${e2e.base}${tripPath}`)
        await page.getByRole('heading', { name: /^Your trip on / }).waitFor()
        const trip = await api<SharedTrip>(`/api${tripPath.replace('/trip/', '/shared/trips/')}`)
        const tripBadge = page.locator('.trip-plan > .verdict')
        expect(await tripBadge.getAttribute('class')).toContain(`verdict-${day}`)
        await expectCautionsOnce(
          page.getByRole('region', { name: 'Cautions for the day' }),
          trip.cautions,
          f,
          'Shared trip',
        )
        const tripText = await page.locator('.caution-band').innerText()
        for (const c of trip.cautions.filter((x) => x.when)) expect(tripText).toContain(c.when)
        for (const w of trip.plan!.windows.filter((x) => x.weather))
          await expectWindow(page, w, f, 'Shared trip', false)
        await expectAccessible(page, `${name} shared trip`)
        await shot('shared-trip')
      })

      it(`the morning brief in ${units} units, text and HTML`, async () => {
        // The brief of the day, as the job sends it a little after 05:00 at the lake.
        await e2e.db.delete(briefSends)
        e2e.mail.smtp.clear()
        const at = new Date(scenarioClock(scenario).getTime() + 10 * 60_000)
        await runSendBriefs({
          db: e2e.db,
          log: pino({ level: 'silent' }),
          mail: e2e.mail.mail,
          sessionSecret: TEST_SECRET,
          now: () => at,
        })
        const brief = e2e.mail.smtp.messages().find((m) => m.to.includes('angler@chopline.test'))
        expect(brief, 'the demo angler’s brief').toBeDefined()
        const plan = (
          (await (
            await page.request.get(`${e2e.base}/api/lakes/${scenario.lake}/plan/${scenario.day}`)
          ).json()) as DayPlanResponse
        ).plan!

        const mail = await e2e.browser.context.newPage()
        await mail.setViewportSize(SIZES[size])
        await mail.setContent(brief!.html!)
        // Figures keep their units with a no-break space (server/features/mail/render.ts).
        const html = (await mail.locator('body').innerText()).replaceAll('\u00a0', ' ')
        for (const [part, text] of [
          ['text', brief!.text],
          ['HTML', html],
        ] as const) {
          const dayVerdict = f.verdict(plan.cautions).verdict
          expect(text, `${part}: the day`).toContain(VERDICT_LABELS[dayVerdict])
          for (const c of plan.cautions.filter((x) => x.kind !== 'authority')) {
            const message = f.caution(c).message
            expect(times(text, message), `${part}: ${message}`).toBe(1)
          }
          for (const w of plan.windows.filter((x) => x.weather)) {
            expect(text, `${part}: ${w.label}`).toContain(w.label)
          }
          expect(times(text, 'Do not launch in this window'), `${part}: no-go windows`).toBe(
            noGo.length,
          )
          if (part === 'text')
            for (const w of plan.windows.filter((x) => x.weather)) {
              const v = f.verdict(w.cautions).verdict
              expect(text).toContain(`${w.label} (`)
              expect(text).toContain(`${VERDICT_SHAPES[v]} ${VERDICT_LABELS[v]}`)
            }
        }
        // The units of the reader, not the other system's.
        const other = settings === DEFAULT_SETTINGS ? /km\/h|°C/ : /mph|°F/
        expect(brief!.text).not.toMatch(other)
        await mail.screenshot({
          path: join(artifactsDir, `scenario-${name}-brief-email-${units}-${size}.png`),
          fullPage: true,
        })
        await mail.close()
      })
    }
  },
)
