import { AuditPage, type AuditQuery } from '@shared/schemas/audit'
import { QuarantinePage, type QuarantineQuery } from '@shared/schemas/quarantine'
import { StationList } from '@shared/schemas/stations'
import { apiCommand, apiRequest } from './http'

/** The gauge desk: stations, quarantine review and the audit log (admins). */
export const deskApi = {
  stations: () => apiRequest(StationList, '/admin/stations'),
  quarantine: (query: Partial<QuarantineQuery>) =>
    apiRequest(QuarantinePage, '/admin/quarantine', { query }),
  release: (id: number) => apiCommand(`/admin/quarantine/${id}/release`),
  discard: (id: number) => apiCommand(`/admin/quarantine/${id}/discard`),
  audit: (query: Partial<AuditQuery>) => apiRequest(AuditPage, '/admin/audit', { query }),
}
