import { describe, expect, it } from 'vitest'
import { SCENARIOS, type ScenarioName } from '../../server/fakes/feed/scenarios'
import { startFeed } from '../../server/fakes/feed/index'
import { DEMO_STATIONS } from '../../server/db/seed/demo-stations'
import type { ForecastHour } from '../../shared/conditions/day-plan'
import { heatIndexC } from '../../shared/conditions/weather'
import { fetchLength } from '../../shared/geo/fetch'
import { lakeCenter } from '../../shared/geo/polygon'
import { addDays, localDate, zonedMidnight } from '../../shared/time'
import { cToF } from '../../shared/units'
import { describeScenario, startScenario, type ScenarioWorld } from '../helpers/scenario'

/**
 * Named scenario days played through the real ingest jobs into the stored lake days. Each
 * describe starts its scenario once; these tests check the data the engine sees on that day.
 */

const HOUR = 3_600_000
const max = (xs: number[]) => Math.max(...xs)
const min = (xs: number[]) => Math.min(...xs)
const avg = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length
const heatF = (h: { airC: number; relativeHumidityPct: number }) =>
  cToF(heatIndexC(h.airC, h.relativeHumidityPct))

/** Local clock hour of an instant in the scenario's zone. */
function localHour(w: ScenarioWorld, at: Date | string) {
  const t = new Date(at)
  return (
    (t.getTime() -
      zonedMidnight(localDate(t, w.scenario.timeZone), w.scenario.timeZone).getTime()) /
    HOUR
  )
}

/** Daily means of the stored water temperature by local date, oldest first. */
async function dailyWaterMeans(w: ScenarioWorld) {
  const rows = await w.readingsOf('water_temp', new Date(w.feed.now().getTime() - 40 * 24 * HOUR))
  const byDay = new Map<string, number[]>()
  for (const r of rows) {
    const d = localDate(r.at, w.scenario.timeZone)
    byDay.set(d, [...(byDay.get(d) ?? []), r.value])
  }
  return new Map([...byDay].map(([d, vs]) => [d, avg(vs)]))
}

/** What every scenario gives the engine: 30 days of water, a read, a phase and a week of days. */
function itIsPlannable(get: () => ScenarioWorld) {
  it('has 30 days of water temperature, a read with a phase, and a lake day for each forecast day', async () => {
    const w = get()
    expect(w.lake.timeZone).toBe(w.scenario.timeZone)
    const means = await dailyWaterMeans(w)
    expect(means.size).toBeGreaterThanOrEqual(31)
    const read = await w.read()
    expect(read.waterTemp?.stale).toBe(false)
    expect(read.clarity).not.toBeNull()
    expect(read.phase).not.toBeNull()
    const day = await w.lakeDay(0)
    expect(day?.date).toBe(w.scenario.day)
    for (let d = 1; d < 7; d++) expect((await w.lakeDay(d))?.windows.length).toBe(3)
  })
}

function scenario(name: ScenarioName, body: (get: () => ScenarioWorld) => void) {
  describeScenario(name, (get) => {
    itIsPlannable(get)
    body(get)
  })
}

describe('the scenario controls', () => {
  it('play a scenario on its lake and day, report it, and leave the world as it was after', async () => {
    const feed = await startFeed({
      seed: 7,
      stations: DEMO_STATIONS,
      now: () => new Date('2026-04-14T10:00:00Z'),
    })
    try {
      const url = `${feed.url}/weather/v1/lakes/quillmere/observations?start=2026-04-14T09:30:00Z&end=2026-04-14T10:00:00Z`
      const before = await (await fetch(url)).json()
      const set = await fetch(`${feed.url}/__admin/scenario`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: 'blow' }),
      })
      expect(set.status).toBe(200)
      expect(await set.json()).toMatchObject({
        lake: 'quillmere',
        name: 'blow',
        day: '2026-04-14',
        clock: '2026-04-14T10:00:00.000Z',
      })
      const during = (await (await fetch(url)).json()) as { hours: Record<string, unknown>[] }
      expect(during.hours[0]).toMatchObject({ windSpeed: 6, windFrom: 200 })
      const listed = (await (await fetch(`${feed.url}/__admin/scenario`)).json()) as {
        active: unknown[]
        scenarios: { name: string }[]
      }
      expect(listed.active).toEqual([expect.objectContaining({ lake: 'quillmere', name: 'blow' })])
      expect(listed.scenarios.map((s) => s.name)).toEqual(Object.keys(SCENARIOS))
      const bad = await fetch(`${feed.url}/__admin/scenario`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: 'no-such-day' }),
      })
      expect(bad.status).toBe(400)
      await fetch(`${feed.url}/__admin/scenario`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: null }),
      })
      expect(await (await fetch(url)).json()).toEqual(before)
      // Moved on the calendar: the same day a week later.
      const moved = feed.controls.setScenario({ name: 'blow', day: '2026-04-21' })
      expect(moved.clock).toBe('2026-04-21T10:00:00.000Z')
    } finally {
      await feed.close()
    }
  })
})

scenario('blow', (get) => {
  const { facts } = SCENARIOS.blow

  it('blows from the direction with the longest open water on the lake', () => {
    const lake = get().lake.shoreline
    const center = lakeCenter(lake)
    const chord = (deg: number) =>
      fetchLength(lake, center, deg) + fetchLength(lake, center, deg + 180)
    const used = chord(Number(facts.windFromDeg))
    expect(used).toBeCloseTo(Number(facts.openWaterChordM), -1)
    for (let deg = 0; deg < 180; deg += 5) expect(chord(deg)).toBeLessThanOrEqual(used * 1.01)
  })

  it('reaches 13 m/s (gusts 18) from 200° through midday and the afternoon after a moderate dawn', async () => {
    const w = get()
    const dawn = await w.windowHours(0, 'dawn')
    expect(avg(dawn.map((h) => h.windMs))).toBeLessThan(7)
    for (const id of ['midday', 'afternoon'] as const) {
      const hours = await w.windowHours(0, id)
      expect(hours.length).toBeGreaterThan(2)
      for (const h of hours) {
        expect(h.windMs).toBeGreaterThanOrEqual(13)
        expect(h.windFromDeg).toBe(200)
      }
      expect(max(hours.map((h) => h.gustMs))).toBeGreaterThanOrEqual(18)
    }
    const day = await w.lakeDay(0)
    expect(day!.windows.map((x) => Math.round(x.weather!.windMs))).toEqual([6, 13, 13])
    expect(day!.windows[1]!.openWaterWaveM).toBeGreaterThan(0.5)
  })

  it('hides two hours at 13 m/s inside a moderate midday the next day', async () => {
    const hours = await get().windowHours(1, 'midday')
    expect(hours.filter((h) => h.windMs >= 13)).toHaveLength(2)
    const window = (await get().lakeDay(1))!.windows.find((x) => x.id === 'midday')!.weather!
    expect(window.windMs).toBeLessThan(9)
    expect(window.gustMs).toBeGreaterThanOrEqual(18)
  })
})

scenario('storm-afternoon', (get) => {
  const window = async (id: 'dawn' | 'midday' | 'afternoon') =>
    (await get().lakeDay(0))!.windows.find((x) => x.id === id)!.weather!

  it('forecasts a slight chance of thunder at dawn and 36 % or more from midday', async () => {
    const dawn = await window('dawn')
    expect(dawn.thunderstormProbabilityPct).toBeGreaterThanOrEqual(15)
    expect(dawn.thunderstormProbabilityPct).toBeLessThanOrEqual(19)
    expect((await window('midday')).thunderstormProbabilityPct).toBeGreaterThanOrEqual(36)
    expect((await window('afternoon')).thunderstormProbabilityPct).toBeGreaterThanOrEqual(36)
    // Every hour, not only the window's worst: an average would not hide it either.
    for (const id of ['midday', 'afternoon'] as const)
      for (const h of await get().windowHours(0, id))
        expect(h.thunderstormProbabilityPct).toBeGreaterThanOrEqual(36)
  })

  it('peaks near 107 °F heat index in the afternoon while the window average stays near 99 °F', async () => {
    const hours = await get().windowHours(0, 'afternoon')
    const peak = max(hours.map(heatF))
    expect(peak).toBeGreaterThanOrEqual(106)
    expect(peak).toBeLessThanOrEqual(108)
    const average = await window('afternoon')
    expect(heatF(average)).toBeGreaterThan(97)
    expect(heatF(average)).toBeLessThan(101)
  })
})

scenario('rain-event', (get) => {
  const { facts } = SCENARIOS['rain-event']
  const morning = () => get().feed.now().getTime()

  it('observed 36 mm of rain the day before', async () => {
    const hours = await get().weatherOn(-1, 'observed')
    expect(hours).toHaveLength(24)
    const total = hours.reduce((s, h) => s + h.precipitationMm, 0)
    expect(total).toBeCloseTo(Number(facts.rainTotalMm), 0)
  })

  it('stepped from about 3 to about 60 FNU between 30 and 6 hours before the morning', async () => {
    const rows = await get().readingsOf('turbidity', new Date(morning() - 48 * HOUR))
    const at = (hoursBefore: number) =>
      rows.find((r) => r.at.getTime() === morning() - hoursBefore * HOUR)!.value
    expect(at(30)).toBeLessThan(4)
    expect(at(6)).toBeGreaterThan(55)
    expect(at(0)).toBeGreaterThan(55)
    const firstHigh = rows.find((r) => r.value > 30)!.at.getTime()
    expect(firstHigh).toBeGreaterThan(morning() - 30 * HOUR)
    expect(firstHigh).toBeLessThan(morning() - 6 * HOUR)
    const read = await get().read()
    expect(read.clarity!.class).toBe('muddy')
    expect(read.level!.vsMedian30dM).toBeGreaterThan(0.4)
  })

  it('clears over the following days', async () => {
    // A world of its own, so moving the clock leaves the shared one on the scenario's morning.
    const w = await startScenario('rain-event')
    try {
      const before = await w.read()
      expect(await w.moveTo(Number(facts.clearDay))).toBe(addDays(w.scenario.day, 3))
      const rows = await w.readingsOf('turbidity', new Date(w.feed.now().getTime() - HOUR))
      expect(rows.at(-1)!.value).toBeLessThan(25)
      const after = await w.read()
      expect(after.clarity!.secchiM).toBeGreaterThan(before.clarity!.secchiM)
      expect((await w.lakeDay(w.date))?.clarity).toBe('stained')
    } finally {
      await w.close()
    }
  })
})

scenario('cold-front', (get) => {
  const observedFrom = async (fromDay: number) => [
    ...(await get().weatherOn(fromDay, 'observed')),
    ...(await get().weatherOn(fromDay + 1, 'observed')),
  ]
  const change3h = (hours: { at: Date; pressureHpa: number }[]) =>
    hours.slice(3).map((h, i) => h.pressureHpa - hours[i]!.pressureHpa)

  it('passed the night before: pressure fell, then rose more than 3 hPa in 3 hours', async () => {
    const hours = await observedFrom(-1)
    const changes = change3h(hours)
    expect(min(changes)).toBeLessThanOrEqual(-3)
    expect(max(changes)).toBeGreaterThan(3)
    const lowest = hours.reduce((a, b) => (b.pressureHpa < a.pressureHpa ? b : a))
    expect(localDate(lowest.at, get().scenario.timeZone)).toBe(get().scenario.day)
    expect(localHour(get(), lowest.at)).toBeLessThan(2)
    const read = await get().read()
    expect(read.pressure!.changeHpa3h).toBeGreaterThan(3)
  })

  it('veered from south-west to north-west, picked up, and left the air 8 °C colder', async () => {
    const hours = await observedFrom(-1)
    const at = (day: number, hour: number) =>
      hours.find(
        (h) =>
          localDate(h.at, get().scenario.timeZone) === get().dateOf(day) &&
          localHour(get(), h.at) === hour,
      )!
    const evening = at(-1, 18)
    const morning = at(0, 5)
    expect(evening.windFromDeg).toBeGreaterThanOrEqual(202.5)
    expect(evening.windFromDeg).toBeLessThan(247.5)
    expect(morning.windFromDeg).toBeGreaterThanOrEqual(292.5)
    expect(morning.windFromDeg).toBeLessThan(337.5)
    expect(morning.windMs - evening.windMs).toBeGreaterThan(3)
    expect(at(-1, 23).airC - morning.airC).toBeGreaterThanOrEqual(7.5)
  })
})

scenario('heat-wave', (get) => {
  it('has air of 36-38 °C and a heat index over 103 °F for several days, and water near 30 °C', async () => {
    for (const d of [-1, 0, 1, 2]) {
      const hours = await get().weatherOn(d)
      const high = max(hours.map((h) => h.airC))
      expect(high).toBeGreaterThanOrEqual(36)
      expect(high).toBeLessThanOrEqual(38)
      expect(max(hours.map(heatF))).toBeGreaterThan(103)
    }
    const read = await get().read()
    expect(read.waterTemp!.valueC).toBeGreaterThan(29.5)
    expect(read.waterTemp!.valueC).toBeLessThan(31)
    expect(get().scenario.day.slice(5, 7)).toBe('08')
  })
})

scenario('calm-sunny-prespawn', (get) => {
  it('has water in the mid 40s °F, warming for two weeks, stained, calm and sunny', async () => {
    const w = get()
    expect(w.scenario.day.slice(5, 7)).toBe('03')
    const read = await w.read()
    const f = cToF(read.waterTemp!.valueC)
    expect(f).toBeGreaterThanOrEqual(44)
    expect(f).toBeLessThanOrEqual(47)
    const means = await dailyWaterMeans(w)
    const yesterday = means.get(w.dateOf(-1))!
    expect(yesterday - means.get(w.dateOf(-15))!).toBeGreaterThan(1)
    expect(yesterday).toBeGreaterThan(means.get(w.dateOf(-8))!)
    const turbidity = await w.readingsOf('turbidity', new Date(w.feed.now().getTime() - 24 * HOUR))
    for (const r of turbidity) {
      expect(r.value).toBeGreaterThanOrEqual(15)
      expect(r.value).toBeLessThanOrEqual(25)
    }
    expect(read.clarity!.secchiM).toBeCloseTo(0.5, 1)
    expect(read.clarity!.class).toBe('stained')
    const day: ForecastHour[] = []
    for (const id of ['dawn', 'midday', 'afternoon'] as const)
      day.push(...(await w.windowHours(0, id)))
    expect(day.length).toBeGreaterThan(10)
    for (const h of day) {
      expect(h.windMs).toBeLessThan(2)
      expect(h.cloudCoverPct).toBeLessThan(20)
      expect(h.thunderstormProbabilityPct).toBe(0)
    }
  })
})

scenario('early-winter-warm-spell', (get) => {
  it('has December water of 12-14 °C, warming a little after cooling through the fall', async () => {
    const w = get()
    expect(w.scenario.day.slice(5, 7)).toBe('12')
    expect(w.lake.centerLat).toBeGreaterThan(34)
    expect(w.lake.centerLat).toBeLessThan(37)
    const read = await w.read()
    expect(read.waterTemp!.valueC).toBeGreaterThanOrEqual(12)
    expect(read.waterTemp!.valueC).toBeLessThanOrEqual(14)
    const means = await dailyWaterMeans(w)
    expect(means.get(w.dateOf(-30))!).toBeGreaterThan(15)
    expect(means.get(w.dateOf(-1))!).toBeGreaterThan(means.get(w.dateOf(-6))!)
    for (const d of [-1, 0, 1, 2]) {
      const hours = await w.weatherOn(d)
      expect(max(hours.map((h) => h.airC))).toBeGreaterThanOrEqual(19)
    }
  })
})
