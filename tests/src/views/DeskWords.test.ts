import { flushPromises } from '@vue/test-utils'
import { NMessageProvider } from 'naive-ui'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import AdminAuditView from '@/views/AdminAuditView.vue'
import AdminQuarantineView from '@/views/AdminQuarantineView.vue'
import { METRIC, mountAs } from '../components/mountAs'

const at = '2026-04-10T18:05:00.000Z'
/** Answers each API path with its page of rows. */
function stubApi(pages: Record<string, unknown>) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string) => {
      const path = new URL(url, 'http://x').pathname
      return Response.json(pages[path] ?? { items: [], total: 0 })
    }),
  )
}
const inMessages = (view: object) =>
  defineComponent({ render: () => h(NMessageProvider, null, { default: () => h(view) }) })

afterEach(() => vi.unstubAllGlobals())

describe('the gauge desk in words', () => {
  it('shows a held reading by its reason and parameter, with buttons named for the reading', async () => {
    stubApi({
      '/api/admin/quarantine': {
        items: [
          {
            id: 3,
            station: { id: '00000000-0000-4000-8000-000000000003', name: 'Dam gauge' },
            lake: 'Quiet Pond',
            parameter: 'water_temp',
            observedAt: at,
            reason: 'rate_of_change',
            detail: 'rose 6 °C in 15 minutes',
            raw: { result: 21.5 },
            status: 'held',
            releasable: true,
          },
        ],
        total: 1,
        page: 1,
        pageSize: 25,
      },
    })
    const wrapper = mountAs(METRIC, inMessages(AdminQuarantineView), { role: 'admin' })
    await flushPromises()
    const text = wrapper.text()
    expect(text).toContain('Changed too fast')
    expect(text).toContain('Water temperature')
    expect(text).toContain('Held')
    expect(text).not.toMatch(/rate_of_change|water_temp|row 3/)
    const names = wrapper.findAll('button').map((b) => b.attributes('aria-label'))
    expect(names).toContain('Release Water temperature of Dam gauge at ' + fmt(at))
    expect(names).toContain('Discard Water temperature of Dam gauge at ' + fmt(at))
  })

  it('words each audit entry’s action and target', async () => {
    stubApi({
      '/api/admin/audit': {
        items: [
          {
            id: 1,
            at,
            actorEmail: 'admin@example.test',
            action: 'user.role',
            targetType: 'user',
            targetId: 'u-9',
            before: { role: 'angler' },
            after: { role: 'guide' },
          },
        ],
        total: 1,
        page: 1,
        pageSize: 25,
      },
    })
    const wrapper = mountAs(METRIC, AdminAuditView, { role: 'admin' })
    await flushPromises()
    const cells = wrapper.findAll('td').map((td) => td.text())
    expect(cells).toContain('Changed a role')
    expect(cells).toContain('User u-9')
    expect(cells).not.toContain('user.role')
  })
})

/** The metric reader's date and time, in the browser's zone, as the screen writes it. */
function fmt(iso: string) {
  return new Intl.DateTimeFormat('en-US', {
    year: 'numeric',
    month: 'short',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(new Date(iso))
}
