import { expect, it } from 'vitest'
import { SCENARIOS } from '../../server/fakes/feed/scenarios'
import type { Caution } from '../../shared/conditions/safety'
import { makeFormat } from '../../shared/format'
import type { DayPlanResponse } from '../../shared/schemas/day-plan'
import { cToF } from '../../shared/units'
import { IMPERIAL, METRIC } from '../helpers/units'
import { describeScenario } from '../helpers/scenario'

/**
 * What the engine tells an angler on the days that matter: each named scenario day played through
 * the real ingest jobs and the conditions cache, then read as the app sends it.
 */

type Plan = NonNullable<DayPlanResponse['plan']>
const windowOf = (plan: Plan, id: 'dawn' | 'midday' | 'afternoon') =>
  plan.windows.find((w) => w.id === id)!
const kindsOf = (cautions: Pick<Caution, 'kind'>[]) => cautions.map((c) => c.kind)
const imperial = makeFormat(IMPERIAL)
const metric = makeFormat(METRIC)

/** Banks rank safe first: no rough or dangerous bank above a sheltered one (common practice). */
function expectSafeBanksFirst(plan: Plan) {
  const order = { ok: 0, rough: 1, danger: 2 }
  for (const w of plan.windows) {
    const tiers = w.banks.map((b) => order[b.safety])
    expect(tiers).toEqual([...tiers].sort((a, b) => a - b))
  }
}

/** One line per hazard for the day, ending with the deferral to local authority. */
function expectOneLinePerHazard(plan: Plan) {
  const kinds = kindsOf(plan.cautions)
  expect(new Set(kinds).size).toBe(kinds.length)
  expect(kinds.at(-1)).toBe('authority')
}

describeScenario('blow', (get) => {
  const { facts } = SCENARIOS.blow

  it('says not to launch at midday and in the afternoon, ranks no banks and calls no tackle there (WMO Beaufort force 6)', async () => {
    const w = get()
    // The wind blows from the SSW onto the NNE shore's rock point; the SSW shore is in the lee.
    await w.saveBank('North rock point', Number(facts.windFromDeg) + 180, ['rock', 'sparse-grass'])
    await w.saveBank('South wood bank', Number(facts.windFromDeg), ['wood'])
    const plan = (await w.plan(0)).plan!
    for (const id of ['midday', 'afternoon'] as const) {
      const window = windowOf(plan, id)
      expect(window.verdict!.verdict).toBe('no-go')
      expect(window.verdict!.reasons[0]).toMatch(/^Wind \d+ kt/)
      expect(window.banks).toEqual([])
      expect(window.tackle).toEqual([])
      expect(window.cautions[0]!.message).toMatch(/Do not launch/)
      expect(window.openWaterWaveM).toBeGreaterThan(0.5)
    }
    expect(plan.verdict.verdict).toBe('no-go')
    expect(plan.verdict.reasons).toContainEqual(
      expect.stringMatching(/^Midday and afternoon to dusk: Wind/),
    )
    expectOneLinePerHazard(plan)
    expectSafeBanksFirst(plan)
    // Dawn is moderate: still a fishing window with both banks ranked.
    expect(windowOf(plan, 'dawn').verdict!.verdict).not.toBe('no-go')
    expect(windowOf(plan, 'dawn').banks).toHaveLength(2)
  })

  it('reads the blow in both unit systems, as the screens and the brief print it', async () => {
    const wind = (await get().plan(0)).plan!.cautions.find((c) => c.kind === 'wind')!
    const inMph = imperial.caution(wind).message
    const inKmh = metric.caution(wind).message
    expect(inMph).toMatch(/^Midday and afternoon to dusk: Wind \d+ mph, gusts \d+ mph\./)
    expect(inKmh).toMatch(/^Midday and afternoon to dusk: Wind \d+ km\/h, gusts \d+ km\/h\./)
    expect(inMph).not.toMatch(/kt|km\/h/)
  })

  it('warns on the Lake read at 5 AM of the blow coming later, with its waves (worst of the next 12 h)', async () => {
    const read = await get().read()
    expect(read.verdict.verdict).toBe('no-go')
    expect(read.openWaterWaveM).toBeGreaterThan(0.5)
    expect(kindsOf(read.cautions)).toContain('waves')
  })

  it('judges the next day’s midday by its two hours at 13 m/s, not by the calmer average (CEM wave growth)', async () => {
    const midday = windowOf((await get().plan(1)).plan!, 'midday')
    expect(midday.weather!.windMs).toBeLessThan(9)
    expect(midday.weather!.peak.windMs).toBeGreaterThanOrEqual(13)
    expect(midday.openWaterWaveM).toBeGreaterThan(0.5)
    expect(midday.verdict!.verdict).toBe('no-go')
  })
})

describeScenario('storm-afternoon', (get) => {
  it('gives one lightning line and one heat line for the day, naming the windows, at their worst (NWS lightning safety; NWS heat index)', async () => {
    const plan = (await get().plan(0)).plan!
    expectOneLinePerHazard(plan)
    const lightning = plan.cautions.find((c) => c.kind === 'lightning')!
    // At its worst, a danger, in the afternoon only; the dawn and midday windows say their own.
    expect(lightning.level).toBe('danger')
    expect(lightning.windows).toEqual(['afternoon'])
    expect(lightning.headline).toMatch(/^Afternoon to dusk: Thunderstorms \d+ %/)
    expect(lightning.value).toBe(
      Math.max(...plan.windows.map((w) => w.weather!.peak.thunderstormProbabilityPct)),
    )
    const heat = plan.cautions.find((c) => c.kind === 'heat')!
    expect(heat.level).toBe('danger')
    expect(cToF(heat.value!)).toBeGreaterThan(106)
    expect(heat.windows).toContain('afternoon')
  })

  it('cautions even the slight chance of thunder at dawn, and sends boats in before the afternoon storms (NWS wording: 15-20 % slight chance)', async () => {
    const plan = (await get().plan(0)).plan!
    const dawnLightning = windowOf(plan, 'dawn').cautions.find((c) => c.kind === 'lightning')!
    expect(dawnLightning.level).toBe('caution')
    expect(dawnLightning.message).toMatch(/get off the water/)
    expect(windowOf(plan, 'midday').cautions.find((c) => c.kind === 'lightning')!.level).toBe(
      'warning',
    )
    const afternoon = windowOf(plan, 'afternoon')
    expect(afternoon.verdict!.verdict).toBe('no-go')
    expect(afternoon.verdict!.reasons.join(' ')).toMatch(/Thunderstorms|Heat index/)
    expect(plan.verdict.verdict).toBe('no-go')
  })

  it('prints the peak heat index, not the window’s average (NWS heat index)', async () => {
    const afternoon = windowOf((await get().plan(0)).plan!, 'afternoon')
    const heat = afternoon.cautions.find((c) => c.kind === 'heat')!
    expect(imperial.caution(heat).headline).toMatch(/^Heat index 10[6-8]\.\d °F$/)
    expect(metric.caution(heat).headline).toMatch(/^Heat index 4\d\.\d °C$/)
  })
})

describeScenario('cold-front', (get) => {
  it('sees the front that passed in the night, and slows the calls and moves them to cover (common practice)', async () => {
    const plan = (await get().plan(0)).plan!
    const dawn = windowOf(plan, 'dawn')
    expect(dawn.weather!.coldFront).toMatch(/Pressure fell .* then rose/)
    expect(dawn.verdict!.verdict).not.toBe('no-go')
    expect(dawn.tackle.length).toBeGreaterThan(0)
    for (const call of dawn.tackle) expect(call.why.join(' ')).toMatch(/cold front just passed/)
    expect(dawn.tackle.map((c) => c.family)).not.toContain('topwater')
    const read = await get().read()
    expect(read.pressure!.label).toBe('rising very rapidly')
  })
})

describeScenario('heat-wave', (get) => {
  it('calls the hottest window a no-go for the heat and keeps the summer phase (NWS heat index 103 °F danger)', async () => {
    const plan = (await get().plan(0)).plan!
    const afternoon = windowOf(plan, 'afternoon')
    expect(afternoon.verdict!.verdict).toBe('no-go')
    expect(afternoon.verdict!.reasons).toContainEqual(expect.stringMatching(/^Heat index/))
    expect(plan.phase).toBe('summer')
    expectOneLinePerHazard(plan)
  })
})

describeScenario('calm-sunny-prespawn', (get) => {
  it('calls early pre-spawn and a slow-rolled blade near cover in the midday sun (common practice)', async () => {
    const plan = (await get().plan(0)).plan!
    expect(plan.phase).toBe('early-pre-spawn')
    expect(plan.clarity).toBe('stained')
    const midday = windowOf(plan, 'midday')
    expect(midday.weather!.sky).toBe('sun')
    const blade = midday.tackle.find((c) => c.family === 'spinnerbait')!
    expect(blade.retrieve).toMatch(/slow-roll/)
    expect(blade.ruleIds).toContain('blade-early-prespawn-sun')
  })

  it('gives cold water as the reason for caution, at a tenth of a degree in either unit (1-10-1; 50 °F from memory)', async () => {
    const plan = (await get().plan(0)).plan!
    expect(plan.verdict.verdict).toBe('caution')
    const cold = plan.cautions.find((c) => c.kind === 'cold-water')!
    expect(cold.level).toBe('warning')
    expect(imperial.caution(cold).headline).toMatch(/^All day: Water 4\d\.\d °F$/)
    expect(metric.caution(cold).headline).toMatch(/^All day: Water \d\.\d °C$/)
  })
})

describeScenario('early-winter-warm-spell', (get) => {
  it('does not start the spring in a December warm spell (largemouth seasons; date and latitude bound)', async () => {
    const read = await get().read()
    expect(['fall', 'winter']).toContain(read.phase!.phase)
    expect((await get().plan(0)).plan!.phase).toBe(read.phase!.phase)
  })
})

describeScenario('rain-event', (get) => {
  const { facts } = SCENARIOS['rain-event']

  it('reads the water as staining the morning after the rain, and names the rain (USGS Oregon WSC Secchi estimate; common practice)', async () => {
    const trend = (await get().read()).clarity!.trend!
    expect(trend.label).toBe('staining')
    expect(trend.rain!.mm).toBeCloseTo(Number(facts.rainTotalMm), 0)
  })

  it('turns to clearing over the next days, with when the water reaches the next class', async () => {
    const w = get()
    await w.moveTo(2)
    const trend = (await w.read()).clarity!.trend!
    expect(trend.label).toBe('clearing')
    expect(trend.nextClass).not.toBeNull()
    expect(Date.parse(trend.nextClassAt!)).toBeGreaterThan(w.feed.now().getTime())
  })
})
