import { describe, expect, it } from 'vitest'
import type { WindowConditions } from '../../../shared/conditions/day-plan'
import { COMPASS_16, type ExposureTable } from '../../../shared/conditions/exposure'
import {
  compileWatch,
  judgeWindow,
  tripAlarm,
  type WatchedWindow,
} from '../../../shared/conditions/watch'
import { WatchConditions, WatchInput } from '../../../shared/schemas/watch'
import { MS_PER_MPH } from '../../../shared/units'

/** A bank facing south (180°) across 3 km of water in every direction. */
const SOUTH_FACING: ExposureTable = {
  version: 3,
  point: [0, 0],
  facingDeg: 180,
  rows: COMPASS_16.map((windFromDeg) => ({ windFromDeg, fetchM: 3000, effectiveFetchM: 3000 })),
}

function win(
  windMph: number,
  windFromDeg: number,
  over: Partial<WatchedWindow> = {},
): WatchedWindow {
  const weather = {
    windFromDeg,
    windMs: windMph * MS_PER_MPH,
    gustMs: windMph * MS_PER_MPH * 1.3,
    sky: 'partly',
    airC: 15,
    relativeHumidityPct: 60,
    thunderstormProbabilityPct: 0,
    peak: {
      windFromDeg,
      windMs: windMph * MS_PER_MPH,
      gustMs: windMph * MS_PER_MPH * 1.3,
      thunderstormProbabilityPct: 0,
      heatIndexC: 15,
      windChillC: null,
    },
    coldFront: null,
  } satisfies WindowConditions
  return {
    date: '2026-04-14',
    id: 'dawn',
    clarity: 'stained',
    phase: 'pre-spawn',
    weather,
    verdict: 'go',
    ...over,
  }
}

const watch = (over: Partial<WatchConditions> = {}) =>
  compileWatch(
    WatchConditions.parse({
      wind: { onto: true, min: 8, max: 20, unit: 'mph' },
      clarity: ['stained', 'lightly-stained'],
      phases: ['pre-spawn'],
      ...over,
    }),
  )

describe('judgeWindow: a window against a watch', () => {
  it.each([
    ['12 mph straight onto the bank', win(12, 180), true],
    ['12 mph 60° off straight on (still windward)', win(12, 240), true],
    ['12 mph along the shore (side wind)', win(12, 270), false],
    ['12 mph off the bank (lee)', win(12, 0), false],
    ['7.6 mph rounds to 8: inside the range', win(7.6, 180), true],
    ['7.4 mph rounds to 7: below it', win(7.4, 180), false],
    ['21 mph: above it', win(21, 180), false],
    ['muddy water', win(12, 180, { clarity: 'muddy' }), false],
    ['the spawn', win(12, 180, { phase: 'spawn' }), false],
    ['a no-go window', win(12, 180, { verdict: 'no-go' }), false],
    ['a caution window', win(12, 180, { verdict: 'caution' }), true],
    ['a window the forecast does not reach', win(12, 180, { weather: null, verdict: null }), false],
  ])('%s', (_name, window, matches) => {
    expect(judgeWindow(watch(), window, SOUTH_FACING) !== null).toBe(matches)
  })

  it('takes the speed in the unit it was typed in: 13 to 20 km/h holds 10 mph, not 15', () => {
    const kmh = watch({ wind: { onto: true, min: 13, max: 20, unit: 'kmh' } })
    expect(judgeWindow(kmh, win(10, 180), SOUTH_FACING)).not.toBeNull()
    expect(judgeWindow(kmh, win(15, 180), SOUTH_FACING)).toBeNull()
  })

  it('lets a no-go window match only when the watch does not ask for a go', () => {
    const any = watch({ notNoGo: false })
    expect(judgeWindow(any, win(12, 180, { verdict: 'no-go' }), SOUTH_FACING)?.verdict).toBe(
      'no-go',
    )
  })

  it('on a lake-wide watch judges the speed alone, and never wind onto a bank it does not have', () => {
    const lake = watch({ wind: { onto: false, min: 8, max: 20, unit: 'mph' } })
    expect(judgeWindow(lake, win(12, 0), null)).toMatchObject({ exposure: null })
    expect(judgeWindow(watch(), win(12, 180), null)).toBeNull()
  })

  it('keeps to the windows asked for', () => {
    const dawnOnly = watch({ windows: ['dawn'] })
    expect(judgeWindow(dawnOnly, win(12, 180, { id: 'midday' }), SOUTH_FACING)).toBeNull()
    expect(judgeWindow(dawnOnly, win(12, 180), SOUTH_FACING)).not.toBeNull()
  })

  it('says what matched, in SI', () => {
    expect(judgeWindow(watch(), win(12, 180), SOUTH_FACING)).toEqual({
      windMs: 12 * MS_PER_MPH,
      windFromDeg: 180,
      exposure: 'windward',
      clarity: 'stained',
      phase: 'pre-spawn',
      verdict: 'go',
    })
  })
})

describe('tripAlarm: when a guide hears about a trip day', () => {
  const caution = (level: 'caution' | 'warning' | 'danger', headline: string) => ({
    kind: 'wind' as const,
    level,
    headline,
    message: headline,
    source: 'test',
  })
  it.each([
    ['a go day', 'go', [caution('caution', 'Wind 15 kt')], null],
    ['a caution day with a warning', 'caution', [caution('warning', 'Wind 22 kt')], null],
    ['a no-go day', 'no-go', [caution('danger', 'Wind 30 kt')], ['Wind 30 kt']],
  ] as const)('%s', (_name, verdict, cautions, dangers) => {
    const alarm = tripAlarm({ verdict, cautions: [...cautions] })
    expect(alarm?.dangers ?? null).toEqual(dangers)
  })
})

describe('WatchInput', () => {
  it('refuses wind onto a bank without a bank, and a range upside down', () => {
    const result = WatchInput.safeParse({
      name: 'Point',
      lakeSlug: 'quillmere',
      conditions: { wind: { onto: true, min: 20, max: 8, unit: 'mph' } },
      channels: ['email'],
    })
    expect(result.success).toBe(false)
    const paths = result.error!.issues.map((i) => i.path.join('.'))
    expect(paths).toContain('conditions.wind.max')
  })
  it('needs a channel', () => {
    const result = WatchInput.safeParse({
      name: 'Point',
      lakeSlug: 'quillmere',
      conditions: {},
      channels: [],
    })
    expect(result.error!.issues[0]!.path).toEqual(['channels'])
  })
})
