import { describe, expect, it } from 'vitest'
import {
  beaufortForce,
  frontPassage,
  heatIndexC,
  pressureTendency,
  windChillC,
} from '../../../shared/conditions/weather'
import { cToF, fToC, MS_PER_KNOT, MS_PER_MPH } from '../../../shared/units'

describe('windChillC (NWS 2001)', () => {
  it.each([
    [0, 15, -19],
    [30, 10, 21],
  ])('%d °F at %d mph feels like %d °F (NWS wind chill chart)', (f, mph, wc) => {
    expect(Math.round(cToF(windChillC(fToC(f), mph * MS_PER_MPH)!))).toBe(wc)
  })

  it('is undefined above 50 °F or at 3 mph and below (NWS)', () => {
    expect(windChillC(fToC(55), 10 * MS_PER_MPH)).toBeNull()
    expect(windChillC(fToC(20), 3 * MS_PER_MPH)).toBeNull()
  })
})

describe('heatIndexC (NWS WPC, Rothfusz 1990)', () => {
  it.each([
    [90, 50, 95],
    [88, 60, 95],
    [80, 40, 80],
  ])('%d °F at %d percent humidity feels like %d °F (NWS heat index chart)', (f, rh, hi) => {
    expect(Math.round(cToF(heatIndexC(fToC(f), rh)))).toBe(hi)
  })

  it('uses the simple formula in mild air (NWS WPC)', () => {
    // 70 °F, 50 %: 0.5 (70 + 61 + 2.4 + 4.7) = 69.05 °F, computed from the formula.
    expect(cToF(heatIndexC(fToC(70), 50))).toBeCloseTo(69.05, 2)
  })
})

describe('beaufortForce (WMO, knots)', () => {
  it.each([
    [0, 0],
    [2, 1],
    [5, 2],
    [10, 3],
    [11, 4],
    [16, 4],
    [21, 5],
    [27, 6],
    [33, 7],
    [40, 8],
    [47, 9],
    [55, 10],
    [63, 11],
    [64, 12],
    [90, 12],
  ])('%d kt is force %d (WMO Beaufort scale)', (knots, force) => {
    expect(beaufortForce(knots * MS_PER_KNOT)).toBe(force)
  })
})

describe('pressureTendency', () => {
  const series = (deltas: number[]) =>
    deltas.map((d, i) => ({
      at: new Date(Date.UTC(2026, 3, 1, 9 + i)).toISOString(),
      hPa: 1012 + d,
    }))

  it.each([
    [[0, 0.02, 0.05, 0.05], 'steady'],
    [[0, 0.3, 0.6, 1.0], 'rising slowly'],
    [[0, -1, -2, -3], 'falling'],
    [[0, 1.5, 3, 5], 'rising quickly'],
    [[0, -3, -5, -7], 'falling very rapidly'],
  ] as const)('%j over 3 h is %s (Met Office tendency terms, from memory)', (deltas, label) => {
    const t = pressureTendency(series([...deltas]))
    expect(t.label).toBe(label)
    expect(t.changeHpa3h).toBeCloseTo(deltas[3]!, 6)
  })

  it('refuses a series without a reading about 3 h earlier', () => {
    expect(() => pressureTendency(series([0]))).toThrow(/at least two/)
    expect(() => pressureTendency(series([0, 1]))).toThrow(/3 h/)
  })
})

describe('frontPassage (common practice)', () => {
  it('sees a fall, a rise and a north-west wind as a cold front', () => {
    const hPa = [1012, 1010, 1008, 1007, 1008, 1010, 1012]
    const wind = [200, 210, 220, 250, 290, 310, 320]
    const hours = hPa.map((p, i) => ({
      at: new Date(Date.UTC(2026, 3, 1, i)).toISOString(),
      hPa: p,
      windFromDeg: wind[i]!,
    }))
    expect(frontPassage(hours).coldFrontPassed).toBe(true)
    expect(frontPassage(hours.map((h) => ({ ...h, windFromDeg: 180 }))).coldFrontPassed).toBe(false)
  })
})
