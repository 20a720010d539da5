import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { CLARITY_CLASSES } from '../../../shared/conditions/clarity'
import { SEASONAL_PHASES } from '../../../shared/conditions/season'
import { tackleCalls } from '../../../shared/conditions/tackle'
import { COVERS, TACKLE_RULES, type TackleInput } from '../../../shared/conditions/tackle-rules'
import { fToC } from '../../../shared/units'

const base: TackleInput = {
  clarity: 'lightly-stained',
  waterC: 16,
  phase: 'pre-spawn',
  windMs: 4,
  sky: 'partly',
  cover: ['rock'],
}
const blade = (x: Partial<TackleInput>) =>
  tackleCalls({ ...base, ...x }).find((c) => c.family === 'spinnerbait')

describe('spinnerbait calls (common practice)', () => {
  it('uses a large single Colorado blade with white/chartreuse in stained water', () => {
    const call = blade({ clarity: 'stained' })!
    expect(call.blade).toBe('colorado')
    expect(call.size).toMatch(/6-7/)
    expect(call.colors).toEqual(['white', 'chartreuse'])
    expect(call.bladeFinish).toMatch(/painted/)
  })

  it('uses gold-and-silver willows in most water and translucent shad in very clear water', () => {
    expect(blade({})).toMatchObject({ blade: 'double-willow', bladeFinish: 'gold and silver' })
    expect(blade({ clarity: 'very-clear' })).toMatchObject({
      blade: 'double-willow',
      bladeFinish: 'larger blade silver, smaller gold',
      colors: ['translucent shad'],
    })
  })

  it('likes wind that breaks the surface on rock and sparse grass', () => {
    const windy = blade({ cover: ['rock', 'sparse-grass'], windMs: 5 })!
    const calm = blade({ cover: ['rock', 'sparse-grass'], windMs: 1, clarity: 'stained' })!
    expect(windy.fit).toBeGreaterThan(calm.fit)
    expect(windy.why.join(' ')).toMatch(/wind that breaks the surface/)
  })

  it('slow-rolls near wood and grass in calm, sunny, stained mid-40s early pre-spawn water', () => {
    const call = blade({
      phase: 'early-pre-spawn',
      waterC: fToC(45),
      clarity: 'stained',
      windMs: 1,
      sky: 'sun',
      cover: ['wood'],
    })!
    expect(call.retrieve).toMatch(/slow-roll/)
    expect(call.why.join(' ')).toMatch(/fish sun near wood and grass/)
  })

  it('leaves the trailer off by default and adds bulk or lift in cold early spring', () => {
    expect(blade({})!.trailer).toBeUndefined()
    expect(blade({ waterC: 8, clarity: 'stained', phase: 'early-pre-spawn' })!.trailer).toBe(
      'large swimbait',
    )
    expect(blade({ waterC: 8, clarity: 'clear', phase: 'pre-spawn' })!.trailer).toBe(
      'slender split-tail',
    )
  })

  it('leaves the trailer hook off in grass and wood and adds it on rock', () => {
    expect(blade({ cover: ['wood'] })!.trailerHook).toBe(false)
    expect(blade({ cover: ['sparse-grass'] })!.trailerHook).toBe(false)
    expect(blade({ cover: ['rock'] })!.trailerHook).toBe(true)
  })

  it('retrieves erratically, steady only when slow-rolling deep', () => {
    expect(blade({})!.retrieve).toMatch(/erratic/)
    expect(blade({ depthM: 4, waterC: 9 })!.retrieve).toMatch(/steady slow-roll/)
  })

  it('prefers the blade bait to a bladed jig through laydowns', () => {
    const calls = tackleCalls({ ...base, clarity: 'stained', cover: ['wood', 'sparse-grass'] })
    const spin = calls.findIndex((c) => c.family === 'spinnerbait')
    const jig = calls.findIndex((c) => c.family === 'bladed jig')
    expect(spin).toBeGreaterThanOrEqual(0)
    expect(jig === -1 || jig > spin).toBe(true)
  })
})

describe('other lure families (common practice)', () => {
  it.each([
    ['jerkbait', { clarity: 'clear', waterC: 8, phase: 'winter', windMs: 3 }],
    ['squarebill crankbait', { cover: ['wood'], waterC: 15, depthM: 1.5 }],
    ['lipless crankbait', { cover: ['sparse-grass'], waterC: 12, phase: 'pre-spawn' }],
    ['jig', { cover: ['docks'], phase: 'summer', waterC: 27 }],
    ['soft-plastic worm', { cover: ['dense-grass'], phase: 'summer', waterC: 27 }],
    ['topwater', { phase: 'summer', waterC: 26, windMs: 1, sky: 'overcast' }],
    ['swimbait', { clarity: 'clear', windMs: 5, waterC: 18, phase: 'post-spawn' }],
    ['bladed jig', { cover: ['sparse-grass'], clarity: 'stained', waterC: 18, phase: 'spawn' }],
  ] as const)('calls a %s when its conditions hold', (family, x) => {
    const calls = tackleCalls({ ...base, ...(x as Partial<TackleInput>) })
    expect(calls.map((c) => c.family)).toContain(family)
  })

  it('does not call a topwater in cold water or a jerkbait in hot muddy water', () => {
    expect(tackleCalls({ ...base, waterC: 8 }).some((c) => c.family === 'topwater')).toBe(false)
    expect(
      tackleCalls({ ...base, waterC: 28, clarity: 'muddy' }).some((c) => c.family === 'jerkbait'),
    ).toBe(false)
  })
})

describe('the tackle table', () => {
  it('gives every rule a reason and a source tag', () => {
    for (const rule of TACKLE_RULES) {
      expect(rule.why.length).toBeGreaterThan(10)
      expect(['common practice', 'from memory']).toContain(rule.source)
    }
    expect(new Set(TACKLE_RULES.map((r) => r.id)).size).toBe(TACKLE_RULES.length)
  })

  it('gives every call at least one reason, for any conditions (property)', () => {
    fc.assert(
      fc.property(
        fc.record({
          clarity: fc.constantFrom(...CLARITY_CLASSES),
          waterC: fc.double({ min: 0, max: 34, noNaN: true }),
          phase: fc.constantFrom(...SEASONAL_PHASES),
          windMs: fc.double({ min: 0, max: 20, noNaN: true }),
          sky: fc.constantFrom('sun', 'partly', 'overcast' as const),
          cover: fc.subarray([...COVERS], { minLength: 1 }),
          depthM: fc.option(fc.double({ min: 0, max: 15, noNaN: true }), { nil: undefined }),
        }),
        (x) => {
          for (const call of tackleCalls(x)) {
            expect(call.why.length).toBeGreaterThan(0)
            expect(call.fit).toBeGreaterThan(0)
          }
        },
      ),
    )
  })

  it('rejects NaN water temperature', () => {
    expect(() => tackleCalls({ ...base, waterC: NaN })).toThrow(/waterC/)
  })
})
