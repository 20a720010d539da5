import { z } from 'zod'
import { CLARITY_CLASSES } from '../conditions/clarity'
import { SEASONAL_PHASES } from '../conditions/season'
import { CautionView, LakeRead, LakeSlugParams, VerdictView } from './lake-read'

const Instant = z.iso.datetime()
const Sky = z.enum(['sun', 'partly', 'overcast'])

const RankedBankView = z.object({
  id: z.string(),
  name: z.string(),
  rank: z.number().int(),
  score: z.number(),
  components: z.array(
    z.object({
      key: z.enum(['wind', 'cover', 'depth', 'clarity', 'light', 'safety']),
      points: z.number(),
      reason: z.string(),
    }),
  ),
  exposure: z.object({
    exposure: z.enum(['lee', 'side wind', 'windward', 'rough']),
    onshore: z.number(),
    fetchM: z.number(),
    waveHeightM: z.number(),
  }),
  safety: z.enum(['ok', 'rough', 'danger']),
  peakWaveHeightM: z.number(),
})

const TackleCallView = z.object({
  family: z.string(),
  blade: z.string().optional(),
  bladeFinish: z.string().optional(),
  size: z.string().optional(),
  colors: z.array(z.string()),
  trailer: z.string().optional(),
  trailerHook: z.boolean().optional(),
  retrieve: z.string(),
  fit: z.number(),
  why: z.array(z.string()),
  ruleIds: z.array(z.string()),
})

/** The angler's own log beside a window's tackle calls (`withYourLog`); null with too few catches. */
export const YourLogView = z.object({
  count: z.number().int(),
  of: z.number().int(),
  familyCount: z.number().int(),
  family: z.string(),
  blade: z.enum(['colorado', 'willow', 'indiana', 'willow-colorado', 'double-willow']).nullable(),
  clarity: z.enum(CLARITY_CLASSES),
  phase: z.enum(SEASONAL_PHASES),
  waterBandC: z.tuple([z.number().nullable(), z.number().nullable()]),
  timeOfDay: z.enum(['dawn', 'midday', 'afternoon']).nullable(),
  leads: z.boolean(),
})

const WindowPlanView = z.object({
  id: z.enum(['dawn', 'midday', 'afternoon']),
  label: z.string(),
  start: Instant,
  end: Instant,
  weather: z
    .object({
      windFromDeg: z.number(),
      windMs: z.number(),
      gustMs: z.number(),
      sky: Sky,
      lowLight: z.boolean().optional(),
      airC: z.number(),
      relativeHumidityPct: z.number(),
      thunderstormProbabilityPct: z.number(),
      peak: z.object({
        windFromDeg: z.number(),
        windMs: z.number(),
        gustMs: z.number(),
        thunderstormProbabilityPct: z.number(),
        heatIndexC: z.number(),
        windChillC: z.number().nullable(),
      }),
      coldFront: z.string().nullable(),
    })
    .nullable(),
  openWaterWaveM: z.number(),
  banks: z.array(RankedBankView),
  tackle: z.array(TackleCallView),
  cautions: z.array(CautionView),
  verdict: VerdictView.nullable(),
  /** Set only on a signed-in angler's plan. */
  yourLog: YourLogView.nullable().optional(),
})

/** The Day plan screen: a lake's cached day with the signed-in angler's banks ranked in it. */
export const DayPlanResponse = z.object({
  lake: LakeRead.shape.lake.pick({ slug: true, name: true, timeZone: true }),
  date: z.iso.date(),
  /** Dates a plan can be had for: today and the forecast days. */
  dates: z.array(z.iso.date()),
  computedAt: Instant.nullable(),
  banksSaved: z.number().int(),
  /** Why there is no plan (too little history, no forecast for the date); null when there is one. */
  unavailable: z.string().nullable(),
  plan: z
    .object({
      date: z.iso.date(),
      phase: z.enum(SEASONAL_PHASES),
      clarity: z.enum(CLARITY_CLASSES),
      waterC: z.number(),
      sky: LakeRead.shape.sky,
      windows: z.array(WindowPlanView),
      cautions: z.array(CautionView),
      verdict: VerdictView,
    })
    .nullable(),
})
export type DayPlanResponse = z.infer<typeof DayPlanResponse>

export const DayPlanParams = LakeSlugParams.extend({
  date: z.iso.date('Use a date like 2026-05-14.'),
})
