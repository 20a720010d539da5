import { describe, expect, it } from 'vitest'
import { makeFormat } from '../../shared/format'

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
    expect(f.speed((1852 / 3600) * 10)).toBe('10 kt')
    expect(f.time('2026-04-10T18:30:00Z', 'America/Chicago')).toBe('13:30')
  })
})
