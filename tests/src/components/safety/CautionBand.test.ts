import { describe, expect, it } from 'vitest'
import { cautions } from '@shared/conditions/safety'
import CautionBand from '@/components/safety/CautionBand.vue'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'

// As the API gives them: a fresh breeze, 2 ft waves and cool water, sources in both systems.
const list = cautions({ windMs: 9, gustMs: 12, waveHeightM: 0.6, waterC: 12 })

describe('CautionBand', () => {
  it('quotes each source’s limits in km/h, metres and °C to a metric reader (WMO Beaufort force 5 from 8.0 m/s = 28.8 km/h)', () => {
    const text = mountAs(METRIC, CautionBand, { props: { cautions: list } }).text()
    expect(text).toContain('force 5 from 28.8 km/h')
    expect(text).toContain('(0.3 m, 0.6 m and 0.9 m)')
    expect(text).toContain('21.1 °C and 10 °C thresholds')
    expect(text).not.toMatch(/m\/s|mph|\bkt\b|\bft\b|°F/)
  })

  it('quotes them in mph, feet and °F to a US reader (NIST SP 811: 1 mph = 0.44704 m/s)', () => {
    const text = mountAs(IMPERIAL, CautionBand, { props: { cautions: list } }).text()
    expect(text).toContain('force 5 from 17.9 mph')
    expect(text).toContain('(1 ft, 2 ft and 3 ft)')
    expect(text).toContain('70 °F and 50 °F thresholds')
    expect(text).not.toMatch(/m\/s|km\/h|\bkt\b|\d m\b|°C/)
  })

  it('keeps each figure with its unit on one line, the words read unchanged', () => {
    const wrapper = mountAs(METRIC, CautionBand, { props: { cautions: list } })
    const figures = wrapper.findAll('.figure').map((x) => x.text())
    expect(figures).toContain('28.8 km/h')
    expect(figures).toContain('21.1 °C')
    expect(figures).toContain('12.0 °C')
    expect(wrapper.text()).toContain('force 5 from 28.8 km/h, force 6 from 38.9 km/h')
    // The message, a space, then its source in brackets.
    expect(wrapper.text()).toMatch(/do not cross open water\. \(WMO Beaufort scale/)
  })
})
