import { z } from 'zod'
import { pageOf, PageQuery } from './paging'

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

export const LakeListQuery = PageQuery.extend({ q: z.string().trim().max(100).optional() })
export type LakeListQuery = z.infer<typeof LakeListQuery>

export const LakePage = pageOf(LakeSummary)
export type LakePage = z.infer<typeof LakePage>
