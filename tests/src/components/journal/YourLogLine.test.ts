import { RouterLinkStub } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import type { YourLog } from '@shared/journal/feedback'
import YourLogLine from '@/components/journal/YourLogLine.vue'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'

const log: YourLog = {
  count: 7,
  of: 9,
  familyCount: 8,
  family: 'spinnerbait',
  blade: 'colorado',
  clarity: 'stained',
  phase: 'pre-spawn',
  waterBandC: [10, 15],
  timeOfDay: null,
  leads: true,
}
const stubs = { RouterLink: RouterLinkStub }

describe("the log's line beside the tackle calls", () => {
  it('reads the water band in °F, says the call moved first, and links to the insights', () => {
    const w = mountAs(IMPERIAL, YourLogLine, { props: { log }, stubs })
    expect(w.text()).toContain(
      'Your log: 7 of 9 fish in stained water at 50-59 °F in the pre-spawn phase came on a spinnerbait with a Colorado blade.',
    )
    expect(w.text()).toContain('Its call is listed first.')
    expect(w.findComponent(RouterLinkStub).props('to')).toBe('/journal/insights')
  })

  it('reads it in °C, an open band, a window and a family alone', () => {
    const w = mountAs(METRIC, YourLogLine, {
      props: {
        log: {
          ...log,
          count: 5,
          of: 6,
          blade: null,
          family: 'jig',
          waterBandC: [null, 10],
          timeOfDay: 'dawn',
          leads: false,
        },
      },
      stubs,
    })
    expect(w.text()).toBe(
      'Your log: 5 of 6 fish in stained water under 10 °C in the pre-spawn phase at dawn came on a jig.',
    )
  })
})
