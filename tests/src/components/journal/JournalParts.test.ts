import { VueQueryPlugin } from '@tanstack/vue-query'
import { mount as baseMount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { describe, expect, it, vi } from 'vitest'
import { fishUnits } from '@shared/journal/fish-units'
import type { CatchConditions } from '@shared/schemas/journal'
import CatchConditionsList from '@/components/journal/CatchConditionsList.vue'
import InsightChart from '@/components/journal/InsightChart.vue'

// chart.js has no canvas in jsdom.
vi.mock('vue-chartjs', () => ({ Bar: { template: '<div class="bar-stub" />' } }))

/** Signed out, settings stay at their defaults (°F, ft, mph). */
const mount: typeof baseMount = (component, options) =>
  baseMount(component, { ...options, global: { plugins: [createPinia(), VueQueryPlugin] } })

const conditions: CatchConditions = {
  waterC: 12.5,
  clarity: { class: 'stained', secchiM: 0.5, trend: 'clearing' },
  phase: 'pre-spawn',
  wind: { ms: 4.47, gustMs: 6, fromDeg: 225 },
  bankExposure: 'windward',
  sky: 'overcast',
  cloudCoverPct: 90,
  airC: 15,
  pressure: { hPa: 1012, changeHpa3h: -1, label: 'falling slowly' },
  verdict: 'go',
  timeOfDay: 'dawn',
  localDate: '2026-04-10',
  computedAt: '2026-04-10T12:00:00Z',
}

describe("a catch entry's conditions", () => {
  it("reads them in the angler's units, with the wind onto the bank", () => {
    const text = mount(CatchConditionsList, { props: { conditions } }).text()
    expect(text).toContain('55 °F')
    expect(text).toContain('stained (1.6 ft), clearing')
    expect(text).toContain('pre-spawn')
    expect(text).toContain('10 mph from SW — windward on the bank')
    expect(text).toContain('overcast')
    // The day's verdict and time of day in words (VERDICT_LABELS, the Day plan's window names).
    expect(text).toContain('Go · Dawn to mid-morning')
  })
  it('says what was not measured rather than showing a number', () => {
    const text = mount(CatchConditionsList, {
      props: { conditions: { ...conditions, waterC: null, clarity: null, wind: null } },
    }).text()
    expect(text).toContain('not measured')
    expect(text).toContain('not recorded')
  })
})

describe('an insight', () => {
  it('shows a table beside the chart, and says when a group is too small', () => {
    const wrapper = mount(InsightChart, {
      props: {
        title: 'Clarity',
        groups: [
          {
            key: 'stained',
            label: 'stained',
            count: 9,
            share: 0.75,
            topLure: { family: 'spinnerbait', count: 7 },
          },
          {
            key: 'clear',
            label: 'clear',
            count: 3,
            share: 0.25,
            topLure: { family: 'jig', count: 2 },
          },
        ],
      },
    })
    expect(wrapper.find('.bar-stub').exists()).toBe(true)
    const rows = wrapper.findAll('tbody tr').map((r) => r.text())
    expect(rows[0]).toContain('7 of 9 on a spinnerbait')
    expect(rows[0]).toContain('75 %')
    expect(rows[1]).toContain('3 catches — too few to say')
  })
})

describe('fish units', () => {
  it('turn inches and pounds into metres and kilograms and back', () => {
    const u = fishUnits({ length: 'ft' })
    expect(u.fromLength(18)).toBeCloseTo(0.4572, 6)
    expect(u.fromWeight(3)).toBeCloseTo(1.36078, 5)
    expect(u.length(0.4572)).toBe('18.0 in')
    expect(fishUnits({ length: 'm' }).length(0.42)).toBe('42 cm')
  })
})
