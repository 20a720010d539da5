import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import LakeReadView from '@/views/LakeReadView.vue'
import { sampleRead } from '../../helpers/lake-read-fixture'

const lake = {
  id: '00000000-0000-4000-8000-000000000001',
  slug: 'quiet-pond',
  name: 'Quiet Pond',
  region: 'Nowhere',
  timeZone: 'America/Chicago',
  normalPoolM: 100,
  areaKm2: 2,
  center: [-88, 35] as [number, number],
}

/** The Lake read at `now`, dusk at the lake at 19:45 local (00:45 UTC the next day). */
async function linkAt(now: string) {
  vi.useFakeTimers({ now: new Date(now), toFake: ['Date'] })
  const read = sampleRead(lake, '2026-05-06T15:00:00.000Z')
  read.sky.civilDusk = '2026-05-07T00:45:00.000Z'
  read.sky.sunset = '2026-05-07T00:17:00.000Z'
  vi.stubGlobal('fetch', async () => Response.json(read))
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/lakes/:slug', component: LakeReadView },
      { path: '/lakes/:slug/plan/:date', name: 'day-plan', component: { render: () => null } },
      { path: '/watches', name: 'watches', component: { render: () => null } },
    ],
  })
  await router.push('/lakes/quiet-pond')
  const wrapper = mount(LakeReadView, {
    global: {
      plugins: [createPinia(), router, [VueQueryPlugin, { queryClient: new QueryClient() }]],
      stubs: { WhenVisible: true },
    },
  })
  await flushPromises()
  return wrapper
}

afterEach(() => {
  vi.useRealTimers()
  vi.unstubAllGlobals()
})

describe('the Lake read’s link to the Day plan', () => {
  it('offers today’s plan during the day', async () => {
    const link = (await linkAt('2026-05-06T15:00:00.000Z')).get('a.plan-link') // 10:00 at the lake
    expect(link.text()).toBe("Today's day plan →")
    expect(link.attributes('href')).toBe('/lakes/quiet-pond/plan/2026-05-06')
  })

  it('offers tomorrow’s plan once dusk has passed at the lake', async () => {
    const link = (await linkAt('2026-05-07T02:30:00.000Z')).get('a.plan-link') // 21:30 on May 6 at the lake
    expect(link.text()).toBe("Tomorrow's day plan →")
    expect(link.attributes('href')).toBe('/lakes/quiet-pond/plan/2026-05-07')
  })
})

describe('the Lake read’s link to a watch', () => {
  it('starts a watch on this lake', async () => {
    const link = (await linkAt('2026-05-06T15:00:00.000Z')).get('a.watch-link')
    expect(link.text()).toBe('Watch this lake')
    expect(link.attributes('href')).toBe('/watches?lake=quiet-pond')
  })
})
