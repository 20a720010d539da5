import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  SEASONAL_PHASES,
  seasonalPhase,
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

  it('gives a reason naming the mean and the trend', () => {
    const r = seasonalPhase({
      dailyMeanWaterC: Array(14).fill(16),
      lastDay: '2026-04-20',
      latitude: 35,
    })
    expect(r.reason).toMatch(/5-day mean 16\.0 °C, steady/)
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
