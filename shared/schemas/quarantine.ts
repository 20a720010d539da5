import { z } from 'zod'
import { QUARANTINE_REASONS } from '../readings'
import { pageOf, PageQuery } from './paging'

export const QUARANTINE_STATUSES = ['held', 'released', 'discarded'] as const

/** A row the ingest jobs refused, with the raw value and why, for an admin to review. */
export const QuarantineItem = z.object({
  id: z.number().int(),
  station: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  lake: z.string().nullable(),
  parameter: z.string(),
  observedAt: z.iso.datetime().nullable(),
  raw: z.unknown(),
  reason: z.enum(QUARANTINE_REASONS),
  detail: z.string(),
  status: z.enum(QUARANTINE_STATUSES),
  receivedAt: z.iso.datetime(),
  /** Whether the row holds a value that can be stored as a reading. */
  releasable: z.boolean(),
})
export type QuarantineItem = z.infer<typeof QuarantineItem>
export const QuarantinePage = pageOf(QuarantineItem)
export type QuarantinePage = z.infer<typeof QuarantinePage>
export const QuarantineQuery = PageQuery.extend({
  stationId: z.uuid('Not a station.').optional(),
  reason: z.enum(QUARANTINE_REASONS, { error: 'Not a reason for refusing a row.' }).optional(),
  status: z.enum(QUARANTINE_STATUSES).default('held'),
})
export type QuarantineQuery = z.infer<typeof QuarantineQuery>
export const QuarantineParams = z.object({ id: z.coerce.number().int().min(1, 'Not a row.') })
