import { flushPromises } from '@vue/test-utils'
import { NMessageProvider } from 'naive-ui'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { dayPlan, type ForecastHour } from '@shared/conditions/day-plan'
import type { Polygon } from '@shared/geo/types'
import BanksPanel from '@/components/bank/BanksPanel.vue'
import PlanWindow from '@/components/plan/PlanWindow.vue'
import CautionBand from '@/components/safety/CautionBand.vue'
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
  center: [-87.975, 35.02] as [number, number],
}
const shoreline: Polygon = {
  type: 'Polygon',
  coordinates: [
    [
      [-88, 35],
      [-87.95, 35],
      [-87.95, 35.05],
      [-88, 35],
    ],
  ],
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

describe('adding a bank from the keyboard', () => {
  it('moves focus to the map when adding starts, and back to “Add a bank” on cancel', async () => {
    vi.stubGlobal('fetch', async (url: string) =>
      Response.json(url.endsWith('/shoreline') ? { shoreline } : { items: [] }),
    )
    const panel = defineComponent({
      render: () =>
        h(NMessageProvider, null, { default: () => h(BanksPanel, { read: sampleRead(lake) }) }),
    })
    const wrapper = mountAs(IMPERIAL, panel)
    document.body.append(wrapper.element)
    await vi.waitFor(() => expect(wrapper.find('svg[role="img"]').exists()).toBe(true))
    const add = wrapper.findAll('button').find((b) => b.text() === 'Add a bank')!
    ;(add.element as HTMLElement).focus()
    await add.trigger('click')
    await flushPromises()
    const map = wrapper.get('figure.lake-outline svg')
    expect(map.attributes('tabindex')).toBe('0')
    expect(document.activeElement).toBe(map.element)

    await wrapper
      .findAll('button')
      .find((b) => b.text() === 'Cancel')!
      .trigger('click')
    await flushPromises()
    expect(document.activeElement?.textContent?.trim()).toBe('Add a bank')
  })
})

describe('caution regions', () => {
  it('are named apart, one per window, with the level in words', () => {
    const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
      at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
      windFromDeg: 270,
      windMs: 9,
      gustMs: 14,
      airC: 18,
      relativeHumidityPct: 60,
      cloudCoverPct: 40,
      thunderstormProbabilityPct: 40,
    }))
    const plan = dayPlan({
      lake: shoreline,
      date: '2026-04-10',
      timeZone: 'America/Chicago',
      banks: [],
      hourly: hours,
      waterC: 20,
      secchiM: 1,
      phase: 'summer',
    })
    const labels = plan.windows.map((w) =>
      mountAs(IMPERIAL, PlanWindow, {
        props: { window: w, timeZone: 'America/Chicago', banksSaved: 0 },
      })
        .get('.caution-band')
        .attributes('aria-label'),
    )
    expect(labels).toHaveLength(3)
    expect(new Set(labels).size).toBe(3)

    const band = mountAs(IMPERIAL, CautionBand, {
      props: { cautions: plan.windows[0]!.cautions, label: 'Safety cautions, next 12 hours' },
    })
    expect(band.attributes('aria-label')).toBe('Safety cautions, next 12 hours')
    expect(band.text()).toMatch(/^(Warning|Danger|Caution):/)
  })
})
