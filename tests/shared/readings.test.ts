import { describe, expect, it } from 'vitest'
import { oxygenSaturationMgL, parameterForCode, plausibility, toSi } from '../../shared/readings'

describe('toSi', () => {
  it.each([
    ['water_temp', 68, '°F', 20],
    ['water_temp', 20, '°C', 20],
    ['gauge_height', 10, 'ft', 3.048],
    ['gauge_height', 3, 'm', 3],
    ['turbidity', 12, 'NTU', 12],
  ] as const)('%s %d %s is %d in SI (NIST SP 811 factors)', (p, v, unit, si) => {
    expect(toSi(p, v, unit)).toBeCloseTo(si, 9)
  })

  it('knows no conversion for a unit it has not seen', () => {
    expect(toSi('gauge_height', 3, 'furlong')).toBeNull()
  })
})

describe('plausibility', () => {
  const at = new Date('2026-04-10T12:00:00Z')
  const later = (min: number) => new Date(at.getTime() + min * 60_000)

  it('rejects water at 60 °C and negative turbidity as out of range', () => {
    expect(plausibility('water_temp', 60, at)?.reason).toBe('out_of_range')
    expect(plausibility('turbidity', -5, at)?.reason).toBe('out_of_range')
    expect(plausibility('water_temp', 18, at)).toBeNull()
  })

  it('rejects a 30 ft level jump in 15 minutes but not a slow rise', () => {
    const prev = { value: 4, at }
    expect(plausibility('gauge_height', 4 + 30 * 0.3048, later(15), prev)?.reason).toBe(
      'rate_of_change',
    )
    expect(plausibility('gauge_height', 4.1, later(15), prev)).toBeNull()
    // After a six-hour gap a 1 m rise is believable.
    expect(plausibility('gauge_height', 5, later(360), prev)).toBeNull()
  })

  it('maps agency parameter codes to parameters', () => {
    expect(parameterForCode('00010')).toBe('water_temp')
    expect(parameterForCode('00065')).toBe('gauge_height')
    expect(parameterForCode('63680')).toBe('turbidity')
    expect(parameterForCode('99999')).toBeUndefined()
  })
})

describe('oxygenSaturationMgL (Benson and Krause, APHA form)', () => {
  it.each([
    [0, 14.621],
    [20, 9.092],
  ])('%d °C holds %d mg/L at saturation (Standard Methods 4500-O)', (c, mg) => {
    expect(oxygenSaturationMgL(c)).toBeCloseTo(mg, 2)
  })
})
