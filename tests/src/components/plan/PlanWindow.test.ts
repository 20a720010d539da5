import { VueQueryPlugin } from '@tanstack/vue-query'
import { mount as baseMount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { describe, expect, it } from 'vitest'
import { dayPlan, type ForecastHour } from '@shared/conditions/day-plan'
import type { Bank } from '@shared/conditions/ranking'
import { cautionWords } from '@shared/conditions/safety'
import { makeFormat } from '@shared/format'
import type { Polygon } from '@shared/geo/types'
import PlanWindow from '@/components/plan/PlanWindow.vue'

/** Signed out, settings stay at their defaults (°F, ft, mph). */
const mount: typeof baseMount = (component, options) =>
  baseMount(component, { ...options, global: { plugins: [createPinia(), VueQueryPlugin] } })

// An invented box lake 9 km east-west; a west wind runs its width onto the east bank.
const lake: Polygon = {
  type: 'Polygon',
  coordinates: [
    [
      [-88.1, 35],
      [-88.0, 35],
      [-88.0, 35.05],
      [-88.1, 35.05],
      [-88.1, 35],
    ],
  ],
}
const banks: Bank[] = [
  {
    id: 'e',
    name: 'East rocks',
    points: [
      [-88.0, 35.02],
      [-88.0, 35.03],
    ],
    cover: ['rock', 'sparse-grass'],
    depthM: 3,
  },
]
// Calm, cold dawn; two hours of a 13 m/s blow at midday; a slight chance of storms after.
const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
  at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
  windFromDeg: 270,
  windMs: h === 10 || h === 11 ? 13 : 3,
  gustMs: h === 10 || h === 11 ? 18 : 5,
  airC: 18,
  relativeHumidityPct: 60,
  cloudCoverPct: 40,
  thunderstormProbabilityPct: h > 14 ? 17 : 0,
}))
const plan = dayPlan({
  lake,
  date: '2026-04-10',
  timeZone: 'America/Chicago',
  banks,
  hourly: hours,
  waterC: 9.9,
  secchiM: 0.5,
  phase: 'pre-spawn',
})
const windowOf = (id: string) => plan.windows.find((w) => w.id === id)!
const f = makeFormat()

describe('PlanWindow', () => {
  it('shows every caution of its window, in the reader’s units, without being asked to (1-10-1; WMO Beaufort)', () => {
    for (const w of plan.windows) {
      const text = mount(PlanWindow, {
        props: { window: w, timeZone: 'America/Chicago', banksSaved: 1 },
      }).text()
      const shown = w.cautions.filter((c) => c.kind !== 'authority')
      expect(shown.length).toBeGreaterThan(0)
      for (const c of shown) expect(text).toContain(cautionWords(c, { ...f, temp: tenthF }).message)
    }
  })

  it('says plainly not to launch in a no-go window and ranks no banks there', () => {
    const wrapper = mount(PlanWindow, {
      props: { window: windowOf('midday'), timeZone: 'America/Chicago', banksSaved: 1 },
    })
    expect(wrapper.find('.verdict-no-go').text()).toContain('No-go: do not launch')
    expect(wrapper.text()).toContain('Wind 29 mph, gusts 40 mph')
    expect(wrapper.text()).toContain('Do not launch in this window')
    expect(wrapper.find('.banks').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('East rocks')
  })

  it('gives the verdict in words and shape on a fishing window, with its banks and tackle', () => {
    const wrapper = mount(PlanWindow, {
      props: { window: windowOf('dawn'), timeZone: 'America/Chicago', banksSaved: 1 },
    })
    // 9.9 °C water is under 50 °F: a cold-water warning makes the window a caution.
    expect(wrapper.find('.verdict-caution .shape').text()).toBe('!')
    expect(wrapper.find('.verdict-caution').text()).toContain('Go with caution')
    expect(wrapper.find('.verdict-caution').text()).toContain('Water 49.8 °F')
    expect(wrapper.find('.banks').text()).toContain('East rocks')
  })

  it('leaves the cautions to the page when it says so', () => {
    const wrapper = mount(PlanWindow, {
      props: {
        window: windowOf('dawn'),
        timeZone: 'America/Chicago',
        banksSaved: 1,
        showCautions: false,
      },
    })
    expect(wrapper.find('.caution-band').exists()).toBe(false)
  })
})

function tenthF(c: number) {
  return `${((c * 9) / 5 + 32).toFixed(1)} °F`
}
