import { describe, expect, it } from 'vitest'
import type { SharedTrip } from '@shared/schemas/guides'
import TripPlan from '@/components/guide/TripPlan.vue'
import { IMPERIAL, mountAs } from '../mountAs'
import { boxLakePlan, WEST_LAYDOWNS, westWindDay } from '../plan-day'

// A moderate dawn, then 13 m/s (gusts 18) from the west from 10:00 to the evening.
const plan = boxLakePlan({
  hours: westWindDay((h) => (h >= 10 ? { windMs: 13, gustMs: 18 } : {})),
  banks: [{ ...WEST_LAYDOWNS, depthM: 2 }],
  waterC: 15,
  secchiM: 0.5,
  phase: 'pre-spawn',
})
const trip: SharedTrip = {
  lake: { name: 'Boxwater Reservoir', timeZone: 'America/Chicago' },
  date: '2026-04-10',
  meetingPoint: 'South ramp',
  meetingTime: '05:45',
  tackle: '',
  notes: '',
  banks: [{ id: 'w', name: 'West laydowns' }],
  plan,
  unavailable: null,
  cautions: plan.cautions,
  computedAt: null,
  guide: { name: 'Jory Wend', phone: '+1 555 0142', email: 'trips@wend.test' },
  linkEndsOn: '2026-04-11',
}

describe('TripPlan, as the client reads it', () => {
  it('names the guide and how to reach them', () => {
    const wrapper = mountAs(IMPERIAL, TripPlan, { props: { trip } })
    const guide = wrapper.find('.guide')
    expect(guide.text()).toBe('Jory Wend · +1 555 0142 · trips@wend.test')
    expect(guide.find('a[href="tel:+15550142"]').exists()).toBe(true)
    expect(guide.find('a[href="mailto:trips@wend.test"]').exists()).toBe(true)
    expect(
      mountAs(IMPERIAL, TripPlan, { props: { trip: { ...trip, guide: null } } }).text(),
    ).not.toContain('Guide')
  })

  it('gives the day’s no-go with its reason, in words and shape (WMO Beaufort force 6)', () => {
    const day = mountAs(IMPERIAL, TripPlan, { props: { trip } }).find('.verdict')
    expect(day.classes()).toContain('verdict-no-go')
    expect(day.find('.shape').text()).toBe('✕')
    // 13 m/s is 29 mph, 18 m/s 40 mph (NIST SP 811).
    expect(day.text()).toMatch(/^✕\s*The day: No-go: do not launch/)
    expect(day.text()).toContain('Midday and afternoon to dusk: Wind 29 mph, gusts 40 mph')
  })

  it('gives each hazard one line that names its windows', () => {
    const band = mountAs(IMPERIAL, TripPlan, { props: { trip } }).find(
      '[aria-label="Cautions for the day"]',
    )
    const lines = band.findAll('li').map((li) => li.text())
    expect(lines.filter((l) => /Wind \d+ mph/.test(l))).toEqual([
      expect.stringMatching(/^Danger: Midday and afternoon to dusk: Wind 29 mph, gusts 40 mph\./),
    ])
    expect(lines.filter((l) => /Waves to/.test(l))).toHaveLength(1)
    expect(lines.at(-1)).toMatch(/boating law/)
  })

  it('opens only the leading tackle call of a fishing window, for print to show it and leave out the rest', () => {
    const wrapper = mountAs(IMPERIAL, TripPlan, { props: { trip } })
    const dawn = wrapper.find('[aria-labelledby="window-dawn"]')
    const calls = dawn.findAll('.tackle-call details')
    expect(calls.length).toBeGreaterThan(1)
    expect(calls.map((d) => d.attributes('open') !== undefined)).toEqual([
      true,
      ...calls.slice(1).map(() => false),
    ])
    const midday = wrapper.find('[aria-labelledby="window-midday"]')
    expect(midday.text()).toContain('Do not launch in this window')
    expect(midday.findAll('.tackle-call')).toHaveLength(0)
  })
})
