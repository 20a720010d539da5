import type { AuditPage, AuditQuery } from '@shared/schemas/audit'
import type {
  DeskLake,
  RecomputeStatus,
  ShorelinePreview,
  LakeCreateInput,
  LakeEditInput,
} from '@shared/schemas/desk'
import type { QuarantinePage, QuarantineQuery } from '@shared/schemas/quarantine'
import type {
  ReadingsImportReport,
  StationHistories,
  StationList,
  StationRunResult,
  StationInput,
} from '@shared/schemas/stations'
import type { MaybeRef } from 'vue'
import { apiCommand, apiRequest, upload } from './http'

const ADMIN = ['admin'] as const
/** The gauge desk's query keys; invalidating `stations` refreshes the list and its history. */
export const deskKeys = {
  stations: [...ADMIN, 'stations'] as const,
  stationHistory: [...ADMIN, 'stations', 'history'] as const,
  quarantine: (filters?: object) =>
    filters === undefined
      ? ([...ADMIN, 'quarantine'] as const)
      : ([...ADMIN, 'quarantine', filters] as const),
  audit: (page: MaybeRef<number>) => [...ADMIN, 'audit', page] as const,
}

/** The gauge desk: stations, quarantine review and the audit log (admins). */
export const deskApi = {
  stations: () => apiRequest<StationList>('/admin/stations'),
  createStation: (body: StationInput) =>
    apiRequest<{ id: string }>('/admin/stations', { method: 'POST', body }),
  editStation: (id: string, body: StationInput) =>
    apiRequest<{ id: string }>(`/admin/stations/${id}`, { method: 'PUT', body }),
  importReadings: (id: string, file: File, commit: boolean) =>
    apiRequest<ReadingsImportReport>(`/admin/stations/${id}/readings`, {
      method: 'POST',
      body: upload(file),
      query: { commit: String(commit) },
    }),
  stationHistories: (days = 7) =>
    apiRequest<StationHistories>('/admin/stations/history', { query: { days } }),
  runStation: (id: string) =>
    apiRequest<StationRunResult>(`/admin/stations/${id}/run`, { method: 'POST' }),
  quarantine: (query: Partial<QuarantineQuery>) =>
    apiRequest<QuarantinePage>('/admin/quarantine', { query }),
  release: (id: number) => apiCommand(`/admin/quarantine/${id}/release`),
  discard: (id: number) => apiCommand(`/admin/quarantine/${id}/discard`),
  audit: (query: Partial<AuditQuery>) => apiRequest<AuditPage>('/admin/audit', { query }),
  previewShoreline: (file: File) =>
    apiRequest<ShorelinePreview>('/admin/lakes/shoreline-preview', {
      method: 'POST',
      body: upload(file),
    }),
  createLake: (lake: LakeCreateInput, file: File) =>
    apiRequest<{ slug: string }>('/admin/lakes', {
      method: 'POST',
      body: upload(file, lake),
    }),
  lake: (slug: string) => apiRequest<DeskLake>(`/admin/lakes/${slug}`),
  editLake: (slug: string, lake: LakeEditInput) =>
    apiRequest<{ slug: string }>(`/admin/lakes/${slug}`, {
      method: 'PUT',
      body: lake,
    }),
  replaceShoreline: (slug: string, file: File) =>
    apiRequest<RecomputeStatus>(`/admin/lakes/${slug}/shoreline`, {
      method: 'POST',
      body: upload(file),
    }),
  recompute: (slug: string) => apiRequest<RecomputeStatus>(`/admin/lakes/${slug}/recompute`),
}
