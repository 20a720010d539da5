import { z } from 'zod'
import { CLARITY_CLASSES } from '../conditions/clarity'
import { SEASONAL_PHASES } from '../conditions/season'
import { SPEED_UNITS } from './settings'

export const WATCH_WINDOWS = ['dawn', 'midday', 'afternoon'] as const
export const WATCH_CHANNELS = ['email', 'push'] as const

/** Wind in a speed range, in the unit the angler typed it in; `onto` asks it to blow onto the bank. */
export const WatchWind = z
  .object({
    onto: z.boolean().default(false),
    min: z.number().min(0, 'At least 0.').max(150, 'At most 150.'),
    max: z.number().min(0, 'At least 0.').max(150, 'At most 150.'),
    unit: z.enum(SPEED_UNITS),
  })
  .refine((w) => w.min <= w.max, {
    path: ['max'],
    message: 'The top of the range is below its bottom.',
  })
export type WatchWind = z.infer<typeof WatchWind>

/**
 * What a watch waits for in a forecast window. An empty list accepts any value; every condition
 * given must hold at once.
 */
export const WatchConditions = z.object({
  wind: WatchWind.nullable().default(null),
  clarity: z.array(z.enum(CLARITY_CLASSES)).default([]),
  phases: z.array(z.enum(SEASONAL_PHASES)).default([]),
  windows: z.array(z.enum(WATCH_WINDOWS)).default([]),
  /** Only windows whose verdict is go or caution. */
  notNoGo: z.boolean().default(true),
  /** Only windows of the next this many days, today the first; null: every day forecast. */
  daysAhead: z
    .number()
    .int('Whole days.')
    .min(1, 'At least 1 day.')
    .max(7, 'At most 7 days: the forecast reaches no further.')
    .nullable()
    .default(null),
})
export type WatchConditions = z.infer<typeof WatchConditions>

export const WatchChannels = z
  .array(z.enum(WATCH_CHANNELS))
  .min(1, 'Choose e-mail, push or both.')
  .transform((list) => [...new Set(list)])

/** A watch an angler sets on a saved bank or on a whole lake. */
export const WatchInput = z
  .object({
    name: z.string().trim().min(1, 'Name the watch.').max(80, 'At most 80 characters.'),
    lakeSlug: z.string().regex(/^[a-z0-9-]{1,60}$/, 'Not a lake.'),
    bankId: z.uuid('Not a bank.').nullable().default(null),
    conditions: WatchConditions,
    channels: WatchChannels,
    active: z.boolean().default(true),
  })
  .refine((w) => !w.conditions.wind?.onto || w.bankId, {
    path: ['bankId'],
    message: 'Wind onto a bank needs a bank: pick one, or watch the wind on the whole lake.',
  })
export type WatchInput = z.infer<typeof WatchInput>

/** Pausing a watch or changing how it speaks: the only edits a trip's own watch takes. */
export const WatchPatch = z.object({
  active: z.boolean().optional(),
  channels: WatchChannels.optional(),
})
export type WatchPatch = z.infer<typeof WatchPatch>

export const WatchParams = z.object({ id: z.uuid('Not a watch.') })

const AlertSummary = z.object({
  date: z.iso.date(),
  windowId: z.string(),
  sentAt: z.iso.datetime().nullable(),
})

export const Watch = z.object({
  id: z.uuid(),
  /** `trip`: made for a guide's trip, told when its day turns no-go or brings a danger. */
  kind: z.enum(['angler', 'trip']),
  name: z.string(),
  lake: z.object({ slug: z.string(), name: z.string() }),
  bank: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  trip: z.object({ id: z.uuid(), date: z.iso.date() }).nullable(),
  conditions: WatchConditions,
  channels: z.array(z.enum(WATCH_CHANNELS)),
  active: z.boolean(),
  createdAt: z.iso.datetime(),
  lastAlert: AlertSummary.nullable(),
})
export type Watch = z.infer<typeof Watch>

export const WatchList = z.object({ items: z.array(Watch) })
export type WatchList = z.infer<typeof WatchList>

/** What an admin sees of an alert that went out (or tried to). */
export const SentAlert = z.object({
  watchId: z.uuid(),
  watchName: z.string(),
  kind: z.enum(['angler', 'trip']),
  email: z.string(),
  lakeSlug: z.string(),
  date: z.iso.date(),
  windowId: z.string(),
  episode: z.number().int(),
  status: z.enum(['sending', 'retry', 'sent', 'failed']),
  delivered: z.array(z.enum(WATCH_CHANNELS)),
  lastError: z.string().nullable(),
  sentAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
})
export type SentAlert = z.infer<typeof SentAlert>
