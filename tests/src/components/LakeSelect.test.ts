import { flushPromises } from '@vue/test-utils'
import { NSelect } from 'naive-ui'
import { afterEach, describe, expect, it, vi } from 'vitest'
import LakeSelect from '@/components/LakeSelect.vue'
import { IMPERIAL, mountAs } from './mountAs'

afterEach(() => vi.unstubAllGlobals())

describe('LakeSelect', () => {
  it('names its field, says it is loading, then offers every lake by name', async () => {
    let answer!: (r: Response) => void
    vi.stubGlobal('fetch', () => new Promise<Response>((resolve) => (answer = resolve)))
    const wrapper = mountAs(IMPERIAL, LakeSelect, { props: { value: null } })
    // Named on the field, and below on its search box where it has one (`filterable`).
    expect(wrapper.attributes('aria-label')).toBe('Lake')
    expect(wrapper.findComponent(NSelect).props('loading')).toBe(true)
    answer(Response.json({ items: [{ slug: 'quiet-pond', name: 'Quiet Pond' }] }))
    await flushPromises()
    expect(wrapper.findComponent(NSelect).props('loading')).toBe(false)
    expect(wrapper.text()).toContain('Choose a lake')
    await wrapper.setProps({ value: 'quiet-pond' })
    expect(wrapper.text()).toContain('Quiet Pond')
    const searchable = mountAs(IMPERIAL, LakeSelect, { props: { value: null, filterable: true } })
    expect(searchable.find('input').attributes('aria-label')).toBe('Lake')
  })

  it('says in the field when the lakes could not be loaded', async () => {
    vi.stubGlobal('fetch', async () =>
      Response.json({ error: { code: 'unavailable', message: 'Down.' } }, { status: 503 }),
    )
    const wrapper = mountAs(IMPERIAL, LakeSelect, { props: { value: null } })
    await vi.waitFor(async () => {
      await flushPromises()
      expect(wrapper.text()).toContain('The lakes could not be loaded: reload to try again')
    })
  })
})
