import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { CLARITY_CLASSES } from '../../../shared/conditions/clarity'
import { SEASONAL_PHASES } from '../../../shared/conditions/season'
import { tackleCalls } from '../../../shared/conditions/tackle'
import {
  COVERS,
  NO_FISHING_WIND_MS,
  TACKLE_RULES,
  type LureFamily,
  type TackleInput,
  type TackleRule,
} from '../../../shared/conditions/tackle-rules'
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

  // Was: any 8 °C clear pre-spawn day got a split-tail; the split-tail is now narrowed to calm
  // early pre-spawn over shallow cover (see the trailer tests below).
  it('leaves the trailer off by default and adds bulk or lift in cold early spring', () => {
    expect(blade({})!.trailer).toBeUndefined()
    expect(blade({ waterC: 8, clarity: 'stained', phase: 'early-pre-spawn' })!.trailer).toBe(
      'large swimbait',
    )
    expect(
      blade({
        waterC: 8,
        clarity: 'clear',
        phase: 'early-pre-spawn',
        windMs: 1,
        cover: ['wood'],
        depthM: 1.5,
      })!.trailer,
    ).toBe('slender split-tail')
  })

  it('leaves the trailer hook off in grass and wood and adds it on rock', () => {
    expect(blade({ cover: ['wood'] })!.trailerHook).toBe(false)
    expect(blade({ cover: ['sparse-grass'] })!.trailerHook).toBe(false)
    expect(blade({ cover: ['rock'] })!.trailerHook).toBe(true)
  })

  // Was depthM 4 on the windblown rock bank of `base`, which is the prime bank and must stay
  // erratic; deep now means well past the prime 10 ft.
  it('retrieves erratically, steady only when slow-rolling deep', () => {
    expect(blade({})!.retrieve).toMatch(/erratic/)
    expect(blade({ depthM: 6, waterC: 9 })!.retrieve).toMatch(/steady slow-roll/)
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

const callOf = (family: LureFamily, x: Partial<TackleInput>, rules?: TackleRule[]) =>
  tackleCalls({ ...base, ...x }, rules).find((c) => c.family === family)

/** A year of plausible days: each phase with its usual water temperatures. */
const PHASE_TEMPS: [TackleInput['phase'], number[]][] = [
  ['winter', [3, 5, 7]],
  ['early-pre-spawn', [7, 9, 11]],
  ['pre-spawn', [11, 13, 15]],
  ['spawn', [16, 18, 20]],
  ['post-spawn', [20, 22, 24]],
  ['summer', [25, 27, 29]],
  ['fall', [14, 18, 22]],
]
function* year(over: Partial<TackleInput> = {}): Generator<TackleInput> {
  for (const [phase, temps] of PHASE_TEMPS)
    for (const waterC of temps)
      for (const clarity of CLARITY_CLASSES)
        for (const windMs of [0.5, 2, 4, 7])
          for (const sky of ['sun', 'partly', 'overcast'] as const)
            yield { ...base, phase, waterC, clarity, windMs, sky, ...over }
}

describe('what an angler notices on the water (common practice)', () => {
  it('no trailer on a cold clear day in early pre-spawn', () => {
    expect(
      blade({ clarity: 'clear', waterC: 8, phase: 'early-pre-spawn' })!.trailer,
    ).toBeUndefined()
    expect(blade({ clarity: 'clear', waterC: 9, phase: 'pre-spawn' })!.trailer).toBeUndefined()
    // Dirty but no longer early spring: still no big trailer.
    expect(blade({ clarity: 'stained', waterC: 11, phase: 'pre-spawn' })!.trailer).toBeUndefined()
  })

  it('a split-tail trailer only on a calm, cold early-spring day over shallow cover', () => {
    const day = { clarity: 'clear', waterC: 8, phase: 'early-pre-spawn', depthM: 1.5 } as const
    expect(blade({ ...day, windMs: 1, cover: ['wood'] })!.trailer).toBe('slender split-tail')
    expect(blade({ ...day, windMs: 4, cover: ['wood'] })!.trailer).toBeUndefined()
    expect(blade({ ...day, windMs: 1, cover: ['rock'] })?.trailer).toBeUndefined()
    expect(blade({ ...day, windMs: 1, cover: ['wood'], depthM: 5 })!.trailer).toBeUndefined()
  })

  it('mostly no trailer: fewer than 1 spinnerbait call in 10 over a year of days carries one', () => {
    const calls = [...year()].map((x) => callOf('spinnerbait', x)).filter((c) => c !== undefined)
    const withTrailer = calls.filter((c) => c.trailer !== undefined).length
    expect(calls.length).toBeGreaterThan(100)
    expect(withTrailer / calls.length).toBeLessThan(0.1)
  })

  it('the prime windblown 10 ft rock bank gets an erratic retrieve', () => {
    const call = blade({
      cover: ['rock', 'sparse-grass'],
      depthM: 3,
      windMs: 5,
      waterC: 10,
      phase: 'early-pre-spawn',
    })!
    expect(call.retrieve).toMatch(/erratic/)
    expect(call.why.join(' ')).toMatch(/prime/)
    // A deep, calm bank well past 10 ft in cold water is slow-rolled steadily along the bottom.
    expect(
      blade({ cover: ['rock'], depthM: 6, windMs: 1, waterC: 10, clarity: 'stained' })!.retrieve,
    ).toMatch(/steady slow-roll, deep/)
  })

  it('no squarebill over 6 m of 3 °C water', () => {
    const dirtyRock: Partial<TackleInput> = { clarity: 'muddy', cover: ['rock', 'wood'] }
    expect(callOf('squarebill crankbait', { ...dirtyRock, depthM: 6, waterC: 3 })).toBeUndefined()
    expect(callOf('squarebill crankbait', { ...dirtyRock, depthM: 6, waterC: 15 })).toBeUndefined()
    expect(callOf('squarebill crankbait', { ...dirtyRock, depthM: 1.5, waterC: 3 })).toBeUndefined()
    expect(callOf('squarebill crankbait', { ...dirtyRock, depthM: 1.5, waterC: 15 })).toBeDefined()
  })

  it('a jig on open water is dragged along the bottom, not pitched to cover', () => {
    const call = callOf('jig', { cover: ['open'], phase: 'winter', waterC: 6 })!
    expect(call.retrieve).not.toMatch(/pitch/)
    expect(call.retrieve).toMatch(/along the bottom/)
  })

  it('with no banks saved (open water) no call is pitched, banged or fallen beside cover', () => {
    for (const x of year({ cover: ['open'] })) {
      const calls = tackleCalls(x)
      expect(calls.length).toBeGreaterThan(0)
      for (const call of calls)
        expect(call.retrieve).not.toMatch(/pitch|beside cover|off cover|by cover|of the grass/)
    }
  })

  it('a spinnerbait on a dense-grass bank fits worse, and no blade bait calls dense grass prime', () => {
    const stained = { clarity: 'stained', waterC: 18, phase: 'spawn' } as const
    expect(blade({ ...stained, cover: ['dense-grass'] })!.fit).toBeLessThan(
      blade({ ...stained, cover: ['open'] })!.fit,
    )
    const mixed = blade({ ...stained, cover: ['rock', 'dense-grass'] })!
    expect(mixed.why.join(' ')).not.toMatch(/prime/)
    expect(mixed.why.join(' ')).toMatch(/dense grass/)
    const bladedJig = (cover: TackleInput['cover']) =>
      callOf('bladed jig', { ...stained, cover })?.fit ?? 0
    expect(bladedJig(['sparse-grass', 'dense-grass'])).toBeLessThan(bladedJig(['sparse-grass']))
  })

  it('no calls at all in a 25 kt blow (WMO Beaufort force 6 starts at 10.8 m/s)', () => {
    expect(NO_FISHING_WIND_MS).toBe(10.8)
    expect(tackleCalls({ ...base, windMs: 25 * 0.5144 })).toEqual([])
    expect(tackleCalls({ ...base, windMs: NO_FISHING_WIND_MS })).toEqual([])
    expect(tackleCalls({ ...base, windMs: 10.7 }).length).toBeGreaterThan(0)
  })

  it('a cold front slows every call and moves it to cover', () => {
    for (const x of year({ cover: ['wood', 'rock', 'sparse-grass'], coldFrontPassed: true })) {
      for (const call of tackleCalls(x)) {
        expect(call.retrieve).toMatch(/slow/)
        expect(call.retrieve).toMatch(/cover|grass/)
        expect(call.why).toContain('A cold front just passed: fish tuck tight to cover; slow down.')
      }
    }
    const summer = { phase: 'summer', waterC: 27, windMs: 1, sky: 'overcast' } as const
    const before = tackleCalls({ ...base, ...summer })
    const after = tackleCalls({ ...base, ...summer, coldFrontPassed: true })
    expect(before.map((c) => c.family)).toContain('topwater')
    expect(after.map((c) => c.family)).not.toContain('topwater')
    const fitOf = (calls: typeof before, family: LureFamily) =>
      calls.find((c) => c.family === family)?.fit ?? 0
    expect(fitOf(after, 'jig')).toBeGreaterThan(fitOf(before, 'jig'))
    expect(fitOf(after, 'soft-plastic worm')).toBeGreaterThan(fitOf(before, 'soft-plastic worm'))
    expect(blade({ coldFrontPassed: true })!.retrieve).toMatch(/slow-roll it tight to cover/)
  })

  it('a cold front over open water slows the calls on points and breaks', () => {
    for (const x of year({ cover: ['open'], coldFrontPassed: true }))
      for (const call of tackleCalls(x)) {
        expect(call.retrieve).toMatch(/slow/)
        expect(call.retrieve).toMatch(/breaks/)
        expect(call.retrieve).not.toMatch(/cover/)
      }
  })

  it("every family's colours follow the water's clarity", () => {
    const families = [...new Set(TACKLE_RULES.map((r) => r.family))]
    for (const family of families) {
      // Force the family to be called so only its detail rows decide the colours.
      const force: TackleRule = {
        id: 'test-force',
        family,
        when: () => true,
        fit: 100,
        why: 'test',
        source: 'common practice',
      }
      const colors = (clarity: TackleInput['clarity']) =>
        callOf(family, { clarity }, [force, ...TACKLE_RULES])!.colors.join(', ')
      expect(colors('muddy'), family).toBe(colors('stained'))
      expect(colors('lightly-stained'), family).toBe(colors('clear'))
      expect(new Set([colors('stained'), colors('clear'), colors('very-clear')]).size, family).toBe(
        3,
      )
    }
  })
})

describe('the tackle table', () => {
  it('rules a family out only with a reason, never while also setting fit or details', () => {
    for (const rule of TACKLE_RULES.filter((r) => r.rulesOut)) {
      expect(rule.fit, rule.id).toBeUndefined()
      expect(rule.set, rule.id).toBeUndefined()
    }
    expect(TACKLE_RULES.some((r) => r.rulesOut)).toBe(true)
  })

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
