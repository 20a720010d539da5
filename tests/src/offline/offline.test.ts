import { onlineManager } from '@tanstack/vue-query'
import { mount } from '@vue/test-utils'
import { nextTick } from 'vue'
import { afterEach, describe, expect, it } from 'vitest'
import { ApiError } from '@/api/http'
import NeedsConnection from '@/components/NeedsConnection.vue'
import OfflineMark from '@/components/OfflineMark.vue'
import { apiCacheName, API_CACHE_PREFIX, isOfflineReadable } from '@/offline/caches'
import { answeredAt, online } from '@/offline/network'
import { retryUnlessClientError } from '@/queryClient'
import { IMPERIAL, METRIC, mountAs } from '../components/mountAs'

afterEach(() => {
  online.value = true
  onlineManager.setOnline(true)
  answeredAt.clear()
})

/** Today at 05:12 on this machine's clock, as the server's Date header would have it. */
function savedThisMorning() {
  const at = new Date()
  at.setHours(5, 12, 0, 0)
  return at.getTime()
}

describe('the offline mark', () => {
  it('says nothing online', () => {
    answeredAt.set('/lakes/quillmere/read', savedThisMorning())
    const w = mountAs(IMPERIAL, OfflineMark, { props: { path: '/lakes/quillmere/read' } })
    expect(w.text()).toBe('')
  })

  it("says when the answer shown was saved, offline, on the user's clock", async () => {
    answeredAt.set('/lakes/quillmere/read', savedThisMorning())
    online.value = false
    const twelve = mountAs(IMPERIAL, OfflineMark, { props: { path: '/lakes/quillmere/read' } })
    expect(twelve.text()).toMatch(/^Saved at 5:12\sAM, offline/)
    expect(twelve.text()).toContain('Readings may have changed since.')
    const day = mountAs(METRIC, OfflineMark, { props: { path: '/lakes/quillmere/read' } })
    expect(day.text()).toMatch(/^Saved at 05:12, offline/)
    online.value = true
    await nextTick()
    expect(twelve.text()).toBe('')
  })

  it('names the day when the answer is older than today', () => {
    answeredAt.set('/lakes/quillmere/read', savedThisMorning() - 2 * 86_400_000)
    online.value = false
    const w = mountAs(IMPERIAL, OfflineMark, { props: { path: '/lakes/quillmere/read' } })
    expect(w.text()).toMatch(/^Saved [A-Z][a-z]{2} \d{1,2}, \d{4}, 5:12\sAM, offline /)
  })
})

describe('forms offline', () => {
  it('say they need a connection only while offline', async () => {
    const w = mount(NeedsConnection)
    expect(w.text()).toBe('')
    online.value = false
    await nextTick()
    expect(w.text()).toMatch(/^Saving needs a connection/)
  })
})

describe('what the service worker keeps', () => {
  it('keeps the answers read at the ramp, and nothing else', () => {
    for (const path of [
      '/api/me',
      '/api/me/settings',
      '/api/lakes',
      '/api/lakes/quillmere/read',
      '/api/lakes/quillmere/plan/2026-04-14',
      '/api/lakes/quillmere/banks',
      '/api/lakes/quillmere/shoreline',
      '/api/shared/trips/abc.def',
    ])
      expect(isOfflineReadable(path), path).toBe(true)
    for (const path of [
      '/api/admin/mailbox',
      '/api/journal/catches',
      '/api/lakes/quillmere/series',
      '/api/me/brief',
      '/api/auth/signin',
    ])
      expect(isOfflineReadable(path), path).toBe(false)
  })

  it('names the API cache after the build, so two builds never share answers', () => {
    const one = apiCacheName([{ url: 'index.html', revision: 'a1' }, 'assets/index-Ab12.js'])
    const again = apiCacheName([{ url: 'index.html', revision: 'a1' }, 'assets/index-Ab12.js'])
    const two = apiCacheName([{ url: 'index.html', revision: 'b2' }, 'assets/index-Cd34.js'])
    expect(one.startsWith(API_CACHE_PREFIX)).toBe(true)
    expect(one).toBe(again)
    expect(two).not.toBe(one)
  })

  it('does not retry a failed request while offline: the page says so and refetches later', () => {
    const failed = new ApiError(0, 'offline', 'Chopline cannot be reached.')
    expect(retryUnlessClientError(0, failed)).toBe(true)
    onlineManager.setOnline(false)
    expect(retryUnlessClientError(0, failed)).toBe(false)
  })
})
