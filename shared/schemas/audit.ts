import { z } from 'zod'
import { pageOf, PageQuery } from './paging'
import { PlainText } from './text'

/** One admin action in the audit log: who, what, when, and the row before and after. */
export const AuditEntry = z.object({
  id: z.number().int(),
  actorEmail: z.string(),
  action: z.string(),
  targetType: z.string(),
  targetId: z.string(),
  before: z.unknown(),
  after: z.unknown(),
  at: z.iso.datetime(),
})
export type AuditEntry = z.infer<typeof AuditEntry>
export const AuditPage = pageOf(AuditEntry)
export type AuditPage = z.infer<typeof AuditPage>
export const AuditQuery = PageQuery.extend({
  action: PlainText().max(60).optional(),
})
export type AuditQuery = z.infer<typeof AuditQuery>
