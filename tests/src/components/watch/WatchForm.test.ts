import { flushPromises } from '@vue/test-utils'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { compileWatch } from '@shared/conditions/watch'
import { WatchConditions, type WatchInput } from '@shared/schemas/watch'
import { ApiError } from '@/api/http'
import WatchForm from '@/components/watch/WatchForm.vue'
import { conditionWords } from '@/components/watch/words'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'

const BANK = '00000000-0000-4000-8000-0000000000b1'

beforeEach(() => {
  vi.stubGlobal('fetch', async (url: string) =>
    Response.json(
      url.includes('/lakes/names')
        ? { items: [{ slug: 'quiet-pond', name: 'Quiet Pond' }] }
        : { items: [{ id: BANK, name: 'Rocky point' }] },
    ),
  )
})
afterEach(() => vi.unstubAllGlobals())

/** Mounts the form on Quiet Pond's Rocky point, types a name and a wind range, and sends it. */
async function sendRange(
  settings: typeof IMPERIAL,
  min: string,
  max: string,
  initial: Partial<WatchInput> = { lakeSlug: 'quiet-pond', bankId: BANK },
) {
  const submit = vi.fn<(w: WatchInput) => Promise<void>>(async () => undefined)
  const wrapper = mountAs(settings, WatchForm, { props: { initial, submit } })
  await flushPromises()
  await wrapper.get('input#watch-name').setValue('Wind on the point')
  await wrapper.get('input#watch-min').setValue(min)
  await wrapper.get('input#watch-max').setValue(max)
  await wrapper.get('form').trigger('submit')
  await vi.waitFor(() => expect(submit).toHaveBeenCalledOnce())
  return { wrapper, sent: submit.mock.calls[0]![0] }
}

describe('WatchForm', () => {
  it('takes “8 to 20 mph” onto the bank in mph and it is judged as the same speeds in m/s', async () => {
    const { wrapper, sent } = await sendRange(IMPERIAL, '8', '20')
    expect(wrapper.text()).toContain('Wind at least (mph)')
    expect(wrapper.text()).toContain('Wind at most (mph)')
    expect(sent).toMatchObject({
      name: 'Wind on the point',
      lakeSlug: 'quiet-pond',
      bankId: BANK,
      conditions: { wind: { onto: true, min: 8, max: 20, unit: 'mph' }, notNoGo: true },
      channels: ['email'],
    })
    // What the matcher compares a window's wind with: 1 mph = 0.44704 m/s exactly (NIST SP 811,
    // appendix B.9), half a mph either side as the angler reads speeds rounded: 7.5 and 20.5 mph.
    const wind = compileWatch(WatchConditions.parse(sent.conditions)).wind!
    expect(wind.minMs).toBeCloseTo(3.3528, 4)
    expect(wind.maxMs).toBeCloseTo(9.16432, 4)
  })

  it('takes the range in km/h for a metric angler, and shows no mph', async () => {
    const { wrapper, sent } = await sendRange(METRIC, '13', '32')
    expect(wrapper.text()).toContain('Wind at least (km/h)')
    expect(wrapper.text()).not.toContain('mph')
    expect(sent.conditions.wind).toEqual({ onto: true, min: 13, max: 32, unit: 'kmh' })
    // 1 km/h = 1000 m / 3600 s (SI Brochure, 9th ed., table 8: km and h): 12.5 and 32.5 km/h.
    const wind = compileWatch(WatchConditions.parse(sent.conditions)).wind!
    expect(wind.minMs).toBeCloseTo(12.5 / 3.6, 4)
    expect(wind.maxMs).toBeCloseTo(32.5 / 3.6, 4)
  })

  it('keeps the unit a watch was set in when a metric angler changes it', async () => {
    const initial: WatchInput = {
      name: 'Old watch',
      lakeSlug: 'quiet-pond',
      bankId: null,
      conditions: {
        wind: { onto: false, min: 5, max: 12, unit: 'mph' },
        clarity: ['stained'],
        phases: [],
        windows: [],
        notNoGo: true,
        daysAhead: 3,
      },
      channels: ['push'],
      active: false,
    }
    const { wrapper, sent } = await sendRange(METRIC, '6', '12', initial)
    expect(wrapper.text()).toContain('Wind at least (mph)')
    expect(sent).toMatchObject({
      conditions: {
        wind: { onto: false, min: 6, max: 12, unit: 'mph' },
        clarity: ['stained'],
        daysAhead: 3,
      },
      channels: ['push'],
      active: false,
    })
  })

  it('puts the server’s field messages on their fields', async () => {
    const submit = vi.fn(async () => {
      throw new ApiError(400, 'invalid_input', 'Some fields need attention.', {
        'conditions.wind.max': 'The top of the range is below its bottom.',
        channels: 'Confirm your address first to be told by e-mail.',
      })
    })
    const wrapper = mountAs(IMPERIAL, WatchForm, {
      props: { initial: { lakeSlug: 'quiet-pond', bankId: BANK }, submit },
    })
    await flushPromises()
    await wrapper.get('input#watch-name').setValue('Wind on the point')
    await wrapper.get('input#watch-min').setValue('8')
    await wrapper.get('input#watch-max').setValue('20')
    await wrapper.get('form').trigger('submit')
    await vi.waitFor(() => expect(submit).toHaveBeenCalledOnce())
    await flushPromises()
    const item = (label: string) =>
      wrapper.findAll('.n-form-item').find((i) => i.text().includes(label))!
    expect(item('Wind at most').text()).toContain('The top of the range is below its bottom.')
    expect(item('Tell me by').text()).toContain('Confirm your address first')
    expect(item('Name').text()).not.toContain('Confirm')
  })

  it('asks for a speed before sending a range left empty', async () => {
    const submit = vi.fn(async () => undefined)
    const wrapper = mountAs(IMPERIAL, WatchForm, {
      props: { initial: { lakeSlug: 'quiet-pond' }, submit },
    })
    await flushPromises()
    await wrapper.get('input#watch-name').setValue('Lake wind')
    await wrapper.get('form').trigger('submit')
    await flushPromises()
    await vi.waitFor(() => expect(wrapper.text()).toContain('Type a speed in mph.'))
    expect(submit).not.toHaveBeenCalled()
  })
})

describe('a watch in words', () => {
  it('says what it waits for with labels, never keys', () => {
    const words = conditionWords({
      wind: { onto: true, min: 8, max: 20, unit: 'kmh' },
      clarity: ['stained', 'lightly-stained'],
      phases: ['pre-spawn'],
      windows: ['dawn'],
      notNoGo: true,
      daysAhead: 3,
    }).join(' · ')
    expect(words).toBe(
      'wind 8 to 20 km/h onto the bank · stained or lightly stained water · pre-spawn · dawn to mid-morning · not a no-go · the next 3 days',
    )
  })
})
