import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query'
import { flushPromises, mount as baseMount } from '@vue/test-utils'
import { createPinia, type Pinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import type { Polygon } from '@shared/geo/types'
import type { LakeRead } from '@shared/schemas/lake-read'
import { PAGE_BOOT_ID, type PageBoot } from '@shared/schemas/page-boot'
import { adoptPageBoot } from '@/pageBoot'
import { queryClient } from '@/queryClient'
import { useAuthStore } from '@/stores/auth'
import CautionBand from '@/components/safety/CautionBand.vue'
import LakeOutline from '@/components/lake/LakeOutline.vue'
import WaterStrip from '@/components/lake/WaterStrip.vue'
import WindArrow from '@/components/lake/WindArrow.vue'
import LakeReadView from '@/views/LakeReadView.vue'

/** Signed out, settings stay at their defaults (°F, ft, mph). */
const mount: typeof baseMount = (component, options) =>
  baseMount(component, { ...options, global: { plugins: [createPinia(), VueQueryPlugin] } })

const now = new Date().toISOString()
const hoursAgo = (h: number) => new Date(Date.now() - h * 3_600_000).toISOString()

const shoreline: Polygon = {
  type: 'Polygon',
  coordinates: [
    [
      [-88, 35],
      [-87.9, 35],
      [-87.9, 35.1],
      [-88, 35.1],
      [-88, 35],
    ],
    [
      [-87.96, 35.04],
      [-87.96, 35.06],
      [-87.94, 35.06],
      [-87.94, 35.04],
      [-87.96, 35.04],
    ],
  ],
}

function read(overrides: Partial<LakeRead> = {}): LakeRead {
  return {
    lake: {
      id: '00000000-0000-4000-8000-000000000001',
      slug: 'x',
      name: 'X',
      region: 'R',
      timeZone: 'UTC',
      normalPoolM: 1,
      areaKm2: 1,
      center: [0, 0],
    },
    asOf: now,
    lastReadingAt: now,
    waterTemp: { at: now, stale: false, valueC: 20, trendCPerDay: 0.5 },
    clarity: {
      at: now,
      stale: false,
      secchiM: 0.5,
      source: 'turbidity',
      class: 'stained',
      tsi: 70,
      trend: null,
    },
    level: { at: now, stale: false, gaugeM: 3, vsMedian30dM: 0.3048 },
    windNow: null,
    windNext12h: [],
    airC: null,
    pressure: null,
    sky: {
      sunrise: null,
      sunset: null,
      civilDawn: null,
      civilDusk: null,
      moonrise: null,
      moonset: null,
      moonIllumination: 0,
      moonPhase: 'new moon',
    },
    phase: null,
    openWaterWaveM: null,
    cautions: [],
    verdict: { verdict: 'go', reasons: [] },
    ...overrides,
  }
}

describe('WaterStrip', () => {
  it('shows water in °F, clarity class and level against the median', () => {
    const text = mount(WaterStrip, { props: { read: read() } }).text()
    expect(text).toContain('68 °F')
    expect(text).toContain('warming 0.9 °F/day')
    expect(text).toContain('stained')
    expect(text).toContain('+1.0 ft')
  })

  it('marks an old reading as old instead of showing it as current', () => {
    const wrapper = mount(WaterStrip, {
      props: {
        read: read({ waterTemp: { at: hoursAgo(5), stale: true, valueC: 20, trendCPerDay: null } }),
      },
    })
    expect(wrapper.text()).toContain('Old reading: 5 h ago')
    expect(wrapper.find('.tile.stale').exists()).toBe(true)
  })

  it('says when there is no reading at all', () => {
    expect(
      mount(WaterStrip, {
        props: { read: read({ waterTemp: null, clarity: null, level: null }) },
      }).text(),
    ).toContain('No reading')
  })
})

describe('CautionBand', () => {
  it('announces warnings and dangers as alerts and keeps the deferral note', () => {
    const wrapper = mount(CautionBand, {
      props: {
        cautions: [
          {
            kind: 'lightning',
            level: 'danger',
            headline: 'Thunderstorms 60 %',
            message: 'When thunder roars, go indoors.',
            source: 'NWS lightning safety',
          },
          {
            kind: 'authority',
            level: 'info',
            headline: 'A guide only',
            message: 'Follow local authorities and boating law.',
            source: 'common practice',
          },
        ],
      },
    })
    expect(wrapper.findAll('[role="alert"]')).toHaveLength(1)
    expect(wrapper.text()).toContain('boating law')
  })
})

describe('WindArrow', () => {
  it('points downwind and names where the wind comes from', () => {
    const svg = mount(WindArrow, { props: { fromDeg: 270 } })
    expect(svg.attributes('aria-label')).toBe('Wind from W')
    expect(svg.find('g').attributes('transform')).toBe('rotate(450)')
  })
})

describe('LakeOutline', () => {
  it('draws the shoreline with its island as a hole and describes it in words', () => {
    const wrapper = mount(LakeOutline, {
      props: {
        read: read({ windNow: { at: now, windMs: 5, gustMs: 7, windFromDeg: 315 } }),
        shoreline,
      },
    })
    const path = wrapper.get('path.water')
    expect(path.attributes('fill-rule')).toBe('evenodd')
    // Two rings: the shoreline and the island.
    expect(path.attributes('d')!.match(/M/g)).toHaveLength(2)
    expect(wrapper.get('svg').attributes('aria-label')).toMatch(/1 island\. Wind 11 mph from NW\./)
    // Square miles for the default (imperial) reader.
    expect(wrapper.text()).toContain('0.4 sq mi of water')
  })

  it('draws saved banks in their exposure class, named for screen readers', () => {
    const wrapper = mount(LakeOutline, {
      props: {
        read: read(),
        shoreline,
        banks: [
          {
            id: 'a',
            name: 'West rocks',
            points: [
              [-88, 35.02],
              [-88, 35.03],
            ],
            exposure: 'rough',
          },
          {
            id: 'b',
            name: 'East docks',
            points: [
              [-87.9, 35.02],
              [-87.9, 35.03],
            ],
            exposure: 'lee',
          },
        ],
      },
    })
    const titles = wrapper.findAll('g.bank title').map((t) => t.text())
    expect(titles).toEqual(['West rocks: rough', 'East docks: lee'])
    // Lee banks are dashed as well as coloured, so the class does not rest on colour alone.
    const lines = wrapper.findAll('g.bank path.line')
    expect(lines[0]!.attributes('stroke-dasharray')).toBe('9 2 2 2')
    expect(lines[1]!.attributes('stroke-dasharray')).toBe('2 3')
    expect(lines[0]!.attributes('d')).toMatch(/^M[\d.]+,[\d.]+ L[\d.]+,[\d.]+$/)
  })

  it('walks the shore with the arrow keys and picks the point under the cursor with Enter', async () => {
    const wrapper = mount(LakeOutline, { props: { read: read(), shoreline, picked: [] } })
    const svg = wrapper.get('svg')
    expect(svg.attributes('tabindex')).toBe('0')
    expect(svg.attributes('aria-label')).toMatch(/arrow keys move along the shore/)
    await svg.trigger('keydown', { key: 'ArrowRight' })
    await svg.trigger('keydown', { key: 'Enter' })
    await svg.trigger('keydown', { key: 'ArrowLeft' })
    await svg.trigger('keydown', { key: 'ArrowLeft' })
    await svg.trigger('keydown', { key: 'Enter' })
    // The cursor starts on the shoreline's first distinct vertex; one step on is the next corner,
    // and two steps back wrap round to the island's last vertex.
    expect(wrapper.emitted('pick')).toEqual([[[-87.9, 35.1]], [[-87.96, 35.04]]])
  })

  it('is not a picking surface when no bank is being added', () => {
    const wrapper = mount(LakeOutline, { props: { read: read(), shoreline } })
    expect(wrapper.get('svg').attributes('tabindex')).toBeUndefined()
    expect(wrapper.find('circle').exists()).toBe(false)
  })
})

describe('LakeReadView', () => {
  afterEach(() => vi.unstubAllGlobals())

  /** The page at /lakes/x, on its own router, with the given stores and query cache. */
  async function mountLakeRead(pinia: Pinia, cache: QueryClient) {
    const router = createRouter({
      history: createMemoryHistory(),
      routes: [
        { path: '/lakes/:slug', component: LakeReadView },
        { path: '/lakes/:slug/plan/:date', name: 'day-plan', component: { render: () => null } },
        { path: '/watches', name: 'watches', component: { render: () => null } },
      ],
    })
    await router.push('/lakes/x')
    return baseMount(LakeReadView, {
      global: {
        plugins: [pinia, router, [VueQueryPlugin, { queryClient: cache }]],
        // The map and the charts load when scrolled to; they have tests of their own.
        stubs: { WhenVisible: true },
      },
    })
  }

  it('shows loading bars, then a failure with a retry, then the lake', async () => {
    const answers = [
      Response.json({ error: { code: 'internal', message: 'Try later.' } }, { status: 500 }),
      Response.json(read({ lake: { ...read().lake, name: 'Quiet Pond' } })),
    ]
    const fetch = vi.fn(async () => answers.shift()!)
    vi.stubGlobal('fetch', fetch)
    const wrapper = await mountLakeRead(
      createPinia(),
      new QueryClient({ defaultOptions: { queries: { retry: false } } }),
    )
    expect(wrapper.find('[role="status"]').attributes('aria-label')).toBe('Loading the lake')

    await flushPromises()
    const failure = wrapper.find('[role="alert"]')
    expect(failure.text()).toContain('This lake could not be loaded')
    expect(failure.text()).toContain('Try later.')

    await failure.find('button').trigger('click')
    await flushPromises()
    expect(wrapper.find('h1').text()).toBe('Quiet Pond')
    expect(wrapper.find('[role="alert"]').exists()).toBe(false)
    expect(fetch).toHaveBeenCalledTimes(2)
  })

  it('draws the lake the page was served with in its first render, asking the API nothing', async () => {
    const fetch = vi.fn()
    vi.stubGlobal('fetch', fetch)
    const boot: PageBoot = {
      user: {
        id: '00000000-0000-4000-8000-000000000009',
        email: 'a@example.test',
        role: 'angler',
        createdAt: now,
      },
      settings: { temperature: 'C', length: 'm', speed: 'kmh', clock: '24h', homeLakeSlug: null },
      lakeRead: read({ lake: { ...read().lake, name: 'Served Pond' } }),
    }
    const element = document.createElement('script')
    element.type = 'application/json'
    element.id = PAGE_BOOT_ID
    element.textContent = JSON.stringify(boot)
    document.body.append(element)
    const pinia = createPinia()
    adoptPageBoot(pinia)
    expect(document.getElementById(PAGE_BOOT_ID)).toBeNull()
    expect(useAuthStore(pinia)).toMatchObject({ checked: true, user: boot.user })

    const wrapper = await mountLakeRead(pinia, queryClient)
    expect(wrapper.find('h1').text()).toBe('Served Pond')
    // The angler's own units, from the same boot data.
    expect(wrapper.text()).toContain('20.0 °C')
    expect(fetch).not.toHaveBeenCalled()
    queryClient.clear()
  })
})
