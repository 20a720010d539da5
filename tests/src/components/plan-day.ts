import { dayPlan, type ForecastHour } from '@shared/conditions/day-plan'
import type { Bank } from '@shared/conditions/ranking'
import type { Polygon } from '@shared/geo/types'

/**
 * An invented box lake 9 km east-west for component tests: a west wind runs its width onto the
 * east bank. Its two banks face each other across it.
 */
export const BOX_LAKE: Polygon = {
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
export const EAST_ROCKS: Bank = {
  id: 'e',
  name: 'East rocks',
  points: [
    [-88.0, 35.02],
    [-88.0, 35.03],
  ],
  cover: ['rock', 'sparse-grass'],
  depthM: 3,
}
export const WEST_LAYDOWNS: Bank = {
  id: 'w',
  name: 'West laydowns',
  points: [
    [-88.1, 35.02],
    [-88.1, 35.03],
  ],
  cover: ['wood'],
}

/** 24 hours of west wind from 05:00 UTC on 10 April 2026, each hour shaped by `hour`. */
export function westWindDay(hour: (h: number) => Partial<ForecastHour>): ForecastHour[] {
  return Array.from({ length: 24 }, (_, h) => ({
    at: new Date(Date.UTC(2026, 3, 10, 5 + h)).toISOString(),
    windFromDeg: 270,
    windMs: 4,
    gustMs: 6,
    airC: 18,
    relativeHumidityPct: 60,
    cloudCoverPct: 40,
    thunderstormProbabilityPct: 0,
    ...hour(h),
  }))
}

/** The box lake's plan for 10 April 2026 (Chicago time). */
export function boxLakePlan(input: {
  hours: ForecastHour[]
  banks: Bank[]
  waterC: number
  secchiM: number
  phase: Parameters<typeof dayPlan>[0]['phase']
}) {
  return dayPlan({
    lake: BOX_LAKE,
    date: '2026-04-10',
    timeZone: 'America/Chicago',
    banks: input.banks,
    hourly: input.hours,
    waterC: input.waterC,
    secchiM: input.secchiM,
    phase: input.phase,
  })
}
