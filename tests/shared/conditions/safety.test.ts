import { describe, expect, it } from 'vitest'
import { cautions } from '../../../shared/conditions/safety'
import { fToC, MS_PER_KNOT } from '../../../shared/units'

const kinds = (c: ReturnType<typeof cautions>) => c.map((x) => `${x.kind}:${x.level}`)

describe('cautions', () => {
  it('always ends by deferring to local authorities and boating law', () => {
    const calm = cautions({ windMs: 1 })
    expect(calm).toHaveLength(1)
    expect(calm.at(-1)!.message).toMatch(/local authorities.*boating law/)
    expect(cautions({ windMs: 20, thunderstormProbabilityPct: 80 }).at(-1)!.kind).toBe('authority')
  })

  it('warns at small-craft-advisory winds and at 34 kt gales (NWS marine hazards)', () => {
    expect(kinds(cautions({ windMs: 22 * MS_PER_KNOT }))).toContain('wind:warning')
    expect(kinds(cautions({ windMs: 10, gustMs: 34 * MS_PER_KNOT }))).toContain('wind:danger')
    expect(kinds(cautions({ windMs: 7.5 }))).toContain('wind:caution')
  })

  it('warns of waves from 2 ft and calls 4 ft a danger (NWS SCA waves; 2 ft common practice)', () => {
    expect(kinds(cautions({ windMs: 5, waveHeightM: 0.7 }))).toContain('waves:warning')
    expect(kinds(cautions({ windMs: 5, waveHeightM: 1.3 }))).toContain('waves:danger')
  })

  it('sends anglers off the water for lightning (NWS: when thunder roars, go indoors)', () => {
    const [first] = cautions({ windMs: 3, thunderstormProbabilityPct: 60 })
    expect(first!.kind).toBe('lightning')
    expect(first!.level).toBe('danger')
    expect(first!.message).toMatch(/When thunder roars, go indoors/)
    expect(first!.message).toMatch(/30 minutes/)
  })

  it('flags cold water below 70 °F with the 1-10-1 principle (from memory)', () => {
    const c = cautions({ windMs: 2, waterC: fToC(55) }).find((x) => x.kind === 'cold-water')
    expect(c?.message).toMatch(/1-10-1/)
    // Worked out once for every angler, so it names both scales: 55 °F is 12.8 °C.
    expect(c?.message).toContain('Water 55 °F (13 °C)')
    expect(cautions({ windMs: 2, waterC: fToC(75) }).some((x) => x.kind === 'cold-water')).toBe(
      false,
    )
  })

  it('follows the NWS heat index bands', () => {
    // 90 °F at 50 % is a 95 °F heat index: extreme caution, 90-103 °F (NWS).
    expect(kinds(cautions({ windMs: 2, airC: fToC(90), relativeHumidityPct: 50 }))).toContain(
      'heat:warning',
    )
    expect(kinds(cautions({ windMs: 2, airC: fToC(100), relativeHumidityPct: 60 }))).toContain(
      'heat:danger',
    )
  })

  it('orders the most serious first and rejects NaN', () => {
    const list = cautions({ windMs: 8, waveHeightM: 1.5, waterC: 12 })
    expect(list[0]!.level).toBe('danger')
    expect(() => cautions({ windMs: NaN })).toThrow(/windMs/)
  })
})
