import { flushPromises } from '@vue/test-utils'
import { NMessageProvider, NSelect } from 'naive-ui'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import type { RecomputeStatus } from '@shared/schemas/desk'
import ShorelineUpload from '@/components/desk/ShorelineUpload.vue'
import AdminLakesView from '@/views/AdminLakesView.vue'
import { METRIC, mountAs } from '../components/mountAs'

const running: RecomputeStatus = {
  total: 40,
  done: 3,
  detached: 0,
  startedAt: '2026-04-10T18:05:00.000Z',
  finishedAt: null,
  error: null,
}

/** The desk's API for one lake; the recompute answers come from `next`, and are counted. */
function stubApi(next: () => RecomputeStatus) {
  const polls = { count: 0 }
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init: RequestInit) => {
      const path = new URL(url, 'http://x').pathname
      if (path === '/api/lakes/names')
        return Response.json({ items: [{ slug: 'quiet-pond', name: 'Quiet Pond' }] })
      if (path === '/api/admin/lakes/quiet-pond')
        return Response.json({
          slug: 'quiet-pond',
          name: 'Quiet Pond',
          region: 'Test County',
          timeZone: 'America/Chicago',
          normalPoolM: 120,
        })
      if (path === '/api/admin/lakes/quiet-pond/shoreline' && init.method === 'POST')
        return Response.json(running, { status: 202 })
      if (path === '/api/admin/lakes/quiet-pond/recompute') {
        polls.count++
        return Response.json(next())
      }
      return Response.json({ error: { code: 'not_found', message: path } }, { status: 404 })
    }),
  )
  return polls
}

const page = defineComponent({
  render: () => h(NMessageProvider, null, { default: () => h(AdminLakesView) }),
})
const wait = (ms: number) => new Promise((r) => setTimeout(r, ms))

/** Mounts the desk's Lakes screen, picks the lake and confirms a new outline. */
async function replaceOutline() {
  const wrapper = mountAs(METRIC, page, { role: 'admin' })
  await flushPromises()
  wrapper.findComponent(NSelect).vm.$emit('update:value', 'quiet-pond')
  await flushPromises()
  await vi.waitFor(() => expect(wrapper.findComponent(ShorelineUpload).exists()).toBe(true))
  wrapper.findComponent(ShorelineUpload).vm.$emit('confirm', new File(['{}'], 'outline.geojson'))
  await flushPromises()
  return wrapper
}

afterEach(() => vi.unstubAllGlobals())

describe('the outline recompute on the desk', { timeout: 10_000 }, () => {
  it('polls while the banks are recomputed and stops when the admin leaves', async () => {
    const polls = stubApi(() => running)
    const wrapper = await replaceOutline()
    await vi.waitFor(() => expect(polls.count).toBeGreaterThanOrEqual(2), { timeout: 3000 })
    expect(wrapper.text()).toContain('3 of 40 banks recomputed')
    wrapper.unmount()
    const after = polls.count
    await wait(1200)
    expect(polls.count).toBe(after)
  })

  it('stops polling once the recompute has finished, and says so', async () => {
    let n = 0
    const polls = stubApi(() =>
      ++n < 2
        ? { ...running, done: 20 }
        : { ...running, done: 40, detached: 1, finishedAt: '2026-04-10T18:06:00.000Z' },
    )
    const wrapper = await replaceOutline()
    await vi.waitFor(() => expect(wrapper.text()).toContain('40 of 40 banks recomputed'), {
      timeout: 3000,
    })
    expect(wrapper.text()).toContain('1 left off the new shore')
    expect(document.body.textContent).toContain('Outline replaced and banks recomputed.')
    const after = polls.count
    await wait(1200)
    expect(polls.count).toBe(after)
    wrapper.unmount()
  })
})
