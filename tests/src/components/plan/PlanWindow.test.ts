import { describe, expect, it } from 'vitest'
import { makeFormat } from '@shared/format'
import PlanWindow from '@/components/plan/PlanWindow.vue'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'
import { boxLakePlan, EAST_ROCKS, westWindDay } from '../plan-day'

// Calm, cold dawn; two hours of a 13 m/s blow at midday; a slight chance of storms after.
const plan = boxLakePlan({
  hours: westWindDay((h) => ({
    windMs: h === 10 || h === 11 ? 13 : 3,
    gustMs: h === 10 || h === 11 ? 18 : 5,
    thunderstormProbabilityPct: h > 14 ? 17 : 0,
  })),
  banks: [EAST_ROCKS],
  waterC: 9.9,
  secchiM: 0.5,
  phase: 'pre-spawn',
})
const windowOf = (id: string) => plan.windows.find((w) => w.id === id)!
const f = makeFormat()

describe('PlanWindow', () => {
  it('shows every caution of its window, in the reader’s units, without being asked to (1-10-1; WMO Beaufort)', () => {
    for (const w of plan.windows) {
      const text = mountAs(IMPERIAL, PlanWindow, {
        props: { window: w, timeZone: 'America/Chicago', banksSaved: 1 },
      }).text()
      const shown = w.cautions.filter((c) => c.kind !== 'authority')
      expect(shown.length).toBeGreaterThan(0)
      for (const c of shown) expect(text).toContain(f.caution(c).message)
    }
  })

  it('says plainly not to launch in a no-go window and ranks no banks there', () => {
    const wrapper = mountAs(IMPERIAL, PlanWindow, {
      props: { window: windowOf('midday'), timeZone: 'America/Chicago', banksSaved: 1 },
    })
    expect(wrapper.find('.verdict-no-go').text()).toContain('No-go: do not launch')
    expect(wrapper.text()).toContain('Wind 29 mph, gusts 40 mph')
    // The window's mean wind, and the strongest hour its cautions were judged on.
    expect(wrapper.find('.weather').text()).toMatch(/^\d+ mph, up to 29 mph from W/)
    // The arrow and the words are the line's only flex items: no gap opens inside the words.
    expect(wrapper.find('.weather').element.children).toHaveLength(2)
    expect(wrapper.text()).toContain('Do not launch in this window')
    expect(wrapper.find('.banks').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('East rocks')
  })

  it('gives the verdict in words and shape on a fishing window, with its banks and tackle', () => {
    const wrapper = mountAs(IMPERIAL, PlanWindow, {
      props: { window: windowOf('dawn'), timeZone: 'America/Chicago', banksSaved: 1 },
    })
    // 9.9 °C water is under 50 °F: a cold-water warning makes the window a caution.
    expect(wrapper.find('.verdict-caution .shape').text()).toBe('!')
    expect(wrapper.find('.verdict-caution').text()).toContain('Go with caution')
    expect(wrapper.find('.verdict-caution').text()).toContain('Water 49.8 °F')
    expect(wrapper.find('.banks').text()).toContain('East rocks')
    // A steady window has one wind to say.
    expect(wrapper.find('.weather').text()).not.toContain('up to')
  })

  it('says a cold front has passed, with the pressure in the reader’s units (NIST SP 811: 1 inHg = 33.8638 hPa)', () => {
    const dawn = windowOf('dawn')
    const window = {
      ...dawn,
      weather: {
        ...dawn.weather!,
        coldFront: 'Pressure fell 4.2 hPa, then rose 3.4 hPa, with the wind now from 315°.',
      },
    }
    const props = { window, timeZone: 'America/Chicago', banksSaved: 1 }
    const imperial = mountAs(IMPERIAL, PlanWindow, { props }).find('.front').text()
    expect(imperial).toContain('After a cold front: Pressure fell 0.12 inHg, then rose 0.10 inHg')
    expect(mountAs(METRIC, PlanWindow, { props }).find('.front').text()).toContain(
      'Pressure fell 4.2 hPa, then rose 3.4 hPa',
    )
    // No front, no line.
    expect(
      mountAs(IMPERIAL, PlanWindow, { props: { ...props, window: dawn } })
        .find('.front')
        .exists(),
    ).toBe(false)
  })

  it('leaves the cautions to the page when it says so', () => {
    const wrapper = mountAs(IMPERIAL, PlanWindow, {
      props: {
        window: windowOf('dawn'),
        timeZone: 'America/Chicago',
        banksSaved: 1,
        showCautions: false,
      },
    })
    expect(wrapper.find('.caution-band').exists()).toBe(false)
  })
})
