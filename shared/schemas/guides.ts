import { z } from 'zod'
import { Email } from './auth'
import { DayPlanResponse } from './day-plan'
import { CautionView } from './lake-read'
import { PlainText } from './text'

const Text = (max: number, what: string) =>
  PlainText({ lines: true })
    .max(max, `Keep ${what} under ${max.toLocaleString('en-US')} characters.`)
    .default('')

/** A guide's client, as typed in a form or read from a CSV row. */
export const ClientInput = z.object({
  name: PlainText({ error: 'Give a name.' })
    .min(1, 'Give a name.')
    .max(80, 'Keep the name under 80 characters.')
    .regex(/^[^<>]*$/, 'Leave out < and >.'),
  email: Email,
  phone: PlainText()
    .max(30, 'Keep the phone number under 30 characters.')
    .regex(/^[0-9+()\-.\s]*$/, 'Digits, spaces and + - ( ) . only.')
    .default(''),
  notes: Text(1000, 'notes'),
})
export type ClientInput = z.infer<typeof ClientInput>

/** How a guide appears to clients on a shared trip: a name, and a phone or an address or both. */
export const GuideProfile = z.object({
  name: PlainText({ error: 'Give the name your clients know you by.' })
    .min(1, 'Give the name your clients know you by.')
    .max(80, 'Keep the name under 80 characters.')
    .regex(/^[^<>]*$/, 'Leave out < and >.'),
  phone: ClientInput.shape.phone,
  email: z.union([z.literal(''), Email]).default(''),
})
export type GuideProfile = z.infer<typeof GuideProfile>
/** The guide's profile; null until they first save it. */
export const GuideProfileView = z.object({ profile: GuideProfile.nullable() })
export type GuideProfileView = z.infer<typeof GuideProfileView>

export const ClientView = ClientInput.extend({ id: z.uuid(), updatedAt: z.iso.datetime() })
export type ClientView = z.infer<typeof ClientView>
export const ClientList = z.object({ items: z.array(ClientView) })
export type ClientList = z.infer<typeof ClientList>
export const IdParams = z.object({ id: z.uuid('Not one of yours.') })

/** The columns a client CSV has, in its header row, in any order. */
export const CLIENT_CSV_COLUMNS = ['name', 'email', 'phone', 'notes'] as const

export const TripInput = z.object({
  lakeSlug: z.string().regex(/^[a-z0-9-]{1,60}$/, 'Choose a lake.'),
  date: z.iso.date('Give the date as YYYY-MM-DD.'),
  meetingPoint: PlainText()
    .min(1, 'Say where to meet.')
    .max(120, 'Keep the meeting point under 120 characters.'),
  meetingTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Give a time as HH:MM.'),
  bankIds: z
    .array(z.uuid('Not one of your banks.'))
    .max(12, 'Plan at most 12 banks.')
    .refine((ids) => new Set(ids).size === ids.length, 'Each bank once.')
    .default([]),
  tackle: Text(2000, 'the tackle list'),
  notes: Text(2000, 'notes'),
})
export type TripInput = z.infer<typeof TripInput>

export const TripSummary = z.object({
  id: z.uuid(),
  lake: z.object({ slug: z.string(), name: z.string() }),
  date: z.iso.date(),
  meetingPoint: z.string(),
  meetingTime: z.string(),
  bankCount: z.number().int(),
})
export const TripList = z.object({ items: z.array(TripSummary) })
export type TripList = z.infer<typeof TripList>

const SharedPlan = DayPlanResponse.shape.plan

/** A trip as its client sees it: the day, the plan for the trip's banks, and nothing else. */
export const SharedTrip = z.object({
  lake: z.object({ name: z.string(), timeZone: z.string() }),
  date: z.iso.date(),
  meetingPoint: z.string(),
  meetingTime: z.string(),
  tackle: z.string(),
  notes: z.string(),
  banks: z.array(z.object({ id: z.string(), name: z.string() })),
  /** The cached day with the trip's banks ranked; null when the forecast does not reach it yet. */
  plan: SharedPlan,
  unavailable: z.string().nullable(),
  /** Cautions of the day's windows, most serious first, ending with the deferral to local authority. */
  cautions: z.array(CautionView),
  computedAt: z.iso.datetime().nullable(),
  /** Who guides the trip and how to reach them; null until the guide fills in their profile. */
  guide: GuideProfile.nullable(),
  /** Through which day, at the lake, the link opened works; null on the guide's own page. */
  linkEndsOn: z.iso.date().nullable(),
})
export type SharedTrip = z.infer<typeof SharedTrip>

export const ShareSendView = z.object({
  name: z.string(),
  email: z.string(),
  status: z.enum(['sent', 'failed']),
  error: z.string().nullable(),
  sentAt: z.iso.datetime(),
})
export const ShareView = z.object({
  id: z.uuid(),
  url: z.string(),
  expiresAt: z.iso.datetime(),
  /** The day chosen: the link works through its end at the lake. */
  expiresOn: z.iso.date(),
  revokedAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  sends: z.array(ShareSendView),
})
export type ShareView = z.infer<typeof ShareView>

/** The guide's trip page: the trip as saved, as its client will see it, and its links. */
export const TripView = SharedTrip.extend({
  id: z.uuid(),
  lake: z.object({ slug: z.string(), name: z.string(), timeZone: z.string() }),
  shares: z.array(ShareView),
})
export type TripView = z.infer<typeof TripView>

export const ShareInput = z.object({
  /** The last day the link works (through the end of that day at the lake). */
  expiresOn: z.iso.date('Give the date as YYYY-MM-DD.'),
})
export const ShareParams = IdParams.extend({ shareId: z.uuid('Not a link of this trip.') })
/** Clients one send may mail a link to. */
export const SHARE_MAX_CLIENTS = 50
export const ShareSendInput = z.object({
  clientIds: z
    .array(z.uuid('Not one of your clients.'))
    .min(1, 'Choose at least one client.')
    .max(SHARE_MAX_CLIENTS, `Send to at most ${SHARE_MAX_CLIENTS} clients at a time.`),
})
export const ShareToken = z.object({ token: z.string().min(16).max(2000) })
