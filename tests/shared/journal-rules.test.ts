import { describe, expect, it } from 'vitest'
import { insights, MIN_SAMPLE, sampleNote, seasonOf } from '../../shared/journal/insights'
import type { CatchConditions } from '../../shared/schemas/journal'
import { LURE_FAMILIES, tackleLists } from '../../shared/conditions/tackle-lists'
import { haversineM, nearestBank } from '../../shared/geo/nearest'

describe('the tackle lists the journal offers', () => {
  it('name every family the tackle calls, with their own words', () => {
    expect(LURE_FAMILIES).toContain('spinnerbait')
    expect(LURE_FAMILIES).toContain('bladed jig')
    const spinner = tackleLists('spinnerbait')
    expect(spinner.colors).toContain('white')
    expect(spinner.sizes).toContain('single Colorado, size 6-7')
    expect(tackleLists('jig').trailers).toContain('craw')
  })
})

describe('the nearest bank', () => {
  // One minute of latitude is 1,852 m (the nautical mile, by definition) on a sphere of radius 6,366.7 km;
  // on the mean radius the minute is 1,853.2 m.
  it('measures a minute of latitude as about 1,853 m (haversine, mean Earth radius)', () => {
    expect(haversineM([0, 45], [0, 45 + 1 / 60])).toBeCloseTo(1853.2, 0)
  })
  it('picks the closest bank within 300 m, and none past it', () => {
    const banks = [
      { id: 'a', points: [[0, 0.001] as [number, number]] },
      { id: 'b', points: [[0, 0.002] as [number, number]] },
    ]
    expect(nearestBank([0, 0.0017], banks)?.id).toBe('b')
    expect(nearestBank([0, 0.01], banks)).toBeNull()
  })
})

describe('insights', () => {
  const at = (over: Partial<CatchConditions>): CatchConditions => ({
    waterC: 12,
    clarity: { class: 'stained', secchiM: 0.5, trend: 'steady' },
    phase: 'pre-spawn',
    wind: { ms: 4, gustMs: 6, fromDeg: 200 },
    bankExposure: 'windward',
    sky: 'partly',
    cloudCoverPct: 50,
    airC: 15,
    pressure: null,
    verdict: 'go',
    timeOfDay: 'dawn',
    localDate: '2026-04-10',
    computedAt: '2026-04-10T12:00:00Z',
    ...over,
  })
  it('counts each group, its share and its best lure, and flags small samples', () => {
    const rows = [
      ...Array.from({ length: 6 }, () => ({ conditions: at({}), lureFamily: 'Spinnerbait' })),
      { conditions: at({}), lureFamily: 'jig' },
      ...Array.from({ length: 3 }, () => ({
        conditions: at({ clarity: { class: 'clear', secchiM: 2, trend: null }, waterC: 21 }),
        lureFamily: 'jerkbait',
      })),
      { conditions: null, lureFamily: 'jig' },
    ]
    const clarity = insights(rows).find((d) => d.dimension === 'clarity')!
    expect(clarity.known).toBe(10)
    expect(clarity.groups[0]).toEqual({
      key: 'stained',
      count: 7,
      share: 0.7,
      topLure: { family: 'spinnerbait', count: 6 },
      enough: true,
    })
    expect(clarity.groups[1]).toMatchObject({ key: 'clear', count: 3, enough: false })
    const water = insights(rows).find((d) => d.dimension === 'water')!
    expect(water.groups.map((g) => g.key)).toEqual(['10-15', '20-25'])
    expect(sampleNote(3)).toBe('3 catches — too few to say')
    expect(sampleNote(MIN_SAMPLE)).toBeNull()
  })
  it.each([
    ['2026-04-10', 40, 'spring'],
    ['2026-07-01', 40, 'summer'],
    ['2026-12-01', 40, 'winter'],
    ['2026-07-01', -35, 'winter'],
  ] as const)('puts %s at latitude %d in %s', (date, lat, season) => {
    expect(seasonOf(date, lat)).toBe(season)
  })
})
