import { z } from 'zod'
import { CLARITY_CLASSES } from '../conditions/clarity'
import { SEASONAL_PHASES } from '../conditions/season'
import { LakeSummary } from './lakes'

const Instant = z.iso.datetime()

/** A gauge value with its age, so an old number is never shown as a fresh one. */
const Reading = z.object({ at: Instant, stale: z.boolean() })

export const WindHour = z.object({
  at: Instant,
  windMs: z.number(),
  gustMs: z.number(),
  windFromDeg: z.number(),
})
export type WindHour = z.infer<typeof WindHour>

export const CautionView = z.object({
  kind: z.enum(['wind', 'waves', 'lightning', 'cold-water', 'heat', 'wind-chill', 'authority']),
  level: z.enum(['info', 'caution', 'warning', 'danger']),
  /** SI: sustained wind m/s, wave m, chance %, °C. */
  value: z.number().optional(),
  gustMs: z.number().optional(),
  headline: z.string(),
  message: z.string(),
  source: z.string(),
  /** On a day's cautions: the ids of the windows the hazard reaches, and those in words. */
  windows: z.array(z.string()).optional(),
  when: z.string().optional(),
})

/** Go, caution or no-go, with the cautions that decided it. */
export const VerdictView = z.object({
  verdict: z.enum(['go', 'caution', 'no-go']),
  reasons: z.array(z.string()),
})

const Ring = z.array(z.tuple([z.number(), z.number()]))

/** GeoJSON Polygon or MultiPolygon in WGS84; interior rings are islands. */
export const LakeShoreline = z.union([
  z.object({ type: z.literal('Polygon'), coordinates: z.array(Ring) }),
  z.object({ type: z.literal('MultiPolygon'), coordinates: z.array(z.array(Ring)) }),
])

/** A lake's outline, served apart from the read: it rarely changes, so browsers revalidate it by ETag. */
export const LakeShape = z.object({ shoreline: LakeShoreline })
export type LakeShape = z.infer<typeof LakeShape>

/** The clarity trend (`clarityTrend` in shared/conditions/clarity.ts); rain in mm, Secchi in metres. */
export const ClarityTrendView = z.object({
  slopePerDay: z.number(),
  label: z.enum(['clearing', 'steady', 'staining']),
  basis: z.enum(['event', 'day', 'drift']),
  ratePerDay: z.number(),
  secchiNowM: z.number(),
  secchiDayAgoM: z.number().nullable(),
  peakAt: Instant.nullable(),
  rain: z.object({ mm: z.number(), since: Instant, until: Instant }).nullable(),
  daysToNextClass: z.number().nullable(),
  nextClassAt: Instant.nullable(),
  nextClass: z.enum(CLARITY_CLASSES).nullable(),
  reason: z.string(),
})
export type ClarityTrendView = z.infer<typeof ClarityTrendView>

const LocalDate = z.iso.date()

/**
 * The seasonal phase (`SeasonalPhaseResult` in shared/conditions/season.ts): the lake's stored
 * state with the 5-day mean (°C) and 7-day trend (°C a day) of the last day judged, and a reason.
 */
export const PhaseView = z.object({
  phase: z.enum(SEASONAL_PHASES),
  since: LocalDate,
  pending: z.enum(SEASONAL_PHASES).nullable(),
  pendingDays: z.number().int().min(0),
  lastDay: LocalDate,
  meanC: z.number(),
  trendCPerDay: z.number(),
  reason: z.string(),
})
export type PhaseView = z.infer<typeof PhaseView>

/** The Lake read: everything the water strip, wind, sky and caution band show. SI units throughout. */
export const LakeRead = z.object({
  lake: LakeSummary,
  asOf: Instant,
  lastReadingAt: Instant.nullable(),
  waterTemp: Reading.extend({ valueC: z.number(), trendCPerDay: z.number().nullable() }).nullable(),
  clarity: Reading.extend({
    secchiM: z.number(),
    source: z.enum(['secchi', 'turbidity']),
    class: z.enum(CLARITY_CLASSES),
    tsi: z.number(),
    trend: ClarityTrendView.nullable(),
  }).nullable(),
  level: Reading.extend({ gaugeM: z.number(), vsMedian30dM: z.number().nullable() }).nullable(),
  windNow: WindHour.nullable(),
  windNext12h: z.array(WindHour),
  airC: z.number().nullable(),
  pressure: z.object({ hPa: z.number(), changeHpa3h: z.number(), label: z.string() }).nullable(),
  sky: z.object({
    sunrise: Instant.nullable(),
    sunset: Instant.nullable(),
    civilDawn: Instant.nullable(),
    civilDusk: Instant.nullable(),
    moonrise: Instant.nullable(),
    moonset: Instant.nullable(),
    moonIllumination: z.number(),
    moonPhase: z.string(),
  }),
  phase: PhaseView.nullable(),
  /** In the strongest wind from now to 12 h ahead. */
  openWaterWaveM: z.number().nullable(),
  /** Judged on the worst hour from now to 12 h ahead. */
  cautions: z.array(CautionView),
  verdict: VerdictView,
})
export type LakeRead = z.infer<typeof LakeRead>

export const LakeSlugParams = z.object({
  slug: z.string().regex(/^[a-z0-9-]{1,60}$/, 'Not a lake.'),
})
