import { z } from 'zod'
import { isTimeZone } from '../time'
import { LakeShoreline } from './lake-read'
import { PlainText } from './text'

/** What an admin may edit of a lake (the desk's Lakes screen); the outline is replaced apart. */
export const LakeEditInput = z.object({
  name: PlainText().min(1, 'Give the lake a name.').max(80, 'Keep the name under 80 characters.'),
  region: PlainText().min(1, 'Give the region.').max(80, 'Keep the region under 80 characters.'),
  timeZone: z.string().refine(isTimeZone, 'Not a time zone we know.'),
  // A number, or a number as a form field sends it; null, '' or true are not 0.
  normalPoolM: z.preprocess(
    (v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v),
    z
      .number({ error: 'Give the normal pool elevation in metres.' })
      .min(-500, 'Normal pool is between -500 and 9,000 m.')
      .max(9000, 'Normal pool is between -500 and 9,000 m.'),
  ),
})
export type LakeEditInput = z.infer<typeof LakeEditInput>
export const LakeCreateInput = LakeEditInput.extend({
  slug: z
    .string()
    .regex(/^[a-z0-9](?:[a-z0-9-]{0,58}[a-z0-9])?$/, 'Lower-case letters, digits and dashes.'),
})
export type LakeCreateInput = z.infer<typeof LakeCreateInput>
/** A lake as the desk's form edits it (`GET /admin/lakes/:slug`). */
export const DeskLake = z.object({
  slug: z.string(),
  name: z.string(),
  region: z.string(),
  timeZone: z.string(),
  normalPoolM: z.number(),
})
export type DeskLake = z.infer<typeof DeskLake>

/** An uploaded outline, checked, before it is saved: the geometry to draw and its measures. */
export const ShorelinePreview = z.object({
  shoreline: LakeShoreline,
  stats: z.object({
    areaKm2: z.number(),
    vertices: z.number().int(),
    islands: z.number().int(),
  }),
})
export type ShorelinePreview = z.infer<typeof ShorelinePreview>

/** Progress of recomputing a lake's bank exposure tables after a new outline. */
export const RecomputeStatus = z.object({
  total: z.number().int(),
  done: z.number().int(),
  detached: z.number().int(),
  startedAt: z.iso.datetime(),
  finishedAt: z.iso.datetime().nullable(),
  error: z.string().nullable(),
})
export type RecomputeStatus = z.infer<typeof RecomputeStatus>
