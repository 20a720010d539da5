import { z } from 'zod'
import { isTimeZone } from '../time'
import type { Settings } from './settings'

/** ISO weekdays, Monday = 1 … Sunday = 7 (as PostgreSQL's `isodow`). */
export const WEEKDAYS = [
  { value: 1, label: 'Mon' },
  { value: 2, label: 'Tue' },
  { value: 3, label: 'Wed' },
  { value: 4, label: 'Thu' },
  { value: 5, label: 'Fri' },
  { value: 6, label: 'Sat' },
  { value: 7, label: 'Sun' },
] as const

export const DEFAULT_SEND_TIME = '05:00'

/** The morning brief, per subscriber: one e-mail a morning covering every lake they follow. */
export const BriefSettings = z.object({
  enabled: z.boolean({ error: 'Say whether to send the brief.' }),
  /** Local wall-clock time in the subscriber's zone, 24-hour. */
  sendTime: z
    .string({ error: 'Give a send time.' })
    .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Give a time as HH:MM on a 24-hour clock.'),
  days: z
    .array(z.number().int().min(1).max(7), { error: 'Choose the days.' })
    .min(1, 'Choose at least one day.')
    .refine((days) => new Set(days).size === days.length, 'Each day once.'),
  timeZone: z
    .string({ error: 'Choose a time zone.' })
    .max(64)
    .refine(isTimeZone, 'Not a time zone we know.'),
  /**
   * The followed lakes that go in the brief, by slug; left out, the choice stays as it was (a
   * newly followed lake goes in). Units are the account's, one setting for screens and brief.
   */
  lakes: z
    .array(z.string().regex(/^[a-z0-9-]{1,60}$/, 'Not a lake.'), { error: 'Choose the lakes.' })
    .max(200, 'Choose at most 200 lakes.')
    .refine((slugs) => new Set(slugs).size === slugs.length, 'Each lake once.')
    .optional(),
})
export type BriefSettings = z.infer<typeof BriefSettings>
/** The units a brief is written in: the account's display settings. */
export type BriefUnits = Omit<Settings, 'homeLakeSlug'>

/** The Settings screen's brief section: saved settings (null before the first save) and status. */
export const BriefSettingsView = z.object({
  settings: BriefSettings.nullable(),
  email: z.string(),
  emailVerified: z.boolean(),
  /** The lakes this angler follows, and whether each goes in the brief. */
  lakes: z.array(z.object({ slug: z.string(), name: z.string(), inBrief: z.boolean() })),
})
export type BriefSettingsView = z.infer<typeof BriefSettingsView>

/** A signed link's token, as the verify and unsubscribe pages post it back. */
export const LinkToken = z.object({
  token: z
    .string({ error: 'The link has no token.' })
    .min(16, 'The link is incomplete.')
    .max(2000, 'The link is not one of ours.'),
})
export type LinkToken = z.infer<typeof LinkToken>

export const BRIEF_SEND_STATUSES = ['sending', 'sent', 'retry', 'failed'] as const
export type BriefSendStatus = (typeof BRIEF_SEND_STATUSES)[number]

/** A brief that has not gone out cleanly, for admins. */
export const BriefDelivery = z.object({
  email: z.string(),
  localDate: z.iso.date(),
  status: z.enum(BRIEF_SEND_STATUSES),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.iso.datetime().nullable(),
  updatedAt: z.iso.datetime(),
})
export type BriefDelivery = z.infer<typeof BriefDelivery>

export const BriefDeliveryQuery = z.object({
  status: z.enum(['failed', 'retry', 'sending']).optional(),
})
export const BriefDeliveryList = z.object({ items: z.array(BriefDelivery) })
export type BriefDeliveryList = z.infer<typeof BriefDeliveryList>

/** A message the local SMTP stand-in caught, for the development inbox. */
export const CaughtMailSummary = z.object({
  id: z.number().int(),
  receivedAt: z.iso.datetime(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
})
export const CaughtMail = CaughtMailSummary.extend({
  text: z.string(),
  html: z.string().nullable(),
  headers: z.record(z.string(), z.string()),
})
export type CaughtMail = z.infer<typeof CaughtMail>
export const CaughtMailList = z.object({ items: z.array(CaughtMailSummary) })
export type CaughtMailList = z.infer<typeof CaughtMailList>
