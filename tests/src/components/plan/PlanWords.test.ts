import { describe, expect, it } from 'vitest'
import PlanWindow from '@/components/plan/PlanWindow.vue'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'
import { boxLakePlan, EAST_ROCKS, WEST_LAYDOWNS, westWindDay } from '../plan-day'

// A light west wind under a partly cloudy sky all day; the west bank of wood and dense grass.
const plan = boxLakePlan({
  hours: westWindDay(() => ({ cloudCoverPct: 50 })),
  banks: [EAST_ROCKS, { ...WEST_LAYDOWNS, cover: ['wood', 'dense-grass'] }],
  waterC: 12,
  secchiM: 1,
  phase: 'early-pre-spawn',
})
const midday = plan.windows.find((w) => w.id === 'midday')!
const props = { window: midday, timeZone: 'America/Chicago', banksSaved: 2 }

describe('a Day plan window in words', () => {
  it('names the sky, cover, phase and clarity in words, never as keys', () => {
    const text = mountAs(IMPERIAL, PlanWindow, { props }).text()
    expect(text).toContain('partly cloudy')
    expect(text).toContain('Rock and sparse grass suit the early pre-spawn phase.')
    expect(text).toMatch(/Wood \/ laydowns suits the early pre-spawn phase\./)
    expect(text).not.toMatch(/sparse-grass|dense-grass|lightly-stained|early-pre-spawn|· partly ·/)
  })

  it('gives its hours on the reader’s clock', () => {
    expect(mountAs(IMPERIAL, PlanWindow, { props }).find('h2').text()).toMatch(/AM|PM/)
    expect(mountAs(METRIC, PlanWindow, { props }).find('h2').text()).toMatch(/\d\d:\d\d–\d\d:\d\d/)
  })
})
