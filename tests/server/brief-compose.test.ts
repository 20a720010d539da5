import { describe, expect, it } from 'vitest'
import { lakeDay, type ForecastHour } from '../../shared/conditions/day-plan'
import { exposureTable } from '../../shared/conditions/exposure'
import type { Bank } from '../../shared/conditions/ranking'
import type { Polygon, Position } from '../../shared/geo/types'
import type { BriefSettings } from '../../shared/schemas/brief'
import { composeBrief, renderBrief, type BriefLake } from '../../server/features/brief/compose'
import { sampleRead } from '../helpers/lake-read-fixture'
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

const US: BriefSettings['units'] = { temperature: 'F', length: 'ft', speed: 'mph', clock: '12h' }
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

  it('gives the one-line read in the subscriber units: 12.5 °C is 54.5 °F (NIST SP 811), 0.5 m is 1.6 ft', () => {
    expect(view.lakes[0]!.read).toBe(
      'Water 55 °F, warming 0.9 °F/day · Stained (1.6 ft visibility), clearing · pre-spawn',
    )
    const metric = compose([lake()], { temperature: 'C', length: 'm', speed: 'kmh', clock: '24h' })
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
    expect(levels[0]).toMatch(/danger|warning/)
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
