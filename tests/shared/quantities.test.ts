import { describe, expect, it } from 'vitest'
import { TACKLE_RULES } from '../../shared/conditions/tackle-rules'
import { quantitiesIn } from '../../shared/quantities'

const US = { temperature: 'F', length: 'ft' } as const
const METRIC = { temperature: 'C', length: 'm' } as const

describe('quantitiesIn: a rule of thumb in the reader units', () => {
  it.each([
    // 2 ft is 0.61 m, 10 ft 3.05 m, 50 °F 10 °C, 46 °F 7.8 °C (NIST SP 811).
    ['About 2 ft of visibility or less', METRIC, 'About 0.6 m of visibility or less'],
    ['about 10 ft of water a cast out', METRIC, 'about 3 m of water a cast out'],
    ['in water from about 50 °F.', METRIC, 'in water from about 10 °C.'],
    ['Below about 46 °F fish', METRIC, 'Below about 8 °C fish'],
    // The mid 40s °F is taken as 45 °F, 7.2 °C.
    ['colder than the mid 40s °F fish', METRIC, 'colder than about 7 °C fish'],
    ['Early pre-spawn, mid-40s °F, stained', METRIC, 'Early pre-spawn, about 7 °C, stained'],
    // 1 m is 3.28 ft, 1.5 m 4.92 ft.
    ['A squarebill runs 1-1.5 m deep', US, 'A squarebill runs 3-5 ft deep'],
    ['1.5 size, runs 1-1.5 m', METRIC, '1.5 size, runs 1-1.5 m'],
    ['About 2 ft of visibility', US, 'About 2 ft of visibility'],
  ] as const)('%s (%o)', (text, units, expected) => {
    expect(quantitiesIn(text, units)).toBe(expected)
  })

  it('leaves lure weights, blade sizes and percentages alone', () => {
    const text = '3/8 oz, single Colorado, size 6-7, about 95 % of the time'
    expect(quantitiesIn(text, METRIC)).toBe(text)
    expect(quantitiesIn(text, US)).toBe(text)
  })

  it('leaves no foot or Fahrenheit in any tackle reason for a metric reader, and no metre for a US one', () => {
    for (const rule of TACKLE_RULES) {
      const texts = [rule.why, rule.set?.size ?? '']
      for (const t of texts) {
        expect(quantitiesIn(t, METRIC)).not.toMatch(/\d ft\b|°F|mid[- ]\d0s/)
        expect(quantitiesIn(t, US)).not.toMatch(/\d m\b|°C/)
      }
    }
  })
})
