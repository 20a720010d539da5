import type { LakeRead } from '../../shared/schemas/lake-read'
import type { LakeSummary } from '../../shared/schemas/lakes'

/**
 * An invented Lake read for tests and benchmarks that need one without a month of readings:
 * stained water at 12.5 °C, warming and clearing, in the pre-spawn phase.
 */
export function sampleRead(lake: LakeSummary, at = '2026-04-10T09:45:00.000Z'): LakeRead {
  return {
    lake,
    asOf: at,
    lastReadingAt: at,
    waterTemp: { at, stale: false, valueC: 12.5, trendCPerDay: 0.5 },
    clarity: {
      at,
      stale: false,
      secchiM: 0.5,
      source: 'turbidity',
      class: 'stained',
      tsi: 70,
      trend: {
        slopePerDay: 0.06,
        label: 'clearing',
        basis: 'drift',
        ratePerDay: 0.06,
        secchiNowM: 0.5,
        secchiDayAgoM: 0.47,
        peakAt: null,
        rain: null,
        daysToNextClass: 3,
        nextClassAt: new Date(Date.parse(at) + 3 * 86_400_000).toISOString(),
        nextClass: 'lightly-stained',
        reason: 'a slow clearing over 72 h',
      },
    },
    level: null,
    windNow: null,
    windNext12h: [],
    airC: 18,
    pressure: null,
    sky: {
      sunrise: null,
      sunset: null,
      civilDawn: null,
      civilDusk: null,
      moonrise: null,
      moonset: null,
      moonIllumination: 0.5,
      moonPhase: 'first quarter',
    },
    phase: {
      phase: 'pre-spawn',
      since: '2026-03-28',
      pending: null,
      pendingDays: 0,
      lastDay: at.slice(0, 10),
      meanC: 12.2,
      trendCPerDay: 0.4,
      reason: 'water warm enough for feeding and growth, not yet for nesting.',
    },
    openWaterWaveM: 0.2,
    cautions: [],
    verdict: { verdict: 'go', reasons: [] },
  }
}
