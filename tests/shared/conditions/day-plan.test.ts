import { describe, expect, it } from 'vitest'
import {
  dayPlan,
  lakeWideSuggestion,
  lakeDay,
  planForBanks,
  type ForecastHour,
  type LakeDay,
  type WindowPlan,
} from '../../../shared/conditions/day-plan'
import { exposureTable } from '../../../shared/conditions/exposure'
import { waveGrowth } from '../../../shared/conditions/waves'
import { DomainError } from '../../../shared/errors'
import { rankBanks, type Bank } from '../../../shared/conditions/ranking'
import type { Polygon } from '../../../shared/geo/types'
import { box, densified } from '../geo/fixtures'

const lake: Polygon = { type: 'Polygon', coordinates: [densified(box(-88.1, 35, 0.1, 0.05))] }
// West shore looks east; east shore looks west.
const banks: Bank[] = [
  {
    id: 'w',
    name: 'West rocks',
    points: [
      [-88.1, 35.02],
      [-88.1, 35.03],
    ],
    cover: ['rock', 'sparse-grass'],
    depthM: 3,
  },
  {
    id: 'e',
    name: 'East rocks',
    points: [
      [-88.0, 35.02],
      [-88.0, 35.03],
    ],
    cover: ['rock', 'sparse-grass'],
    depthM: 3,
  },
]
const conditions = { clarity: 'stained', waterC: 13, phase: 'pre-spawn' } as const

describe('rankBanks', () => {
  it('puts the bank the wind blows onto ahead of the lee bank (common practice)', () => {
    const ranked = rankBanks({
      lake,
      banks,
      window: { windFromDeg: 90, windMs: 5, gustMs: 7, sky: 'partly' },
      conditions,
    })
    expect(ranked.map((r) => r.id)).toEqual(['w', 'e'])
    expect(ranked[0]!.exposure.exposure).toBe('windward')
    expect(ranked[1]!.exposure.exposure).toBe('lee')
  })

  it('flips when the wind turns around', () => {
    const ranked = rankBanks({
      lake,
      banks,
      window: { windFromDeg: 270, windMs: 5, gustMs: 7, sky: 'partly' },
      conditions,
    })
    expect(ranked[0]!.id).toBe('e')
  })

  it('makes each score the sum of its named components, each with a reason', () => {
    for (const r of rankBanks({
      lake,
      banks,
      window: { windFromDeg: 45, windMs: 14, gustMs: 18, sky: 'sun' },
      conditions,
    })) {
      expect(r.components.map((c) => c.key)).toEqual([
        'wind',
        'cover',
        'depth',
        'clarity',
        'light',
        'safety',
      ])
      expect(r.score).toBeCloseTo(
        r.components.reduce((s, c) => s + c.points, 0),
        12,
      )
      for (const c of r.components) expect(c.reason.length).toBeGreaterThan(5)
    }
  })

  it('penalises a bank where waves reach 2 ft', () => {
    const ranked = rankBanks({
      lake,
      banks,
      window: { windFromDeg: 90, windMs: 20, gustMs: 25, sky: 'sun' },
      conditions,
    })
    const windward = ranked.find((r) => r.id === 'w')!
    expect(windward.exposure.exposure).toBe('rough')
    expect(windward.components.find((c) => c.key === 'safety')!.points).toBe(-3)
    // The sheltered bank wins on a day like that.
    expect(ranked[0]!.id).toBe('e')
  })
})

describe('a day in a blow', () => {
  // A west wind runs the lake's whole 9 km width onto the east bank (CEM EM 1110-2-1100 growth).
  const pointAndLee: Bank[] = [
    { ...banks[1]!, id: 'point', name: 'East rock point', depthM: 3 },
    { id: 'lee', name: 'West flat', points: banks[0]!.points, cover: ['open'], depthM: 9 },
  ]

  it('ranks a sheltered bank above a prime rock point the blow makes rough, and says why (common practice)', () => {
    const ranked = rankBanks({
      lake,
      banks: pointAndLee,
      window: { windFromDeg: 270, windMs: 13, gustMs: 18, sky: 'partly' },
      conditions,
    })
    expect(ranked.map((r) => r.id)).toEqual(['lee', 'point'])
    const point = ranked[1]!
    expect(point.safety).toBe('danger')
    expect(point.components.find((c) => c.key === 'safety')!.reason).toMatch(
      /swamp a small boat: fish sheltered banks first/,
    )
  })

  it('keeps a moderate wind onto the rock point a plus: windblown banks are prime for blade baits (common practice)', () => {
    const ranked = rankBanks({
      lake,
      banks: pointAndLee,
      window: { windFromDeg: 270, windMs: 5, gustMs: 7, sky: 'partly' },
      conditions,
    })
    expect(ranked[0]!.id).toBe('point')
    expect(ranked[0]!.safety).toBe('ok')
  })

  // Moderate west wind all day, with two hours of 13 m/s at the start of the midday window.
  const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
    at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
    windFromDeg: 270,
    windMs: h === 10 || h === 11 ? 13 : 4,
    gustMs: h === 10 || h === 11 ? 18 : 6,
    airC: 18,
    relativeHumidityPct: 60,
    cloudCoverPct: 40,
    thunderstormProbabilityPct: 0,
  }))
  const plan = dayPlan({
    lake,
    date: '2026-04-10',
    timeZone: 'America/Chicago',
    banks: pointAndLee,
    hourly: hours,
    waterC: 13,
    secchiM: 0.5,
    phase: 'pre-spawn',
  })
  const midday = plan.windows.find((w) => w.id === 'midday')!

  it('raises waves from the worst hour: two hours at 13 m/s over 9 km make 0.6 m, not the average’s 0.2 m (CEM II-2-36)', () => {
    const chord = 9_100
    expect(midday.openWaterWaveM).toBeCloseTo(waveGrowth(13, chord).heightM, 1)
    expect(midday.openWaterWaveM).toBeGreaterThanOrEqual(0.55)
    expect(midday.weather!.windMs).toBeLessThan(7)
    expect(midday.weather!.peak.windMs).toBe(13)
  })

  it('says plainly not to launch in a no-go window, and ranks no banks or tackle there (WMO Beaufort force 6)', () => {
    expect(midday.verdict!.verdict).toBe('no-go')
    expect(midday.verdict!.reasons[0]).toMatch(/^Wind 25 kt/)
    expect(midday.banks).toEqual([])
    expect(midday.tackle).toEqual([])
    expect(midday.cautions[0]!.message).toMatch(/Do not launch/)
    // The calm dawn is still a fishing window, and the day is a no-go because of its midday.
    const dawn = plan.windows.find((w) => w.id === 'dawn')!
    expect(dawn.verdict!.verdict).not.toBe('no-go')
    expect(dawn.banks.length).toBe(2)
    expect(plan.verdict.verdict).toBe('no-go')
    expect(plan.cautions.find((c) => c.kind === 'wind')!.headline).toMatch(/^Midday: Wind 25 kt/)
  })
})

describe('dayPlan', () => {
  const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
    at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
    // East wind until 15:00 UTC (10:00 local), west wind after.
    windFromDeg: 5 + h < 15 ? 90 : 270,
    windMs: 5,
    gustMs: 8,
    airC: 18,
    relativeHumidityPct: 60,
    cloudCoverPct: 40,
    thunderstormProbabilityPct: h > 14 ? 40 : 0,
  }))
  const plan = dayPlan({
    lake,
    date: '2026-04-10',
    timeZone: 'America/Chicago',
    banks,
    hourly: hours,
    waterC: 13,
    secchiM: 0.5,
    phase: 'pre-spawn',
  })

  it('has three windows in order, from civil dawn to civil dusk', () => {
    expect(plan.windows.map((w) => w.id)).toEqual(['dawn', 'midday', 'afternoon'])
    expect(plan.windows[0]!.start).toBe(plan.sky.civilDawn)
    expect(plan.windows[2]!.end).toBe(plan.sky.civilDusk)
    for (const w of plan.windows) expect(Date.parse(w.end)).toBeGreaterThan(Date.parse(w.start))
  })

  it('re-ranks the banks as the wind shifts through the day', () => {
    expect(plan.windows[0]!.banks[0]!.id).toBe('w')
    expect(plan.windows[2]!.banks[0]!.id).toBe('e')
  })

  it('calls tackle for the best bank and puts lightning first when storms are likely', () => {
    expect(plan.clarity).toBe('stained')
    expect(plan.windows[0]!.tackle[0]!.why.length).toBeGreaterThan(0)
    expect(plan.windows[2]!.cautions[0]!.kind).toBe('lightning')
    for (const w of plan.windows) expect(w.cautions.at(-1)!.kind).toBe('authority')
  })

  it('marks a window the forecast does not reach instead of inventing weather', () => {
    const partial = dayPlan({
      lake,
      date: '2026-04-10',
      timeZone: 'America/Chicago',
      banks,
      hourly: hours.slice(0, 3),
      waterC: 13,
      secchiM: 0.5,
      phase: 'pre-spawn',
    })
    expect(partial.windows[2]!.weather).toBeNull()
    expect(partial.windows[2]!.banks).toEqual([])
  })
})

describe('lakeDay + planForBanks', () => {
  const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
    at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
    windFromDeg: 90 + h * 5,
    windMs: 6,
    gustMs: 9,
    airC: 16,
    relativeHumidityPct: 55,
    cloudCoverPct: 20,
    thunderstormProbabilityPct: 0,
  }))
  const input = {
    lake,
    date: '2026-04-10',
    timeZone: 'America/Chicago',
    hourly: hours,
    waterC: 13,
    secchiM: 0.5,
    phase: 'pre-spawn' as const,
  }

  it('gives the same plan from a cached day and stored exposure tables as computed in one go', () => {
    // What the server does: the lake's day cached once, each bank's table stored when it was saved.
    const stored = banks.map((b) => ({ ...b, exposure: exposureTable(lake, b.points) }))
    const cachedDay = JSON.parse(JSON.stringify(lakeDay(input))) as LakeDay
    expect(planForBanks(cachedDay, stored)).toEqual(dayPlan({ ...input, banks }))
  })

  it('refuses a bank with neither a stored table nor the lake to compute one', () => {
    expect(() => planForBanks(lakeDay(input), banks)).toThrow(DomainError)
  })
})

describe('lakeWideSuggestion', () => {
  const window = (windMs: number, openWaterWaveM: number): WindowPlan => ({
    id: 'dawn',
    label: 'Dawn to mid-morning',
    start: '2026-04-10T11:00:00Z',
    end: '2026-04-10T14:00:00Z',
    weather: {
      windFromDeg: 225,
      windMs,
      gustMs: windMs * 1.4,
      sky: 'partly',
      airC: 18,
      relativeHumidityPct: 60,
      thunderstormProbabilityPct: 0,
      peak: {
        windFromDeg: 225,
        windMs,
        gustMs: windMs * 1.4,
        thunderstormProbabilityPct: 0,
        heatIndexC: 18,
        windChillC: null,
      },
      coldFront: null,
    },
    openWaterWaveM,
    banks: [],
    tackle: [],
    cautions: [],
    verdict: { verdict: 'go', reasons: [] },
  })

  it('sends the angler to the shore the wind blows onto when it breaks the surface (common practice)', () => {
    expect(lakeWideSuggestion(window(5, 0.2))).toMatch(/^Wind from SW: .* NE shore/)
  })
  it('keeps to the lee when the open water is rough (common practice)', () => {
    expect(lakeWideSuggestion(window(11, 0.5))).toMatch(/SW shore, in the lee/)
  })
  it('works cover anywhere in a calm (common practice), and says nothing past the forecast', () => {
    expect(lakeWideSuggestion(window(1, 0))).toMatch(/^Little wind/)
    expect(lakeWideSuggestion({ ...window(1, 0), weather: null })).toBeNull()
  })
})
