import { flushPromises } from '@vue/test-utils'
import { afterEach, describe, expect, it, vi } from 'vitest'
import type { Watch } from '@shared/schemas/watch'
import WatchesView from '@/views/WatchesView.vue'
import { IMPERIAL, METRIC, mountAs } from '../components/mountAs'

const WATCH: Watch = {
  id: '00000000-0000-4000-8000-0000000000c1',
  kind: 'angler',
  name: 'Wind on the point',
  lake: { slug: 'quiet-pond', name: 'Quiet Pond' },
  bank: { id: '00000000-0000-4000-8000-0000000000b1', name: 'Rocky point' },
  trip: null,
  conditions: {
    wind: { onto: true, min: 8, max: 20, unit: 'mph' },
    clarity: ['lightly-stained'],
    phases: ['early-pre-spawn'],
    windows: ['dawn'],
    notNoGo: true,
    daysAhead: 3,
  },
  channels: ['email', 'push'],
  active: true,
  createdAt: '2026-04-01T12:00:00.000Z',
  lastAlert: null,
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

/** The Watches page with the API answering `list` for the angler's watches. */
async function open(settings: typeof IMPERIAL, list: () => Response) {
  const fetch = vi.fn(async (url: string, init?: RequestInit) => {
    if (url.startsWith('/api/watches/') && init?.method === 'DELETE')
      return new Response(null, { status: 204 })
    if (url.startsWith('/api/watches/') && init?.method === 'PUT')
      return Response.json({ ...WATCH, ...JSON.parse(String(init.body)) })
    if (url.startsWith('/api/watches')) return list()
    if (url.startsWith('/api/lakes/names'))
      return Response.json({ items: [{ slug: 'quiet-pond', name: 'Quiet Pond' }] })
    return Response.json({ items: [{ id: WATCH.bank!.id, name: 'Rocky point' }] })
  })
  vi.stubGlobal('fetch', fetch)
  const wrapper = mountAs(settings, WatchesView, { props: {} })
  document.body.append(wrapper.element)
  await flushPromises()
  return { wrapper, fetch }
}

describe('the Watches page', () => {
  it('says what each watch waits for in words, in the unit it was set in', async () => {
    const { wrapper } = await open(METRIC, () => Response.json({ items: [WATCH] }))
    const text = wrapper.text()
    expect(text).toContain(
      'Waits for wind 8 to 20 mph onto the bank · lightly stained water · early pre-spawn · dawn to mid-morning · not a no-go · the next 3 days.',
    )
    expect(text).toContain('Tells you by e-mail and push on my devices.')
    for (const key of ['lightly-stained', 'early-pre-spawn', 'email', 'notNoGo', 'daysAhead'])
      expect(text).not.toContain(key)
  })

  it('changes a watch through its form and sends it whole', async () => {
    const { wrapper, fetch } = await open(IMPERIAL, () => Response.json({ items: [WATCH] }))
    await wrapper
      .findAll('button')
      .find((b) => b.text() === 'Change')!
      .trigger('click')
    await flushPromises()
    await wrapper.get('input#watch-max').setValue('25')
    await wrapper.get('form').trigger('submit')
    await vi.waitFor(() =>
      expect(fetch.mock.calls.some(([, init]) => init?.method === 'PUT')).toBe(true),
    )
    const [url, init] = fetch.mock.calls.find(([, i]) => i?.method === 'PUT')!
    expect(url).toBe(`/api/watches/${WATCH.id}`)
    expect(JSON.parse(String(init!.body))).toMatchObject({
      name: 'Wind on the point',
      lakeSlug: 'quiet-pond',
      bankId: WATCH.bank!.id,
      conditions: { wind: { onto: true, min: 8, max: 25, unit: 'mph' }, daysAhead: 3 },
      channels: ['email', 'push'],
    })
    await vi.waitFor(() => expect(wrapper.text()).toContain('Changed: Wind on the point.'))
  })

  it('deletes a watch once its deletion is confirmed', async () => {
    const { wrapper, fetch } = await open(IMPERIAL, () => Response.json({ items: [WATCH] }))
    await wrapper
      .findAll('button')
      .find((b) => b.text() === 'Delete')!
      .trigger('click')
    await flushPromises()
    expect(fetch.mock.calls.some(([, i]) => i?.method === 'DELETE')).toBe(false)
    const confirm = [...document.body.querySelectorAll('button')].find(
      (b) => b.textContent?.trim() === 'Confirm',
    )!
    confirm.click()
    await vi.waitFor(() =>
      expect(fetch.mock.calls.find(([, i]) => i?.method === 'DELETE')?.[0]).toBe(
        `/api/watches/${WATCH.id}`,
      ),
    )
  })

  it('says when there are none yet, and when they could not be loaded', async () => {
    const empty = await open(IMPERIAL, () => Response.json({ items: [] }))
    expect(empty.wrapper.text()).toContain('No watches yet.')
    empty.wrapper.unmount()
    const failed = await open(IMPERIAL, () =>
      Response.json({ error: { code: 'not_found', message: 'No such page.' } }, { status: 404 }),
    )
    await vi.waitFor(() =>
      expect(failed.wrapper.text()).toContain('Your watches could not be loaded'),
    )
    expect(failed.wrapper.text()).toContain('Try again')
  })
})
