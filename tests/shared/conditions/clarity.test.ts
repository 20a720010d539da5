import { describe, expect, it } from 'vitest'
import {
  carlsonTsi,
  clarityClass,
  clarityTrend,
  secchiFromTurbidity,
} from '../../../shared/conditions/clarity'
import { DomainError } from '../../../shared/errors'
import { mToFt } from '../../../shared/units'

describe('carlsonTsi', () => {
  // Carlson (1977), Limnology and Oceanography 22(2):361-369: TSI = 60 - 14.41 ln(SD).
  it.each([
    [1, 60.0],
    [2, 50.01],
    [4, 40.02],
    [0.5, 69.99],
  ])('Secchi %d m gives TSI %d (Carlson 1977)', (sd, tsi) => {
    expect(carlsonTsi(sd)).toBeCloseTo(tsi, 1)
  })

  it('drops 10 units for each doubling of Secchi depth (Carlson 1977)', () => {
    expect(carlsonTsi(3) - carlsonTsi(6)).toBeCloseTo(9.99, 2)
  })

  it.each([0, -1, NaN, Infinity])('rejects Secchi %d with a typed error', (sd) => {
    expect(() => carlsonTsi(sd)).toThrow(DomainError)
  })
})

describe('secchiFromTurbidity', () => {
  // USGS Oregon WSC, Estimation of Secchi Depth from Turbidity Data, site 14211720: SD(ft) = 11.123 T^-0.637.
  it.each([
    [1, 11.12],
    [10, 2.57],
    [50, 0.92],
  ])('%d FNU gives %d ft (USGS Oregon WSC site regression)', (fnu, ft) => {
    expect(mToFt(secchiFromTurbidity(fnu))).toBeCloseTo(ft, 1)
  })

  it('uses a station calibration when one is given', () => {
    expect(secchiFromTurbidity(10, { a: 2, b: -0.5 })).toBeCloseTo(2 / Math.sqrt(10), 9)
  })

  it.each([-1, NaN])('rejects turbidity %d', (fnu) => {
    expect(() => secchiFromTurbidity(fnu)).toThrow(/turbidityFnu/)
  })

  it('holds zero turbidity at the sensor floor instead of returning Infinity', () => {
    expect(Number.isFinite(secchiFromTurbidity(0))).toBe(true)
  })
})

describe('clarityClass', () => {
  // About 2 ft (0.6 m) or less is stained, below about 1 ft muddy: common practice.
  it.each([
    [0.2, 'muddy'],
    [0.45, 'stained'],
    [0.6, 'stained'],
    [0.61, 'lightly-stained'],
    [2, 'clear'],
    [5, 'very-clear'],
  ] as const)('%d m is %s (common practice)', (sd, cls) => {
    expect(clarityClass(sd)).toBe(cls)
  })
})

describe('clarityTrend', () => {
  const now = '2026-05-04T12:00:00Z'
  const at = (hoursAgo: number) => new Date(Date.parse(now) - hoursAgo * 3_600_000).toISOString()

  it('recovers the rate of exponential clearing despite an outlier and a gap (Theil-Sen)', () => {
    // Secchi 0.5 m growing 20 % a day: ln slope ln(1.2) = 0.182 per day; computed from the formula.
    const rate = Math.log(1.2)
    const samples = [0, 3, 6, 9, 30, 33, 36, 39, 42, 60, 66, 71]
      .map((h) => ({ at: at(h), secchiM: 0.5 * Math.exp(-rate * (h / 24)) }))
      .map((s, i) => (i === 4 ? { ...s, secchiM: 5 } : s))
    const trend = clarityTrend(samples, now)
    expect(trend.slopePerDay).toBeCloseTo(rate, 2)
    expect(trend.label).toBe('clearing')
    // 0.5 m now, 0.6 m is the top of stained: ln(0.6/0.5)/ln(1.2) = 1 day.
    expect(trend.daysToNextClass).toBeCloseTo(1, 1)
  })

  it('calls flat water steady and ignores readings older than 72 h', () => {
    const samples = [1, 10, 20, 40, 60].map((h) => ({ at: at(h), secchiM: 1.5 }))
    samples.push({ at: at(100), secchiM: 0.2 })
    expect(clarityTrend(samples, now)).toEqual({
      slopePerDay: 0,
      label: 'steady',
      daysToNextClass: null,
    })
  })

  it('reports staining after rain', () => {
    const samples = [0, 12, 24, 36, 48].map((h) => ({
      at: at(h),
      secchiM: 1.0 * Math.exp(-0.3 * (1 - h / 24)),
    }))
    const trend = clarityTrend(samples, now)
    expect(trend.label).toBe('staining')
    expect(trend.slopePerDay).toBeCloseTo(-0.3, 6)
  })

  it('throws a typed error for an empty or too short series', () => {
    expect(() => clarityTrend([], now)).toThrow(DomainError)
    expect(() => clarityTrend([{ at: at(1), secchiM: 1 }], now)).toThrow(/at least 3/)
    expect(() => clarityTrend([{ at: 'yesterday', secchiM: 1 }], now)).toThrow(/valid instant/)
  })
})
