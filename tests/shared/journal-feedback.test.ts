import { describe, expect, it } from 'vitest'
import { LOG_MIN_SIMILAR, waterBandOf, yourLog, type LogCatch } from '../../shared/journal/feedback'

const day = { clarity: 'stained' as const, waterC: 12, phase: 'pre-spawn' as const }
const fish = (n: number, over: Partial<LogCatch> = {}): LogCatch[] =>
  Array.from({ length: n }, () => ({
    clarity: 'stained',
    waterC: 11,
    phase: 'pre-spawn',
    timeOfDay: 'dawn',
    family: 'spinnerbait',
    blade: null,
    ...over,
  }))

describe('what the log says for a day (our threshold: MIN_SAMPLE similar catches)', () => {
  it('bands water as the insights do', () => {
    expect(waterBandOf(9.9)).toEqual([null, 10])
    expect(waterBandOf(12)).toEqual([10, 15])
    expect(waterBandOf(25)).toEqual([25, null])
  })

  it('says nothing below the threshold, and counts only the same clarity, band and phase', () => {
    expect(yourLog(fish(LOG_MIN_SIMILAR - 1), day)).toBeNull()
    const other = [
      ...fish(9, { clarity: 'clear' }),
      ...fish(9, { waterC: 16 }),
      ...fish(9, { phase: 'spawn' }),
      ...fish(9, { waterC: null }),
    ]
    expect(yourLog([...fish(LOG_MIN_SIMILAR - 1), ...other], day)).toBeNull()
    expect(yourLog([...fish(LOG_MIN_SIMILAR), ...other], day)).toMatchObject({
      count: LOG_MIN_SIMILAR,
      of: LOG_MIN_SIMILAR,
      timeOfDay: null,
    })
  })

  it('names the blade when most of the family came on it, and the window when it alone has enough', () => {
    const log = yourLog(
      [
        ...fish(4, { blade: 'colorado' }),
        ...fish(1, { blade: 'willow', timeOfDay: 'midday' }),
        ...fish(2, { family: 'Jig', timeOfDay: 'midday' }),
      ],
      day,
      'midday',
    )
    expect(log).toMatchObject({ count: 4, of: 7, familyCount: 5, blade: 'colorado' })
    expect(
      yourLog([...fish(5, { timeOfDay: 'midday', family: 'Jig ' }), ...fish(3)], day, 'midday'),
    ).toMatchObject({ family: 'jig', count: 5, of: 5, timeOfDay: 'midday' })
  })
})
