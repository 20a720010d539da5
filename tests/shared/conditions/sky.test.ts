import { describe, expect, it } from 'vitest'
import { skyDay } from '../../../shared/conditions/sky'
import { addDays } from '../../../shared/time'

const minutesOff = (iso: string | null, expected: string) =>
  Math.abs(Date.parse(iso ?? 'invalid') - Date.parse(expected)) / 60_000

describe('skyDay (suncalc 2)', () => {
  // USNO one-day data, Kyiv (50.45466 N, 30.5238 E), 2026-03-20, UTC; tolerance ±1 min.
  const kyiv = skyDay(50.45466, 30.5238, '2026-03-20', 'Europe/Kyiv')
  it.each([
    ['sunrise', '2026-03-20T04:01:00Z'],
    ['sunset', '2026-03-20T16:11:00Z'],
    ['civilDawn', '2026-03-20T03:29:00Z'],
    ['civilDusk', '2026-03-20T16:43:00Z'],
  ] as const)('%s at %s (USNO)', (key, expected) => {
    expect(minutesOff(kyiv[key], expected)).toBeLessThanOrEqual(1)
  })

  // USNO primary moon phases 2026; tolerance ±1 day.
  it.each([
    ['2026-01-03', 'full moon'],
    ['2026-01-18', 'new moon'],
    ['2026-12-24', 'full moon'],
  ] as const)('names %s within a day of the %s (USNO)', (date, phase) => {
    const names = [-1, 0, 1].map(
      (d) => skyDay(35, -88, addDays(date, d), 'America/Chicago').moonPhase,
    )
    expect(names).toContain(phase)
  })

  it('gives illumination near 1 at full moon and near 0 at new moon', () => {
    expect(skyDay(35, -88, '2026-01-03', 'America/Chicago').moonIllumination).toBeGreaterThan(0.97)
    expect(skyDay(35, -88, '2026-01-18', 'America/Chicago').moonIllumination).toBeLessThan(0.03)
  })

  it('returns null for events that do not happen that day (polar night)', () => {
    const polar = skyDay(78.2, 15.6, '2026-12-21', 'Arctic/Longyearbyen')
    expect(polar.sunrise).toBeNull()
    expect(polar.sunset).toBeNull()
  })

  it('keeps every event inside the local calendar day, also on a DST change', () => {
    const day = skyDay(35, -88, '2026-03-08', 'America/Chicago')
    for (const key of ['sunrise', 'sunset', 'moonrise', 'moonset'] as const) {
      const iso = day[key]
      if (iso)
        expect(new Date(iso).toLocaleDateString('en-CA', { timeZone: 'America/Chicago' })).toBe(
          '2026-03-08',
        )
    }
  })
})
