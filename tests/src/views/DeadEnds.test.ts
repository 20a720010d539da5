import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import { ApiError } from '@/api/http'
import { settingsQuery } from '@/api/settings'
import { outsideSentence, plannableDates, whenIs } from '@/components/plan/planDates'
import LakeCharts from '@/components/lake/LakeCharts.vue'
import { queryClient as appQueryClient, retryUnlessClientError } from '@/queryClient'
import { DEFAULT_SETTINGS } from '@shared/format'
import DayPlanView from '@/views/DayPlanView.vue'
import LakeReadView from '@/views/LakeReadView.vue'
import { sampleRead } from '../../helpers/lake-read-fixture'
import { IMPERIAL, mountAs } from '../components/mountAs'

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
const NOW = '2026-05-06T15:00:00.000Z' // Wed, May 6, 10:00 at the lake

/** Each API path answered by a function of its calls so far; counts every call. */
function stubApi(routes: Record<string, () => Response>) {
  const fetch = vi.fn(async (url: string) => {
    const path = new URL(url, 'http://x').pathname
    const answer = routes[path]
    return answer
      ? answer()
      : Response.json({ error: { code: 'x', message: path } }, { status: 500 })
  })
  vi.stubGlobal('fetch', fetch)
  return fetch
}
const error = (status: number, code: string, message: string) => () =>
  Response.json({ error: { code, message } }, { status })

async function mountPage(path: string, component: object, cache: QueryClient) {
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/lakes', name: 'lakes', component: { render: () => null } },
      { path: '/lakes/:slug', name: 'lake-read', component: LakeReadView },
      { path: '/lakes/:slug/plan/:date', name: 'day-plan', component: DayPlanView },
    ],
  })
  await router.push(path)
  return mount(component, {
    global: {
      plugins: [createPinia(), router, [VueQueryPlugin, { queryClient: cache }]],
      stubs: { WhenVisible: true },
    },
  })
}

afterEach(() => {
  vi.unstubAllGlobals()
  vi.useRealTimers()
  appQueryClient.clear()
})

describe('retrying', () => {
  it('never asks again after a client error, but does after a server or network failure', () => {
    expect(retryUnlessClientError(0, new ApiError(404, 'not_found', 'No such lake.'))).toBe(false)
    expect(retryUnlessClientError(0, new ApiError(400, 'invalid', 'Not a date.'))).toBe(false)
    expect(retryUnlessClientError(0, new ApiError(403, 'forbidden', 'No.'))).toBe(false)
    expect(retryUnlessClientError(0, new ApiError(500, 'internal', 'Oops.'))).toBe(true)
    expect(retryUnlessClientError(0, new ApiError(0, 'offline', 'Offline.'))).toBe(true)
    expect(retryUnlessClientError(0, new ApiError(429, 'slow_down', 'Later.'))).toBe(true)
    expect(retryUnlessClientError(3, new ApiError(500, 'internal', 'Oops.'))).toBe(false)
  })

  it('tells of an unknown lake at once, asking the server once, with the app’s own query cache', async () => {
    const fetch = stubApi({ '/api/lakes/nowhere/read': error(404, 'not_found', 'No such lake.') })
    const started = Date.now()
    const wrapper = await mountPage('/lakes/nowhere', LakeReadView, appQueryClient)
    await vi.waitFor(() => expect(wrapper.text()).toContain('There is no lake at this address'))
    expect(Date.now() - started).toBeLessThan(900)
    expect(fetch).toHaveBeenCalledTimes(1)
    expect(wrapper.find('.loading-bars').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('Try again')
  })
})

describe('a Day plan for a date outside the plans', () => {
  async function planFor(date: string) {
    vi.useFakeTimers({ now: new Date(NOW), toFake: ['Date'] })
    const fetch = stubApi({
      [`/api/lakes/quiet-pond/plan/${date}`]: error(
        404,
        'no_plan_for_date',
        'Plans cover yesterday, today and the next 6 days.',
      ),
      '/api/lakes/quiet-pond/read': () => Response.json(sampleRead(lake, NOW)),
    })
    const cache = new QueryClient({
      defaultOptions: { queries: { retry: retryUnlessClientError } },
    })
    cache.setQueryData(settingsQuery.queryKey, DEFAULT_SETTINGS)
    const wrapper = await mountPage(`/lakes/quiet-pond/plan/${date}`, DayPlanView, cache)
    await vi.waitFor(() => expect(wrapper.text()).toContain('No plan for this day'))
    await flushPromises()
    return { wrapper, fetch }
  }

  it('says why at once and keeps the strip of days that do have plans', async () => {
    const { wrapper, fetch } = await planFor('2026-06-12')
    expect(wrapper.text()).toContain('Friday, June 12 is next month.')
    expect(wrapper.find('h1').text()).toBe('Day plan · Quiet Pond')
    const days = wrapper.findAll('nav[aria-label="Days"] a').map((a) => a.text())
    expect(days[0]).toBe('Tue, May 5')
    expect(days.at(-1)).toBe('Tue, May 12')
    expect(days).toHaveLength(8)
    // The plan was asked for once: a 404 is not retried.
    const planCalls = fetch.mock.calls.filter(([url]) => String(url).includes('/plan/'))
    expect(planCalls).toHaveLength(1)
  })

  it('words a past date as past', async () => {
    const { wrapper } = await planFor('2026-05-03')
    expect(wrapper.text()).toContain('Sunday, May 3 was 3 days ago.')
  })
})

describe('whenIs', () => {
  it.each([
    ['2026-05-05', 'yesterday'],
    ['2026-05-07', 'tomorrow'],
    ['2026-05-15', 'in 9 days'],
    ['2026-04-20', 'last month'],
    ['2026-06-30', 'next month'],
    ['2026-05-28', 'later this month'],
    ['2026-09-01', 'in September 2026'],
    ['2025-12-24', 'back in December 2025'],
  ])('%s from Wed, May 6 is %s', (date, words) => {
    expect(whenIs(date, '2026-05-06')).toBe(words)
  })

  it('knows a date that does not exist', () => {
    expect(outsideSentence('2026-02-30', '2026-05-06')).toBe('“2026-02-30” is not a date.')
    expect(plannableDates('2026-05-06')).toHaveLength(8)
  })
})

describe('the charts panel', () => {
  it('offers a retry when its load fails, and shows the answer after', async () => {
    const answers = [
      error(500, 'internal', 'The server is busy.')(),
      Response.json({
        hours: [],
        waterC: [],
        secchiM: [],
        gaugeM: [],
        windMs: [],
        gustMs: [],
        precipitationMm: [],
      }),
    ]
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => answers.shift()!),
    )
    const wrapper = mountAs(IMPERIAL, LakeCharts, {
      props: { slug: 'quiet-pond', timeZone: 'UTC' },
    })
    await vi.waitFor(() => expect(wrapper.text()).toContain('Charts could not be loaded'))
    expect(wrapper.text()).toContain('The server is busy.')
    const retry = wrapper.findAll('button').find((b) => b.text() === 'Try again')!
    await retry.trigger('click')
    await vi.waitFor(() => expect(wrapper.text()).toContain('No readings in this period yet.'))
  })
})
