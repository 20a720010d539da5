import { eq } from 'drizzle-orm'
import { beforeAll, describe, expect, it } from 'vitest'
import { users } from '../../server/db/schema/index'
import { DEMO_USERS } from '../../server/db/seed/index'
import { SCENARIOS } from '../../server/fakes/feed/scenarios'
import { briefSendsRepo } from '../../server/features/brief/brief-sends.repo'
import type { RenderedMail } from '../../server/features/mail/render'
import { lakeDay, type ForecastHour } from '../../shared/conditions/day-plan'
import { exposureTable } from '../../shared/conditions/exposure'
import type { Bank } from '../../shared/conditions/ranking'
import type { Polygon, Position } from '../../shared/geo/types'
import type { BriefUnits } from '../../shared/schemas/brief'
import { composeBrief, renderBrief, type BriefLake } from '../../server/features/brief/compose'
import { METRIC } from '../helpers/units'
import { sampleRead } from '../helpers/lake-read-fixture'
import { describeScenario } from '../helpers/scenario'
import { box, densified } from '../shared/geo/fixtures'

// Invented data: a 9 km × 5.5 km box lake in the demo's part of the world.
const shoreline: Polygon = { type: 'Polygon', coordinates: [densified(box(-88.1, 35, 0.1, 0.05))] }
const date = '2026-04-10'
const timeZone = 'America/Chicago'

/** A west wind all day, 6 m/s (about 13 mph) gusting 9: it blows onto the east shore. */
const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
  at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
  windFromDeg: 270,
  windMs: 6,
  gustMs: 9,
  airC: 18,
  relativeHumidityPct: 60,
  cloudCoverPct: 40,
  thunderstormProbabilityPct: 0,
}))
const day = lakeDay({
  lake: shoreline,
  date,
  timeZone,
  hourly: hours,
  waterC: 12.5,
  secchiM: 0.5,
  phase: 'pre-spawn',
})

function bank(id: string, name: string, points: Position[], cover: Bank['cover']): Bank {
  return { id, name, points, cover, depthM: 3, exposure: exposureTable(shoreline, points) }
}
const banks = [
  bank(
    'e',
    'East <rock> point',
    [
      [-88.0, 35.02],
      [-88.0, 35.03],
    ],
    ['rock', 'sparse-grass'],
  ),
  bank(
    'w',
    'West laydowns',
    [
      [-88.1, 35.02],
      [-88.1, 35.03],
    ],
    ['wood'],
  ),
  bank(
    'n',
    'North docks',
    [
      [-88.057, 35.05],
      [-88.043, 35.05],
    ],
    ['docks'],
  ),
  bank(
    's',
    'South flat',
    [
      [-88.057, 35.0],
      [-88.043, 35.0],
    ],
    ['sparse-grass'],
  ),
]

const read = sampleRead({
  id: '00000000-0000-4000-8000-000000000001',
  slug: 'boxwater',
  name: 'Boxwater Reservoir',
  region: 'Invented County',
  timeZone,
  normalPoolM: 100,
  areaKm2: 50,
  center: [-88.05, 35.025],
})

const US: BriefUnits = { temperature: 'F', length: 'ft', speed: 'mph', clock: '12h' }
const lake = (over: Partial<BriefLake> = {}): BriefLake => ({
  slug: 'boxwater',
  name: 'Boxwater Reservoir',
  timeZone,
  read,
  day,
  banks,
  ...over,
})
const compose = (lakes: BriefLake[], units = US) =>
  composeBrief({
    date,
    units,
    lakes,
    origin: 'https://chopline.example',
    unsubscribeUrl: 'https://chopline.example/unsubscribe?token=t0ken',
  })

describe('composeBrief and renderBrief', () => {
  const view = compose([lake()])
  const mail = renderBrief(view)

  it('renders the same text and HTML for the same cached day (snapshot)', () => {
    expect(mail.subject).toBe('Morning brief, Fri, Apr 10: Boxwater Reservoir')
    expect(mail.text).toMatchSnapshot()
    expect(mail.html).toMatchSnapshot()
  })

  it('keeps each number with its unit in the HTML, so a narrow mail reader never breaks "55 / °F"', () => {
    expect(mail.html).toContain('Water 55&nbsp;°F')
    expect(mail.html).not.toMatch(/\d (°F|mph|ft)(?!\w)/)
    // The plain-text part is left as it is.
    expect(mail.text).toContain('Water 55 °F')
  })

  it('gives the one-line read in the subscriber units: 12.5 °C is 54.5 °F (NIST SP 811), 0.5 m is 1.6 ft', () => {
    expect(view.lakes[0]!.read).toBe(
      'Water 55 °F, warming 0.9 °F/day · Stained (1.6 ft visibility), clearing · pre-spawn phase (5-day mean 54 °F)',
    )
    const metric = compose([lake()], METRIC)
    expect(metric.lakes[0]!.read).toMatch(
      /^Water 12\.5 °C, warming 0\.5 °C\/day · Stained \(0\.5 m/,
    )
    // 6 m/s is 21.6 km/h and 13.4 mph (NIST SP 811).
    expect(metric.lakes[0]!.windows[0]!.wind).toBe('22 km/h from W, gusts 32 km/h')
    expect(view.lakes[0]!.windows[0]!.wind).toBe('13 mph from W, gusts 20 mph')
  })

  it('names the top three banks, windward first in a breeze, each with a reason (common practice)', () => {
    const [dawn, midday, afternoon] = view.lakes[0]!.windows
    expect(dawn!.banks).toHaveLength(3)
    expect(dawn!.banks[0]).toMatchObject({ name: 'East <rock> point', exposure: 'windward' })
    for (const b of dawn!.banks) expect(b.reason.length).toBeGreaterThan(10)
    expect(mail.text).toContain('1. East <rock> point (windward): ')
    // A steady wind picks the same all day: later windows say so instead of repeating.
    for (const w of [midday!, afternoon!])
      expect(w).toMatchObject({ banks: [], tackle: null, sameAs: 'dawn to mid-morning' })
  })

  it('ranks again in each window as the wind shifts', () => {
    const turning = lakeDay({
      lake: shoreline,
      date,
      timeZone,
      // West wind until 17:00 UTC (noon local), east wind after.
      hourly: hours.map((h) => ({
        ...h,
        windFromDeg: Date.parse(h.at) < Date.UTC(2026, 3, 10, 17) ? 270 : 90,
      })),
      waterC: 12.5,
      secchiM: 0.5,
      phase: 'pre-spawn',
    })
    const [dawn, midday, afternoon] = compose([lake({ day: turning })]).lakes[0]!.windows
    expect(dawn!.banks[0]!.name).toBe('East <rock> point')
    // Midday is mostly east wind, so the west bank takes it; the afternoon repeats midday.
    expect(midday!.banks[0]).toMatchObject({ name: 'West laydowns', exposure: 'windward' })
    expect(midday!.sameAs).toBeNull()
    expect(afternoon!.sameAs).toBe('midday')
  })

  it('escapes names in HTML, never in the plain-text part', () => {
    expect(mail.html).toContain('East &lt;rock&gt; point')
    expect(mail.html).not.toContain('East <rock> point')
  })

  it('gives the tackle call with its why: stained water in a breeze calls a blade bait (common practice)', () => {
    const tackle = view.lakes[0]!.windows[0]!.tackle!
    expect(tackle.call).toMatch(/^Spinnerbait\. Blades: colorado/)
    expect(tackle.why.length).toBeGreaterThan(20)
    expect(mail.text).toContain(`Tie on: ${tackle.call}`)
    // The rule of thumb's 2 ft is 0.6 m for a metric reader (NIST SP 811).
    expect(tackle.why).toContain('About 2 ft of visibility or less')
    const metric = compose([lake()], METRIC)
    expect(metric.lakes[0]!.windows[0]!.tackle!.why).toContain('About 0.6 m of visibility or less')
    expect(renderBrief(metric).text).not.toMatch(/\d ft\b|°F|mph/)
  })

  it('suggests where to start on a lake with no saved banks: the shore the wind blows onto (common practice)', () => {
    const [section] = compose([lake({ banks: [] })]).lakes
    expect(section!.windows[0]!.banks).toEqual([])
    expect(section!.windows[0]!.suggestion).toBe(
      'Wind from W: start on windblown points and banks of the E shore, rock and sparse grass first.',
    )
  })

  it('says why when a lake has no plan, and covers every followed lake in one brief', () => {
    const view2 = compose([
      lake(),
      lake({ slug: 'nowhere', name: 'Nowhere Pond', day: null, read: null }),
    ])
    expect(view2.subject).toBe('Morning brief, Fri, Apr 10: Boxwater Reservoir and Nowhere Pond')
    expect(view2.lakes[1]).toMatchObject({
      read: 'No readings from this lake yet.',
      unavailable: expect.stringMatching(/No plan for today yet/),
      windows: [],
    })
    expect(renderBrief(view2).text).toContain(
      'https://chopline.example/lakes/nowhere/plan/2026-04-10',
    )
  })

  it('states the cautions and always defers to local authorities and boating law', () => {
    const gale = lakeDay({
      lake: shoreline,
      date,
      timeZone,
      hourly: hours.map((h) => ({ ...h, windMs: 12, gustMs: 18, thunderstormProbabilityPct: 60 })),
      waterC: 12.5,
      secchiM: 0.5,
      phase: 'pre-spawn',
    })
    const stormy = compose([lake({ day: gale })])
    const levels = stormy.lakes[0]!.cautions.map((c) => c.level)
    expect(levels[0]).toMatch(/^(Danger|Warning)$/)
    expect(stormy.lakes[0]!.cautions.some((c) => /lightning|thunder/i.test(c.message))).toBe(true)
    expect(renderBrief(stormy).text).toContain('boating law')
  })

  it('reads in a narrow mail client without images: one 600 px column, styles inline', () => {
    expect(mail.html).toContain('max-width:600px')
    expect(mail.html).not.toMatch(/<img|<link|<script|background-image/i)
    expect(mail.html).toContain('href="https://chopline.example/lakes/boxwater/plan/2026-04-10"')
    expect(mail.text).toContain('Unsubscribe: https://chopline.example/unsubscribe?token=t0ken')
  })
})

/** The text between one heading line and the next blank line of a brief's plain-text part. */
function windowText(text: string, label: string): string {
  const start = text.indexOf(`\n${label} (`)
  expect(start, `a ${label} section`).toBeGreaterThanOrEqual(0)
  return text.slice(start + 1).split('\n\n')[0]!
}

describeScenario('blow', (get) => {
  const { facts } = SCENARIOS.blow
  const mails = {} as Record<'us' | 'metric', RenderedMail>

  beforeAll(async () => {
    const w = get()
    // The wind blows from the SSW onto the NNE shore's rock point; the SSW shore is in the lee.
    await w.saveBank('North rock point', Number(facts.windFromDeg) + 180, ['rock', 'sparse-grass'])
    await w.saveBank('South wood bank', Number(facts.windFromDeg), ['wood'])
    const email = DEMO_USERS.find((u) => u.role === 'angler')!.email
    const [angler] = await w.db.select().from(users).where(eq(users.email, email))
    // What the send job reads: the cached lake and day, and the subscriber's stored bank tables.
    const repo = briefSendsRepo(w.db)
    const [cached] = await repo.lakes([{ lakeId: w.lake.id, date: w.date }])
    const banks = (await repo.banks([angler!.id]))
      .filter((b) => b.lakeId === w.lake.id)
      .map((b) => ({ ...b, depthM: b.depthM ?? undefined }))
    for (const [key, units] of [
      ['us', US],
      ['metric', METRIC],
    ] as const)
      mails[key] = renderBrief(
        composeBrief({
          date: w.date,
          units,
          lakes: [{ ...cached!, banks }],
          origin: 'http://app.test',
          unsubscribeUrl: 'http://app.test/unsubscribe?token=t0ken',
        }),
      )
  })

  it('heads the lake with the day’s no-go, in words and a shape, with its reason in mph (WMO Beaufort force 6)', () => {
    const { text, html } = mails.us
    expect(text).toMatch(
      /\nThe day: ✕ No-go: do not launch\. Why: Midday and afternoon to dusk: Wind \d+ mph, gusts \d+ mph/,
    )
    expect(html).toMatch(/<strong>The day: ✕ No-go: do not launch<\/strong>/)
    expect(html).toMatch(/Why: Midday and afternoon to dusk: Wind \d+&nbsp;mph, gusts \d+&nbsp;mph/)
    // The blow's 13 m/s is 29 mph, its 18 m/s gusts 40 mph (NIST SP 811): the peak, not a mean.
    const [, mph, gustMph] =
      /Why: Midday and afternoon to dusk: Wind (\d+) mph, gusts (\d+) mph/.exec(text)!
    expect(Number(mph)).toBeGreaterThanOrEqual(Math.floor(Number(facts.blowWindMs) / 0.44704))
    expect(Number(gustMph)).toBeGreaterThanOrEqual(Math.floor(Number(facts.blowGustMs) / 0.44704))
  })

  it('says not to launch in the no-go windows instead of naming banks or tackle', () => {
    const { text, html } = mails.us
    for (const label of ['Midday', 'Afternoon to dusk']) {
      const section = windowText(text, label)
      expect(section).toMatch(/^ {2}✕ No-go: do not launch\. Why: Wind \d+ mph/m)
      expect(section).toContain('Do not launch in this window')
      expect(section).not.toMatch(/Tie on|North rock point|South wood bank|Same banks/)
    }
    // Dawn is moderate: still a fishing window, with both banks ranked and a call.
    const dawn = windowText(text, 'Dawn to mid-morning')
    expect(dawn).not.toContain('No-go')
    expect(dawn).toMatch(/1\. North rock point \(windward\)/)
    expect(dawn).toMatch(/2\. South wood bank \(lee\)/)
    expect(dawn).toContain('Tie on: ')
    expect(html.match(/Do not launch in this window/g)).toHaveLength(2)
  })

  it('gives each hazard one line naming its windows, in the reader’s units only', () => {
    const { text } = mails.us
    const lines = text.split('\n').filter((l) => l.startsWith('! '))
    const hazards = lines.map((l) => l.replace(/^! \w+: (?:[^:]+: )?(\w+).*/, '$1'))
    expect(new Set(hazards).size).toBe(hazards.length)
    expect(lines).toContainEqual(
      expect.stringMatching(
        /^! Danger: Midday and afternoon to dusk: Wind \d+ mph, gusts \d+ mph\. /,
      ),
    )
    expect(lines.some((l) => /Waves to \d+\.\d ft/.test(l))).toBe(true)
    expect(text).not.toMatch(/\bkt\b|km\/h|°C|\d m\b/)
  })

  it('reads the same day in km/h, °C and metres for a metric subscriber, on a 24-hour clock', () => {
    const { text, html } = mails.metric
    expect(text).toMatch(
      /The day: ✕ No-go: do not launch\. Why: Midday and afternoon to dusk: Wind \d+ km\/h/,
    )
    expect(text).toMatch(
      /^! Danger: Midday and afternoon to dusk: Wind \d+ km\/h, gusts \d+ km\/h\. /m,
    )
    expect(text).toMatch(/Waves to \d+\.\d m on exposed water/)
    expect(text).toMatch(/Midday \(\d{2}:\d{2} – \d{2}:\d{2}\)/)
    expect(text).not.toMatch(/mph|°F|\d ft\b|\bkt\b|AM|PM/)
    expect(html).not.toMatch(/mph|°F|\d ft\b/)
    expect(html).toContain('Do not launch in this window')
  })

  it('uses words, not keys, in every line a person reads', () => {
    for (const { text } of Object.values(mails))
      expect(text).not.toMatch(
        /sparse-grass|dense-grass|lightly-stained|very-clear|early-pre-spawn|_/,
      )
  })
})
