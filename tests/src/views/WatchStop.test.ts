import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia } from 'pinia'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { createMemoryHistory, createRouter } from 'vue-router'
import WatchStopView from '@/views/WatchStopView.vue'

afterEach(() => vi.unstubAllGlobals())

/** The stop page at `/watch/stop?token=…`, with the API answering `answer`. */
async function openStopLink(token: string, answer: () => Response) {
  const fetch = vi.fn(async (_url: string, _init?: RequestInit) => answer())
  vi.stubGlobal('fetch', fetch)
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/watch/stop', component: WatchStopView },
      { path: '/watches', component: { render: () => null } },
    ],
  })
  await router.push({ path: '/watch/stop', query: { token } })
  const cache = new QueryClient({ defaultOptions: { mutations: { retry: false } } })
  const wrapper = mount(WatchStopView, {
    global: { plugins: [createPinia(), router, [VueQueryPlugin, { queryClient: cache }]] },
  })
  await flushPromises()
  return { wrapper, fetch }
}

describe('the stop link of a watch alert', () => {
  it('pauses the watch its token names, with no sign-in, and says so', async () => {
    const { wrapper, fetch } = await openStopLink(
      'signed.token',
      () => new Response(null, { status: 204 }),
    )
    expect(fetch).toHaveBeenCalledTimes(1)
    const [url, init] = fetch.mock.calls[0]!
    expect(url).toBe('/api/watch/unsubscribe?token=signed.token')
    expect(init?.method).toBe('POST')
    expect(wrapper.text()).toContain('The watch is paused')
    expect(wrapper.text()).toContain('No more alerts will come from it.')
  })

  it("shows the server's reason when the link cannot be used, and where to go instead", async () => {
    const { wrapper } = await openStopLink('old.token', () =>
      Response.json(
        { error: { code: 'invalid_link', message: 'This link has expired.' } },
        { status: 400 },
      ),
    )
    expect(wrapper.text()).toContain('The watch could not be paused')
    expect(wrapper.text()).toContain('This link has expired.')
    expect(wrapper.find('a[href="/watches"]').exists()).toBe(true)
  })
})
