import { describe, expect, it } from 'vitest'
import { TACKLE_RULES } from '../../shared/conditions/tackle-rules'
import { DEFAULT_SETTINGS, makeFormat } from '../../shared/format'
import { METRIC } from '../helpers/units'

describe('makeFormat', () => {
  it('shows SI values in the default US units (NIST SP 811 factors)', () => {
    const f = makeFormat()
    expect(f.temp(20)).toBe('68 °F')
    expect(f.length(3.048)).toBe('10.0 ft')
    expect(f.speed(0.44704 * 15)).toBe('15 mph')
    expect(f.time('2026-04-10T18:30:00Z', 'America/Chicago')).toBe('1:30 PM')
  })

  it('follows the settings: °C, metres, knots and a 24-hour clock', () => {
    const f = makeFormat({
      temperature: 'C',
      length: 'm',
      speed: 'knots',
      clock: '24h',
      homeLakeSlug: null,
    })
    expect(f.temp(20)).toBe('20.0 °C')
    expect(f.signedLength(-0.25)).toBe('−0.3 m')
    // A level a hair under its median is at it: no sign on a zero as shown.
    expect(f.signedLength(-0.02)).toBe('0.0 m')
    expect(f.signedLength(0.04)).toBe('0.0 m')
    expect(f.signedLength(0.06)).toBe('+0.1 m')
    expect(f.speed((1852 / 3600) * 10)).toBe('10 kt')
    expect(f.time('2026-04-10T18:30:00Z', 'America/Chicago')).toBe('13:30')
  })

  const metric = makeFormat(METRIC)

  it('gives rain, area and chart hours in the reader’s units (NIST SP 811: 1 in = 25.4 mm, 1 sq mi = 2.589988 km²)', () => {
    const f = makeFormat()
    expect(f.rain(36)).toBe('1.42 in')
    expect(metric.rain(36)).toBe('36 mm')
    expect(f.area(25.9)).toBe('10.0 sq mi')
    expect(metric.area(25.9)).toBe('25.9 km²')
    expect(f.hour('2026-04-10T18:00:00Z', 'America/Chicago')).toBe('1 PM')
    expect(metric.hour('2026-04-10T18:00:00Z', 'America/Chicago')).toBe('13:00')
    expect(metric.dateTime('2026-04-10T18:05:00Z', 'UTC')).toBe('Apr 10, 2026, 18:05')
    expect(f.dateTime('2026-04-10T18:05:00Z', 'UTC')).toBe('Apr 10, 2026, 6:05 PM')
  })

  it('gives pressure in inches of mercury with feet and hectopascals with metres (NIST SP 811: 1 inHg (32 °F) = 3386.38 Pa)', () => {
    const f = makeFormat()
    expect(f.pressure(1016.2)).toBe('30.01 inHg') // 1016.2 / 33.8638
    expect(f.pressure(1013.25)).toBe('29.92 inHg') // the standard atmosphere
    expect(metric.pressure(1016.2)).toBe('1016 hPa')
    expect(f.pressureChange(-1.2)).toBe('−0.04 inHg')
    expect(f.pressureChange(0.05)).toBe('0.00 inHg')
    expect(metric.pressureChange(2.04)).toBe('+2.0 hPa')
    // A front as the engine words it, restated for a US reader.
    const front = 'Pressure fell 3.5 hPa, then rose 7.5 hPa, with the wind now from 300°.'
    expect(f.prose(front)).toBe(
      'Pressure fell 0.10 inHg, then rose 0.22 inHg, with the wind now from 300°.',
    )
    expect(metric.prose(front)).toBe(front)
  })

  it('says a reading of this minute is just now, not 0 min ago', () => {
    const now = Date.parse('2026-05-06T10:00:00Z')
    expect(makeFormat().age('2026-05-06T09:59:50Z', now)).toBe('just now')
    expect(makeFormat().age('2026-05-06T09:58:00Z', now)).toBe('2 min ago')
  })

  it('words a day against today at the lake', () => {
    const now = new Date('2026-05-06T03:00:00Z') // still May 5 in Chicago
    const f = makeFormat()
    expect(f.day('2026-05-05T20:00:00Z', 'America/Chicago', now)).toBe('today')
    expect(f.day('2026-05-04T20:00:00Z', 'America/Chicago', now)).toBe('yesterday')
    expect(f.day('2026-05-06T20:00:00Z', 'America/Chicago', now)).toBe('tomorrow')
    expect(f.day('2026-05-09T20:00:00Z', 'America/Chicago', now)).toBe('on Sat, May 9')
  })

  it('restates measurements in the engine’s words, leaving the rest alone (common practice: 2 ft is 0.6 m)', () => {
    const f = makeFormat()
    expect(metric.prose('About 2 ft of visibility or less')).toBe(
      'About 0.6 m of visibility or less',
    )
    expect(metric.prose('about 10 ft of water a cast out')).toBe('about 3 m of water a cast out')
    expect(metric.prose('7 in, Texas-rigged')).toBe('180 mm, Texas-rigged')
    expect(metric.prose('from about 50 °F')).toBe('from about 10 °C')
    expect(metric.prose('colder than the mid 40s °F')).toBe('colder than about 7 °C')
    expect(f.prose('runs 1-1.5 m')).toBe('runs 3-5 ft')
    expect(f.prose('110 mm suspending')).toBe('4.5 in suspending')
    expect(f.prose('3/8 oz, size 6-7')).toBe('3/8 oz, size 6-7')
    expect(f.prose('About 2 ft of visibility')).toBe('About 2 ft of visibility')
  })
})

describe('prose: rules of thumb in the reader units', () => {
  it('leaves no foot or Fahrenheit in any tackle reason or size for a metric reader, and no metre for a US one', () => {
    const metric = makeFormat({ ...DEFAULT_SETTINGS, temperature: 'C', length: 'm' })
    const us = makeFormat(DEFAULT_SETTINGS)
    for (const rule of TACKLE_RULES)
      for (const text of [rule.why, rule.set?.size ?? '']) {
        expect(metric.prose(text)).not.toMatch(/\d ft\b|°F|mid[- ]\d0s/)
        expect(us.prose(text)).not.toMatch(/\d m\b|°C/)
      }
  })
})
