import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  advancePhase,
  HOLD_DAYS,
  phaseView,
  POST_SPAWN_MAX_DAYS,
  SEASONAL_PHASES,
  seasonalPhase,
  startPhase,
  type PhaseState,
  type SeasonalPhase,
} from '../../../shared/conditions/season'
import { addDays } from '../../../shared/time'

/** A year of daily means: coldest near 7 °C in late January, warmest near 29 °C in late July. */
const yearly = (day: number) => 18 - 11 * Math.cos((2 * Math.PI * (day - 25)) / 365)

function phaseOn(dayOfYear: number, days = 30, temp = yearly): SeasonalPhase {
  const series = Array.from({ length: days }, (_, i) => temp(dayOfYear - days + 1 + i))
  return seasonalPhase({
    dailyMeanWaterC: series,
    lastDay: addDays('2026-01-01', dayOfYear),
    latitude: 35,
  }).phase
}

describe('seasonalPhase', () => {
  it('walks the year in order at 35° N', () => {
    const seen: SeasonalPhase[] = []
    for (let d = 40; d < 400; d += 5) {
      const p = phaseOn(d % 365 || 1)
      if (seen[seen.length - 1] !== p) seen.push(p)
    }
    expect(seen).toEqual([
      'winter',
      'early-pre-spawn',
      'pre-spawn',
      'spawn',
      'post-spawn',
      'summer',
      'fall',
      'winter',
    ])
  })

  it('reads 18 °C as spawn when warming in spring and as fall when cooling (hysteresis)', () => {
    // Spawning 12.8-21 °C, mostly at or above 15 °C: Edwards, Gebhart and Maughan (1983).
    const spring = (d: number) => 14 + 0.2 * (d - 100)
    const autumn = (d: number) => 22 - 0.2 * (d - 280)
    expect(phaseOn(120, 30, spring)).toBe('spawn')
    expect(phaseOn(300, 30, autumn)).toBe('fall')
  })

  it('starts the early pre-spawn once water warms through the mid 40s °F (common practice)', () => {
    expect(phaseOn(60, 21, (d) => 5 + 0.2 * (d - 40))).toBe('early-pre-spawn')
    expect(phaseOn(60, 21, () => 6)).toBe('winter')
  })

  it('mirrors the calendar in the southern hemisphere', () => {
    const series = Array.from({ length: 20 }, (_, i) => 14 + 0.3 * i)
    expect(
      seasonalPhase({ dailyMeanWaterC: series, lastDay: '2026-10-20', latitude: -34 }).phase,
    ).toBe('spawn')
    expect(
      seasonalPhase({ dailyMeanWaterC: series, lastDay: '2026-10-20', latitude: 34 }).phase,
    ).not.toBe('spawn')
  })

  it('gives the 5-day mean and 7-day trend as numbers beside a short reason', () => {
    const r = seasonalPhase({
      dailyMeanWaterC: Array(14).fill(16),
      lastDay: '2026-04-20',
      latitude: 35,
    })
    expect(r).toMatchObject({ phase: 'spawn', meanC: 16, trendCPerDay: 0, lastDay: '2026-04-20' })
    // Numbers go to the client as fields, in the angler's units; the reason has none.
    expect(r.reason).not.toMatch(/°|\d\.\d/)
  })

  it('never moves more than one phase in a day (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 32, noNaN: true }), { minLength: 15, maxLength: 60 }),
        (temps) => {
          let previous: number | null = null
          for (let n = 14; n <= temps.length; n++) {
            const p = SEASONAL_PHASES.indexOf(
              seasonalPhase({
                dailyMeanWaterC: temps.slice(0, n),
                lastDay: addDays('2026-03-01', n),
                latitude: 40,
              }).phase,
            )
            if (previous !== null)
              expect([0, 1, SEASONAL_PHASES.length - 1]).toContain((p - previous + 7) % 7)
            previous = p
          }
        },
      ),
      { numRuns: 50 },
    )
  })

  it('rejects short, empty or broken series with typed errors', () => {
    expect(() =>
      seasonalPhase({ dailyMeanWaterC: [], lastDay: '2026-04-01', latitude: 35 }),
    ).toThrow(/14/)
    expect(() =>
      seasonalPhase({ dailyMeanWaterC: Array(14).fill(NaN), lastDay: '2026-04-01', latitude: 35 }),
    ).toThrow(/finite/)
    expect(() =>
      seasonalPhase({ dailyMeanWaterC: Array(14).fill(10), lastDay: '2026-02-30', latitude: 35 }),
    ).toThrow(/YYYY-MM-DD/)
  })
})

/** Daily means for each date from `from` to `to`, by a function of the date. */
function series(from: string, to: string, temp: (date: string, i: number) => number) {
  const out: { date: string; c: number }[] = []
  for (let d = from, i = 0; d <= to; d = addDays(d, 1), i++) out.push({ date: d, c: temp(d, i) })
  return out
}

/**
 * What a lake's refresh does each day: the stored state advanced over the 30 days of means up to
 * that day, or started from them when there is none. Returns the phase of each day.
 */
function dayByDay(days: { date: string; c: number }[], latitude: number, start = 29) {
  let state: PhaseState | null = null
  const phases: { date: string; phase: SeasonalPhase; state: PhaseState }[] = []
  for (let i = start; i < days.length; i++) {
    const window = days.slice(Math.max(0, i - 29), i + 1)
    const input = { dailyMeanWaterC: window.map((d) => d.c), lastDay: days[i]!.date, latitude }
    state = state ? advancePhase(state, input) : startPhase(input)
    phases.push({ date: days[i]!.date, phase: state.phase, state })
  }
  return phases
}

const SPAWNING_SIDE = ['early-pre-spawn', 'pre-spawn', 'spawn']

describe('phase state carried day to day', () => {
  // Cooling through November to 8.5 °C by early December, then a warm spell to 13 °C by mid month.
  const lateAutumn = series('2026-10-20', '2026-12-20', (date, i) =>
    date <= '2026-12-05' ? Math.max(8.5, 17 - 0.19 * i) : 8.5 + 0.45 * Math.min(10, i - 46),
  )

  it('a December warm spell at 36 N does not start the pre-spawn (from memory: bass spawn in spring, after the winter solstice)', () => {
    const phases = dayByDay(lateAutumn, 36)
    expect(phases.filter((p) => SPAWNING_SIDE.includes(p.phase))).toEqual([])
    expect(phases.at(-1)!.phase).toBe('winter')
    // A lake read for the first time in the warm spell, from its last 31 days, the same.
    const window = lateAutumn.slice(-31)
    const fresh = seasonalPhase({
      dailyMeanWaterC: window.map((d) => d.c),
      lastDay: '2026-12-20',
      latitude: 36,
    })
    expect(SPAWNING_SIDE).not.toContain(fresh.phase)
    expect(fresh.reason).toMatch(/warm spell before the winter solstice/)
    expect(fresh.trendCPerDay).toBeGreaterThan(0)
  })

  it('the same warm spell in the southern autumn, June at 36 S, does not start the pre-spawn either', () => {
    const june = lateAutumn.map((d, i) => ({ date: addDays('2026-04-20', i), c: d.c }))
    expect(dayByDay(june, -36).filter((p) => SPAWNING_SIDE.includes(p.phase))).toEqual([])
  })

  it('the phase does not flicker day to day through a year of cold fronts at 36 N (common practice: one front does not turn the season)', () => {
    // Coldest about 8 °C in late January, warmest about 29 °C in late July; a front every 5 days
    // takes 2 °C off the daily mean, coming back over 4 days; a little day-to-day noise.
    const year = series('2026-01-01', '2027-01-31', (_, i) => {
      const front = i % 5 < 4 ? 2 * (1 - (i % 5) / 4) : 0
      const noise = 0.3 * Math.sin(i * 12.9898)
      return 18.5 - 10.5 * Math.cos((2 * Math.PI * (i - 25)) / 365) - front + noise
    })
    const phases = dayByDay(year, 36)
    const visited = phases.map((p) => p.phase).filter((p, i, all) => i === 0 || all[i - 1] !== p)
    expect(visited).toEqual([
      'winter',
      'early-pre-spawn',
      'pre-spawn',
      'spawn',
      'post-spawn',
      'summer',
      'fall',
      'winter',
    ])
    // Each phase once: no day-to-day back and forth, and no spring in the early winter.
    const autumn = phases.filter((p) => p.date >= '2026-09-22' && p.date < '2026-12-21')
    expect(autumn.filter((p) => SPAWNING_SIDE.includes(p.phase))).toEqual([])
  })

  it(`${POST_SPAWN_MAX_DAYS} days of post-spawn turns to summer even below the summer threshold (our rule; Stuber et al. 1982, from memory)`, () => {
    const state: PhaseState = {
      phase: 'post-spawn',
      since: '2026-06-01',
      pending: null,
      pendingDays: 0,
      lastDay: '2026-06-01',
      meanC: 22,
      trendCPerDay: 0,
    }
    const warm = series('2026-05-26', '2026-07-20', () => 22.5)
    const upTo = (day: string) => {
      const window = warm.filter((d) => d.date <= day).slice(-30)
      return { dailyMeanWaterC: window.map((d) => d.c), lastDay: day, latitude: 40 }
    }
    // Refreshed every day, as the server does.
    let s = state
    for (let d = '2026-06-02'; d <= '2026-07-20'; d = addDays(d, 1)) {
      s = advancePhase(s, upTo(d))
      if (d === '2026-07-01') expect(s.phase).toBe('post-spawn')
    }
    expect(s.phase).toBe('summer')
    // Wanted from day 35 and held three days.
    expect(s.since).toBe(addDays('2026-06-01', POST_SPAWN_MAX_DAYS + HOLD_DAYS - 1))
  })

  it('judges each day once: a second refresh on the same day changes nothing', () => {
    const days = series('2026-03-01', '2026-04-10', (_, i) => 8 + 0.2 * i)
    const input = { dailyMeanWaterC: days.map((d) => d.c), lastDay: '2026-04-10', latitude: 36 }
    const state = startPhase({
      ...input,
      dailyMeanWaterC: input.dailyMeanWaterC.slice(0, -1),
      lastDay: '2026-04-09',
    })
    const once = advancePhase(state, input)
    expect(once.lastDay).toBe('2026-04-10')
    expect(advancePhase(once, input)).toEqual(once)
  })

  it('a cool spell in May does not start the fall (from memory: the fall follows the summer solstice)', () => {
    const summer: PhaseState = {
      phase: 'summer',
      since: '2026-05-10',
      pending: null,
      pendingDays: 0,
      lastDay: '2026-05-20',
      meanC: 25,
      trendCPerDay: 0,
    }
    const days = series('2026-04-21', '2026-06-15', (d, i) =>
      d <= '2026-05-20' ? 25 : Math.max(18, 25 - 0.5 * (i - 29)),
    )
    let s = summer
    for (let d = '2026-05-21'; d <= '2026-06-15'; d = addDays(d, 1)) {
      const window = days.filter((x) => x.date <= d).slice(-30)
      s = advancePhase(s, { dailyMeanWaterC: window.map((x) => x.c), lastDay: d, latitude: 30 })
      expect(s.phase).toBe('summer')
    }
    expect(phaseView(s, 30).reason).toMatch(/cool spell before the summer solstice/)
  })

  it('a warm lake that never cools below winter water still reaches its spawn after the solstice (Stuber et al. 1982: spawning from about 15 °C, from memory)', () => {
    // 13 °C through December, 11 °C in January, warming to 17 °C by the end of March.
    const days = series('2026-11-15', '2027-04-15', (d, i) =>
      d < '2027-01-01' ? 13 : d < '2027-02-01' ? 11 : Math.min(17, 11 + 0.1 * (i - 78)),
    )
    const seen = dayByDay(days, 30)
      .map((p) => p.phase)
      .filter((p, i, all) => i === 0 || all[i - 1] !== p)
    expect(seen).toEqual(['fall', 'winter', 'early-pre-spawn', 'pre-spawn', 'spawn'])
  })

  it('the reason agrees with its numbers: early pre-spawn at 58 °F and cooling is not called warming (common practice: early pre-spawn from the mid 40s °F)', () => {
    const view = phaseView(
      {
        phase: 'early-pre-spawn',
        since: '2026-03-01',
        pending: 'pre-spawn',
        pendingDays: 1,
        lastDay: '2026-03-05',
        meanC: 14.4,
        trendCPerDay: -0.3,
      },
      36,
    )
    expect(view).toMatchObject({ meanC: 14.4, trendCPerDay: -0.3 })
    expect(view.reason).not.toMatch(/warming|mid 40s|°/)
    expect(view.reason).toMatch(/pre-spawn if the water holds 2 more days/)
  })
})
