import { z } from 'zod'
import { CLARITY_CLASSES } from '../conditions/clarity'
import { pageOf, PageQuery } from './paging'
import { PlainText } from './text'

export const LakeSummary = z.object({
  id: z.uuid(),
  slug: z.string(),
  name: z.string(),
  region: z.string(),
  timeZone: z.string(),
  normalPoolM: z.number(),
  areaKm2: z.number(),
  center: z.tuple([z.number(), z.number()]),
})
export type LakeSummary = z.infer<typeof LakeSummary>

/** A lake as a picker lists it: every lake, by name, no paging. */
export const LakeName = z.object({ slug: z.string(), name: z.string() })
export type LakeName = z.infer<typeof LakeName>
export const LakeNames = z.object({ items: z.array(LakeName) })
export type LakeNames = z.infer<typeof LakeNames>

export const LakeListQuery = PageQuery.extend({ q: PlainText().max(100).optional() })
export type LakeListQuery = z.infer<typeof LakeListQuery>

/** A row of the Lakes screen: the lake, whether I follow it, and today's one-line read. */
export const LakeListItem = LakeSummary.extend({
  subscribed: z.boolean(),
  lastReadingAt: z.iso.datetime().nullable(),
  stale: z.boolean(),
  today: z.object({
    waterC: z.number().nullable(),
    clarity: z.enum(CLARITY_CLASSES).nullable(),
    windMs: z.number().nullable(),
    windFromDeg: z.number().nullable(),
    /** The Lake read's verdict for the next 12 hours. */
    verdict: z.enum(['go', 'caution', 'no-go']).nullable(),
  }),
})
export type LakeListItem = z.infer<typeof LakeListItem>

export const LakePage = pageOf(LakeListItem)
export type LakePage = z.infer<typeof LakePage>
