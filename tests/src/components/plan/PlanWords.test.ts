import { describe, expect, it } from 'vitest'
import { dayPlan, type ForecastHour } from '@shared/conditions/day-plan'
import type { Bank } from '@shared/conditions/ranking'
import type { Polygon } from '@shared/geo/types'
import PlanWindow from '@/components/plan/PlanWindow.vue'
import { IMPERIAL, METRIC, mountAs } from '../mountAs'

// An invented box lake; an east bank of rock and sparse grass, a west bank of wood, sheltered.
const lake: Polygon = {
  type: 'Polygon',
  coordinates: [
    [
      [-88.1, 35],
      [-88.0, 35],
      [-88.0, 35.05],
      [-88.1, 35.05],
      [-88.1, 35],
    ],
  ],
}
const banks: Bank[] = [
  {
    id: 'e',
    name: 'East rocks',
    points: [
      [-88.0, 35.02],
      [-88.0, 35.03],
    ],
    cover: ['rock', 'sparse-grass'],
    depthM: 3,
  },
  {
    id: 'w',
    name: 'West laydowns',
    points: [
      [-88.1, 35.02],
      [-88.1, 35.03],
    ],
    cover: ['wood', 'dense-grass'],
  },
]
// A light west wind under a partly cloudy sky all day.
const hours: ForecastHour[] = Array.from({ length: 24 }, (_, h) => ({
  at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
  windFromDeg: 270,
  windMs: 4,
  gustMs: 6,
  airC: 18,
  relativeHumidityPct: 60,
  cloudCoverPct: 50,
  thunderstormProbabilityPct: 0,
}))
const plan = dayPlan({
  lake,
  date: '2026-04-10',
  timeZone: 'America/Chicago',
  banks,
  hourly: hours,
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
