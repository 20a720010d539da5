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
    expect(clarityTrend(samples, now)).toMatchObject({
      slopePerDay: 0,
      label: 'steady',
      basis: 'drift',
      daysToNextClass: null,
      nextClassAt: null,
      rain: null,
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

  // Readings every 15 minutes, as the gauges send them: turbidity in FNU at each hour ago.
  const every15min = (hours: number, fnu: (hoursAgo: number) => number) =>
    Array.from({ length: hours * 4 + 1 }, (_, i) => i / 4).map((h) => ({
      at: at(h),
      secchiM: secchiFromTurbidity(fnu(h)),
    }))
  /** Rain at `startHoursAgo`, 6 h long, that loads the water over 6 h and clears with a 2.5-day time constant. */
  const rainEvent =
    (base: number, startHoursAgo: number, peakFnu = 60) =>
    (h: number) => {
      const age = startHoursAgo - h
      return age < 0 ? base : base + peakFnu * Math.min(1, age / 6) * Math.exp(-age / 60)
    }

  // Secchi estimates by the USGS Oregon WSC regression: 3 FNU is 1.68 m (clear), 60 FNU 0.25 m (muddy).
  it.each([6, 12, 20, 30])(
    'water that went from 3 to 60 FNU %d h ago reads staining, not steady (USGS Oregon WSC regression; common practice: rain stains the water)',
    (stepHoursAgo) => {
      const trend = clarityTrend(
        every15min(72, (h) => (h > stepHoursAgo ? 3 : 60)),
        now,
      )
      expect(trend).toMatchObject({ label: 'staining', basis: 'event', rain: null })
      expect(trend.secchiNowM).toBeCloseTo(secchiFromTurbidity(60), 6)
      expect(trend.peakAt).not.toBeNull()
      // Whether it stains further depends on rain to come: no estimate is made.
      expect(trend.nextClassAt).toBeNull()
    },
  )

  it('reads the staining within hours of the rain starting (common practice: rain stains the water within hours)', () => {
    expect(clarityTrend(every15min(72, rainEvent(3, 3)), now).label).not.toBe('staining')
    expect(clarityTrend(every15min(72, rainEvent(3, 6)), now).label).toBe('staining')
  })

  it.each([
    ['two hours ago', 2],
    ['in the latest reading', 0],
    ['yesterday', 20],
  ])(
    'a single spike reading %s does not make a trend (from memory: a lone reading is sensor noise)',
    (_, spikeHoursAgo) => {
      const samples = every15min(72, (h) => (h === spikeHoursAgo ? 60 : 3))
      expect(clarityTrend(samples, now)).toMatchObject({ label: 'steady', nextClassAt: null })
      // A spike of clear water in stained water, the same.
      const clearSpike = every15min(72, (h) => (h === spikeHoursAgo ? 0.5 : 40))
      expect(clarityTrend(clearSpike, now).label).toBe('steady')
    },
  )

  it('after the rain the water reads clearing with an estimate of when it reaches the next class (computed from the formula)', () => {
    // Muddy 0.25 m since a step 40 h ago, clearing 30 % a day for the last 30 h.
    const rate = Math.log(1.3)
    const secchi = (h: number) =>
      h > 40 ? 1.7 : h > 30 ? 0.25 : 0.25 * Math.exp((rate * (30 - h)) / 24)
    const samples = Array.from({ length: 289 }, (_, i) => i / 4).map((h) => ({
      at: at(h),
      secchiM: secchi(h),
    }))
    const trend = clarityTrend(samples, now)
    expect(trend).toMatchObject({ label: 'clearing', basis: 'event', nextClass: 'lightly-stained' })
    expect(trend.ratePerDay).toBeCloseTo(rate, 3)
    // Secchi now 0.25 × 1.3^(30/24) = 0.348 m; to 0.6 m at 30 % a day: ln(0.6/0.348)/ln(1.3) = 2.08 days.
    const days = Math.log(0.6 / (0.25 * Math.exp((rate * 30) / 24))) / rate
    expect(trend.daysToNextClass).toBeCloseTo(days, 2)
    expect(Date.parse(trend.nextClassAt!)).toBeCloseTo(Date.parse(now) + days * 86_400_000, -5)
  })

  it('turns from staining to clearing as a rain event passes (common practice: rain stains, then it clears over days)', () => {
    const labels = [6, 12, 24, 36, 48, 60].map(
      (h) => clarityTrend(every15min(72, rainEvent(3, h)), now).label,
    )
    expect(labels.slice(0, 2)).toEqual(['staining', 'staining'])
    expect(labels.slice(2)).toEqual(['clearing', 'clearing', 'clearing', 'clearing'])
    const after = clarityTrend(every15min(72, rainEvent(3, 36)), now)
    expect(after.nextClassAt).not.toBeNull()
    expect(Date.parse(after.nextClassAt!)).toBeGreaterThan(Date.parse(now))
  })

  it('staining after 36 mm of rain yesterday names the rain (from memory: rain on the lake and its banks stains it)', () => {
    // Six hours of 6 mm from 22 h ago; the water steps from 3 to 60 FNU 20 h ago.
    const rain = Array.from({ length: 48 }, (_, i) => ({
      at: at(i),
      mm: i >= 17 && i <= 22 ? 6 : 0,
    }))
    const trend = clarityTrend(
      every15min(72, (h) => (h > 20 ? 3 : 60)),
      now,
      rain,
    )
    expect(trend.label).toBe('staining')
    expect(trend.rain).toEqual({ mm: 36, since: at(22), until: at(17) })
    expect(trend.reason).toMatch(/rain/)
    // Without rain at the lake the staining is not blamed on it.
    const dry = clarityTrend(
      every15min(72, (h) => (h > 20 ? 3 : 60)),
      now,
      [],
    )
    expect(dry.rain).toBeNull()
    expect(dry.reason).toMatch(/no rain/)
  })

  it('throws a typed error for an empty or too short series', () => {
    expect(() => clarityTrend([], now)).toThrow(DomainError)
    expect(() => clarityTrend([{ at: at(1), secchiM: 1 }], now)).toThrow(/at least 3/)
    expect(() => clarityTrend([{ at: 'yesterday', secchiM: 1 }], now)).toThrow(/valid instant/)
  })
})
