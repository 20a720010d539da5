import { describe, expect, it } from 'vitest'
import type { BankView } from '@shared/schemas/banks'
import BankListItem from '@/components/bank/BankListItem.vue'
import StationHistoryLegend from '@/components/desk/StationHistoryLegend.vue'
import LakeOutline from '@/components/lake/LakeOutline.vue'
import WindArrow from '@/components/lake/WindArrow.vue'
import { exposureColors, palette } from '@/theme'
import { sampleRead } from '../../../helpers/lake-read-fixture'
import { IMPERIAL, mountAs } from '../mountAs'

const lake = {
  id: '00000000-0000-4000-8000-000000000001',
  slug: 'quiet-pond',
  name: 'Quiet Pond',
  region: 'Nowhere',
  timeZone: 'UTC',
  normalPoolM: 100,
  areaKm2: 2,
  center: [-88, 35] as [number, number],
}
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
const bank = (exposure: 'windward' | 'rough') => ({
  id: exposure,
  name: exposure,
  points: [
    [-87.95, 35.01],
    [-87.95, 35.02],
  ] as [number, number][],
  exposure,
})

describe('the outline’s legend', () => {
  it('says what each bank colour means, beside the banks it colours', () => {
    const wrapper = mountAs(IMPERIAL, LakeOutline, {
      props: { read: sampleRead(lake), shoreline, banks: [bank('windward')] },
    })
    const legend = wrapper.get('[aria-label="Bank colours"]')
    const items = legend.findAll('li').map((li) => li.text())
    expect(items).toEqual([
      'Lee: sheltered: the wind blows off the bank',
      'Side wind: the wind runs along the bank',
      'Windward: the wind blows onto the bank: prime in a moderate wind',
      'Rough: waves or gusts too strong for a small boat',
    ])
    // The legend's swatch is drawn as the bank is: the same colour and dashes.
    const swatch = legend.findAll('line')[3]!
    expect(swatch.attributes('stroke')).toBe(exposureColors.rough)
    expect(swatch.attributes('stroke-dasharray')).toBe('9 2 2 2')
  })

  it('has no legend when no banks are drawn', () => {
    const wrapper = mountAs(IMPERIAL, LakeOutline, { props: { read: sampleRead(lake), shoreline } })
    expect(wrapper.find('[aria-label="Bank colours"]').exists()).toBe(false)
  })

  it('draws a windward bank, prime in a moderate wind, in a water colour and not a warning one', () => {
    expect(exposureColors.windward).toBe(palette.jade)
    expect(exposureColors.windward).not.toBe(exposureColors.rough)
  })
})

describe('WindArrow', () => {
  it('has a shaft, a head and a feathered tail', () => {
    const svg = mountAs(IMPERIAL, WindArrow, { props: { fromDeg: 90 } })
    expect(svg.find('line.shaft').exists()).toBe(true)
    expect(svg.find('path.head').exists()).toBe(true)
    // Two pairs of feathers at the tail, where the wind comes from.
    expect(svg.get('path.tail').attributes('d')!.match(/M/g)).toHaveLength(4)
  })
})

describe('the stations’ legend', () => {
  it('explains the bars and the dots', () => {
    const text = mountAs(IMPERIAL, StationHistoryLegend).text()
    expect(text).toContain('as tall as the share of expected readings stored')
    expect(text).toContain('90 % or more')
    expect(text).toContain('a day with refused values')
  })
})

describe('a bank’s fetch', () => {
  it('explains fetch in one line where the fetch table is', () => {
    const view: BankView = {
      id: '00000000-0000-4000-8000-000000000002',
      name: 'East rocks',
      points: bank('rough').points,
      cover: ['rock'],
      depthM: 3,
      slope: null,
      notes: '',
      detached: false,
      exposure: { version: 1, facingDeg: 270, rows: [] },
    } as unknown as BankView
    const text = mountAs(IMPERIAL, BankListItem, { props: { bank: view, exposure: null } }).text()
    expect(text).toContain('Fetch is the open water a wind crosses before it reaches the bank')
  })
})
