import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import type { LakeRead } from '@shared/schemas/lake-read'
import type { DayPlanResponse } from '@shared/schemas/day-plan'
import LakeOutline from '@/components/lake/LakeOutline.vue'
import SkyPanel from '@/components/lake/SkyPanel.vue'
import WaterStrip from '@/components/lake/WaterStrip.vue'
import WindPanel from '@/components/lake/WindPanel.vue'
import { cautions } from '@shared/conditions/safety'
import { makeFormat } from '@shared/format'
import TackleCallItem from '@/components/plan/TackleCallItem.vue'
import { sampleRead } from '../../../helpers/lake-read-fixture'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'

type TackleCall = NonNullable<DayPlanResponse['plan']>['windows'][number]['tackle'][number]

const NOW = '2026-05-06T10:00:00.000Z'
const lake = {
  id: '00000000-0000-4000-8000-000000000001',
  slug: 'quiet-pond',
  name: 'Quiet Pond',
  region: 'Nowhere',
  timeZone: 'UTC',
  normalPoolM: 100,
  areaKm2: 25.9,
  center: [-88, 35] as [number, number],
}

/** Water stained by 36 mm of rain that ended yesterday evening, reaching muddy at 15:00 today. */
function rainRead(): LakeRead {
  const read = sampleRead(lake, NOW)
  read.clarity!.trend = {
    ...read.clarity!.trend!,
    label: 'staining',
    basis: 'event',
    rain: { mm: 36, since: '2026-05-05T04:00:00.000Z', until: '2026-05-05T20:00:00.000Z' },
    nextClassAt: '2026-05-06T15:00:00.000Z',
    nextClass: 'muddy',
    reason: 'stained by rain within the last two days',
  }
  return read
}

beforeEach(() => vi.useFakeTimers({ now: new Date(NOW), toFake: ['Date'] }))
afterEach(() => vi.useRealTimers())

describe('the Water strip', () => {
  it('names the rain behind the staining and when it turns muddy, in inches and a 12-hour clock', () => {
    const text = mountAs(IMPERIAL, WaterStrip, { props: { read: rainRead() } }).text()
    expect(text).toContain('Staining after 1.42 in of rain yesterday')
    expect(text).toContain('reaches muddy today at 3:00 PM')
    expect(text).toContain('1.6 ft visibility')
  })

  it('says the same in millimetres and a 24-hour clock', () => {
    const text = mountAs(METRIC, WaterStrip, { props: { read: rainRead() } }).text()
    expect(text).toContain('Staining after 36 mm of rain yesterday')
    expect(text).toContain('reaches muddy today at 15:00')
    expect(text).toContain('0.5 m visibility')
    expect(text).not.toContain(' in of rain')
  })

  it('words a clearing days ahead with its date', () => {
    const text = mountAs(IMPERIAL, WaterStrip, { props: { read: sampleRead(lake, NOW) } }).text()
    // Three days on from Wed, May 6.
    expect(text).toContain('Clearing; reaches lightly stained on Sat, May 9 at 10:00 AM')
  })
})

describe('the season line', () => {
  it('gives the 5-day mean and trend in °F, with no °C in the words', () => {
    const text = mountAs(IMPERIAL, SkyPanel, { props: { read: sampleRead(lake, NOW) } }).text()
    expect(text).toContain('5-day mean 54 °F, warming 0.7 °F/day')
    expect(text).not.toContain('°C')
  })

  it('gives them in °C to a metric reader', () => {
    const text = mountAs(METRIC, SkyPanel, { props: { read: sampleRead(lake, NOW) } }).text()
    expect(text).toContain('5-day mean 12.2 °C, warming 0.4 °C/day')
    expect(text).not.toContain('°F')
  })
})

describe('the pressure', () => {
  /** 1016.2 hPa, falling 1.2 hPa in three hours. */
  const falling = (): LakeRead => ({
    ...sampleRead(lake, NOW),
    pressure: { hPa: 1016.2, changeHpa3h: -1.2, label: 'falling slowly' },
  })

  it('reads in inches of mercury to a US reader (NIST SP 811: 1 inHg = 3386.38 Pa)', () => {
    const text = mountAs(IMPERIAL, SkyPanel, { props: { read: falling() } }).text()
    expect(text).toContain('30.01 inHg, falling slowly (−0.04 inHg in 3 h)')
    expect(text).not.toContain('hPa')
  })

  it('reads in hectopascals to a metric reader', () => {
    const text = mountAs(METRIC, SkyPanel, { props: { read: falling() } }).text()
    expect(text).toContain('1016 hPa, falling slowly (−1.2 hPa in 3 h)')
    expect(text).not.toContain('inHg')
  })
})

describe('the wind panel', () => {
  it('gives the 12-hour wave at the figure its caution shows: 0.58 m is 2.0 ft in both (common practice: 2 ft waves a warning)', () => {
    const wave = 0.58
    const read: LakeRead = {
      ...sampleRead(lake, NOW),
      windNow: { at: NOW, windMs: 6, gustMs: 9, windFromDeg: 200 },
      openWaterWaveM: wave,
    }
    const text = mountAs(IMPERIAL, WindPanel, { props: { read } }).text()
    expect(text).toContain('Waves to 2.0 ft on open water in the next 12 hours')
    const caution = cautions({ windMs: 6, waveHeightM: wave }).find((c) => c.kind === 'waves')!
    expect(makeFormat(IMPERIAL).caution(caution).headline).toContain('2.0 ft')
  })
})

describe('the lake outline', () => {
  const shoreline = {
    type: 'Polygon' as const,
    coordinates: [
      [
        [-88, 35],
        [-87.95, 35],
        [-87.95, 35.05],
        [-88, 35],
      ] as [number, number][],
    ],
  }
  it('gives the area in square miles or square kilometres', () => {
    const read = sampleRead(lake, NOW)
    expect(mountAs(IMPERIAL, LakeOutline, { props: { read, shoreline } }).text()).toContain(
      '10.0 sq mi of water',
    )
    expect(mountAs(METRIC, LakeOutline, { props: { read, shoreline } }).text()).toContain(
      '25.9 km² of water',
    )
  })
})

describe('a tackle call', () => {
  const call: TackleCall = {
    family: 'squarebill crankbait',
    size: '1.5 size, runs 1-1.5 m',
    colors: ['chartreuse'],
    retrieve: 'bang it off cover',
    why: [
      'About 2 ft of visibility or less: a large single Colorado blade thumps more.',
      'In water colder than the mid 40s °F fish will not chase a fast, deflecting crankbait.',
    ],
  } as TackleCall

  it('states its rules of thumb in feet and °F', () => {
    const text = mountAs(IMPERIAL, TackleCallItem, { props: { call, open: true } }).text()
    expect(text).toContain('runs 3-5 ft')
    expect(text).toContain('About 2 ft of visibility')
    expect(text).toContain('the mid 40s °F')
  })

  it('states them in metres and °C to a metric reader', () => {
    const text = mountAs(METRIC, TackleCallItem, { props: { call, open: true } }).text()
    expect(text).toContain('runs 1-1.5 m')
    expect(text).toContain('About 0.6 m of visibility')
    expect(text).toContain('colder than about 7 °C')
    expect(text).not.toMatch(/\bft\b|°F/)
  })
})
