import { flushPromises } from '@vue/test-utils'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import CatchForm from '@/components/journal/CatchForm.vue'
import { online } from '@/offline/network'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/

beforeEach(() => {
  // naive-ui's radio buttons ask for the screen's breakpoints, which jsdom has none of.
  vi.stubGlobal('matchMedia', (query: string) => ({
    matches: false,
    media: query,
    addEventListener: () => undefined,
    removeEventListener: () => undefined,
    addListener: () => undefined,
    removeListener: () => undefined,
  }))
})
afterEach(() => {
  online.value = true
  vi.unstubAllGlobals()
})

/** The form on a guide's trip, with its lists answering nothing (no server here). */
function tripForm(settings = IMPERIAL) {
  vi.stubGlobal('fetch', () => Promise.reject(new TypeError('no network')))
  const submit = vi.fn(() => Promise.resolve())
  const wrapper = mountAs(settings, CatchForm, {
    props: { submit, trip: { id: '11111111-1111-4111-8111-111111111111', lakeSlug: 'quillmere' } },
  })
  return { wrapper, submit }
}

async function fill(wrapper: ReturnType<typeof tripForm>['wrapper'], length: string) {
  const lengthInput = wrapper.find('input[aria-label="Length"]')
  await lengthInput.setValue(length)
  await lengthInput.trigger('blur')
}

describe('the catch form', () => {
  it('offline, says the catch is saved on the phone and hands it over with its id, not refusing it', async () => {
    online.value = false
    const { wrapper, submit } = tripForm()
    expect(wrapper.text()).toContain("Saved on this phone; will send when you're back online.")
    expect(wrapper.text()).not.toContain('Saving needs a connection')
    const button = wrapper.find('button[type="submit"]')
    expect(button.attributes('disabled')).toBeUndefined()

    await fill(wrapper, '16')
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect(submit).toHaveBeenCalledTimes(1)
    const [input, photo] = submit.mock.calls[0] as unknown as [Record<string, unknown>, unknown]
    expect(input).toMatchObject({
      lakeSlug: 'quillmere',
      tripId: '11111111-1111-4111-8111-111111111111',
    })
    // 16 in is 0.4064 m (1 in = 25.4 mm exactly, NIST SP 811).
    expect(input.lengthM).toBeCloseTo(0.4064, 4)
    expect(input.clientId).toMatch(UUID)
    expect(photo).toBeNull()

    // Sent again from the same form (the first answer was lost), it carries the same id.
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect((submit.mock.calls[1] as unknown as [{ clientId: string }])[0].clientId).toBe(
      input.clientId,
    )
  })

  it("online, says nothing about the phone, and reads lengths in the angler's units", async () => {
    const { wrapper, submit } = tripForm(METRIC)
    expect(wrapper.text()).not.toContain('Saved on this phone')
    await fill(wrapper, '41')
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    const [input] = submit.mock.calls[0] as unknown as [{ lengthM: number; clientId: string }]
    expect(input.lengthM).toBeCloseTo(0.41, 4)
    expect(input.clientId).toMatch(UUID)
  })
})
