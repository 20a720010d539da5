import { z } from 'zod'
import { CLARITY_CLASSES } from '../conditions/clarity'
import { WINDOW_LABELS } from '../conditions/day-plan'
import { SEASONAL_PHASES } from '../conditions/season'
import { BLADES } from '../conditions/tackle-lists'
import { PlainText } from './text'

export const SPECIES = ['largemouth', 'smallmouth', 'spotted', 'other'] as const
export type Species = (typeof SPECIES)[number]
export const SPECIES_LABELS: Record<Species, string> = {
  largemouth: 'largemouth bass',
  smallmouth: 'smallmouth bass',
  spotted: 'spotted bass',
  other: 'other',
}

/** The longest and heaviest bass anyone could log, with room: past these a unit slipped. */
export const MAX_LENGTH_M = 1.0
export const MAX_WEIGHT_KG = 10

const Instant = z.iso.datetime({ offset: true, error: 'Give a date and time.' })
const Position = z.tuple([
  z
    .number()
    .min(-180, 'Longitude runs from -180 to 180.')
    .max(180, 'Longitude runs from -180 to 180.'),
  z.number().min(-90, 'Latitude runs from -90 to 90.').max(90, 'Latitude runs from -90 to 90.'),
])
/** People's text of at most `max` characters. */
const Text = (max: number, what: string, lines = false) =>
  PlainText({ lines, error: `Give ${what} as text.` }).max(
    max,
    `Keep ${what} under ${max.toLocaleString('en-US')} characters.`,
  )
const Optional = (max: number, what: string) => Text(max, what).default('')

/**
 * What the fish was caught on: a lure family and its details, in the tackle calls' own words when
 * picked from the lists (`tackleLists`), or the angler's words.
 */
export const LureInput = z.object({
  family: Text(40, 'the lure').min(1, 'Say what it was caught on.'),
  blade: z.enum(BLADES).nullable().default(null),
  color: Optional(40, 'the colour'),
  size: Optional(40, 'the size'),
  trailer: Optional(40, 'the trailer'),
  trailerHook: z.boolean().nullable().default(null),
  retrieve: Optional(80, 'the retrieve'),
})
export type LureInput = z.infer<typeof LureInput>

/** A catch as an angler logs it. Lengths and weights in SI: the client converts the angler's units. */
export const CatchInput = z
  .object({
    lakeSlug: z.string({ error: 'Choose a lake.' }).min(1, 'Choose a lake.').max(80),
    caughtAt: Instant,
    species: z.enum(SPECIES, { error: 'Choose the species.' }),
    lengthM: z
      .number({ error: 'Give the length as a number.' })
      .min(0.05, 'A bass that short is a fry: check the length.')
      .max(MAX_LENGTH_M, 'Longer than any bass: check the length and its unit.')
      .nullable()
      .default(null),
    weightKg: z
      .number({ error: 'Give the weight as a number.' })
      .gt(0, 'The weight must be more than 0.')
      .max(MAX_WEIGHT_KG, 'Heavier than any bass: check the weight and its unit.')
      .nullable()
      .default(null),
    released: z.boolean({ error: 'Say whether it was released or kept.' }),
    lure: LureInput,
    bankId: z.uuid('Not one of your banks.').nullable().default(null),
    /** Where it was caught, from the phone or the photo; suggests the nearest bank. */
    position: Position.nullable().default(null),
    note: Text(1000, 'the note', true).default(''),
    /** A guide logging a catch on one of their trips: the trip's clients see it on the trip page. */
    tripId: z.uuid('Not one of your trips.').nullable().default(null),
    photoId: z.uuid('Upload the photo again.').nullable().default(null),
    /**
     * The phone's own id for this catch, made when it was logged: sending it again (a catch kept
     * on the phone offline, sent when the network came back) finds the catch, never a second one.
     */
    clientId: z.uuid('Give the catch id as a UUID.').nullable().default(null),
  })
  .refine((c) => c.lengthM !== null || c.weightKg !== null, {
    message: 'Give the length, the weight, or both.',
    path: ['lengthM'],
  })
export type CatchInput = z.infer<typeof CatchInput>

/** The conditions at a catch's time and place, computed by the server from stored readings. */
/** When in the day a fish came: a Day plan window, or the night outside them. */
export const TIMES_OF_DAY = ['night', 'dawn', 'midday', 'afternoon'] as const
export type TimeOfDay = (typeof TIMES_OF_DAY)[number]
export const TIME_OF_DAY_LABELS: Record<TimeOfDay, string> = { night: 'Night', ...WINDOW_LABELS }

export const CatchConditions = z.object({
  waterC: z.number().nullable(),
  clarity: z
    .object({
      class: z.enum(CLARITY_CLASSES),
      secchiM: z.number(),
      trend: z.enum(['clearing', 'steady', 'staining']).nullable(),
    })
    .nullable(),
  phase: z.enum(SEASONAL_PHASES).nullable(),
  wind: z.object({ ms: z.number(), gustMs: z.number(), fromDeg: z.number() }).nullable(),
  /** How the wind met the catch's bank; null without a bank or a wind. */
  bankExposure: z.enum(['lee', 'side wind', 'windward', 'rough']).nullable(),
  sky: z.enum(['sun', 'partly', 'overcast']).nullable(),
  cloudCoverPct: z.number().nullable(),
  airC: z.number().nullable(),
  pressure: z.object({ hPa: z.number(), changeHpa3h: z.number(), label: z.string() }).nullable(),
  /** The day's verdict at the lake (its Day plan's), or the read's for the 12 h from the catch. */
  verdict: z.enum(['go', 'caution', 'no-go']).nullable(),
  timeOfDay: z.enum(TIMES_OF_DAY),
  /** The local date at the lake, and the season of the year it falls in. */
  localDate: z.iso.date(),
  computedAt: z.iso.datetime(),
})
export type CatchConditions = z.infer<typeof CatchConditions>

export const PhotoView = z.object({
  id: z.uuid(),
  displayUrl: z.string(),
  thumbUrl: z.string(),
  width: z.number().int(),
  height: z.number().int(),
})
export type PhotoView = z.infer<typeof PhotoView>

/** An uploaded photo, and what its EXIF said, to fill the form before the catch is saved. */
export const PhotoUpload = PhotoView.extend({
  takenAt: z.iso.datetime().nullable(),
  /** The camera's GPS position: used for the nearest bank, never stored in any copy. */
  position: Position.nullable(),
  nearestBank: z.object({ id: z.uuid(), name: z.string(), lakeSlug: z.string() }).nullable(),
})
export type PhotoUpload = z.infer<typeof PhotoUpload>

export const CatchView = z.object({
  id: z.uuid(),
  lake: z.object({ slug: z.string(), name: z.string(), timeZone: z.string() }),
  caughtAt: z.iso.datetime(),
  species: z.enum(SPECIES),
  lengthM: z.number().nullable(),
  weightKg: z.number().nullable(),
  released: z.boolean(),
  lure: LureInput,
  bank: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  position: Position.nullable(),
  note: z.string(),
  tripId: z.uuid().nullable(),
  /** The phone's id for it, when the catch was logged with one. */
  clientId: z.uuid().nullable(),
  photo: PhotoView.nullable(),
  conditions: CatchConditions.nullable(),
  createdAt: z.iso.datetime(),
})
export type CatchView = z.infer<typeof CatchView>

export const CatchList = z.object({
  items: z.array(CatchView),
  total: z.number().int().min(0),
  page: z.number().int().min(1),
  pageSize: z.number().int().min(1),
})
export type CatchList = z.infer<typeof CatchList>

export const CatchListQuery = z.object({
  lake: z.string().max(80).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
})
export type CatchListQuery = z.infer<typeof CatchListQuery>

export const PhotoUploadQuery = z.object({
  /** The lake the angler is logging on: its time zone reads the camera's clock. */
  lake: z.string().max(80).optional(),
})

export const InsightsQuery = z.object({
  lake: z.string().max(80).optional(),
  season: z.enum(['spring', 'summer', 'fall', 'winter'], { error: 'Choose a season.' }).optional(),
})
export type InsightsQuery = z.infer<typeof InsightsQuery>

const InsightGroup = z.object({
  key: z.string(),
  count: z.number().int(),
  share: z.number(),
  topLure: z.object({ family: z.string(), count: z.number().int() }).nullable(),
  enough: z.boolean(),
})
export const Insights = z.object({
  total: z.number().int(),
  minSample: z.number().int(),
  dimensions: z.array(
    z.object({
      dimension: z.enum(['clarity', 'water', 'phase', 'bankExposure', 'sky', 'timeOfDay']),
      known: z.number().int(),
      groups: z.array(InsightGroup),
    }),
  ),
})
export type Insights = z.infer<typeof Insights>

export const CatchParams = z.object({ id: z.uuid('Not one of your catches.') })
export const SharedPhotoParams = z.object({
  token: z.string().min(16).max(2000),
  id: z.uuid('Not a photo of this trip.'),
  size: z.enum(['display', 'thumb'], { error: 'Ask for display or thumb.' }),
})
export const PhotoParams = z.object({
  id: z.uuid('Not one of your photos.'),
  size: z.enum(['display', 'thumb'], { error: 'Ask for display or thumb.' }),
})

export const CatchImportQuery = z.object({
  commit: z.enum(['true', 'false'], { error: 'Say commit=true to import.' }).optional(),
})
