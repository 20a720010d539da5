import type {
  ClientList,
  ClientView,
  SharedTrip,
  ShareView,
  TripList,
  TripView,
  ClientInput,
  GuideProfile,
  GuideProfileView,
  TripInput,
} from '@shared/schemas/guides'
import type { MaybeRef } from 'vue'
import { apiCommand, apiRequest, upload } from './http'
import type { CsvImportReport } from '@shared/schemas/csv-import'

type Shares = { items: ShareView[] }

const GUIDE = ['guide'] as const
/** The guide's query keys: profile, clients, trips, and a trip as its client sees it by link. */
export const guideKeys = {
  profile: [...GUIDE, 'profile'] as const,
  clients: [...GUIDE, 'clients'] as const,
  trips: [...GUIDE, 'trips'] as const,
  trip: (id: MaybeRef<string>) => [...GUIDE, 'trip', id] as const,
  shared: (token: MaybeRef<string>) => ['shared-trip', token] as const,
}

export const clientsApi = {
  list: () => apiRequest<ClientList>('/guide/clients'),
  create: (body: ClientInput) => apiRequest<ClientView>('/guide/clients', { method: 'POST', body }),
  update: (id: string, body: ClientInput) =>
    apiRequest<ClientView>(`/guide/clients/${id}`, { method: 'PUT', body }),
  remove: (id: string) => apiCommand(`/guide/clients/${id}`, { method: 'DELETE' }),
  /** A preview (nothing saved) unless `commit`. */
  importCsv: (file: File, commit: boolean) =>
    apiRequest<CsvImportReport>('/guide/clients/import', {
      method: 'POST',
      body: upload(file),
      query: { commit: String(commit) },
    }),
}

export const tripsApi = {
  list: () => apiRequest<TripList>('/guide/trips'),
  get: (id: string) => apiRequest<TripView>(`/guide/trips/${id}`),
  create: (body: TripInput) => apiRequest<TripView>('/guide/trips', { method: 'POST', body }),
  update: (id: string, body: TripInput) =>
    apiRequest<TripView>(`/guide/trips/${id}`, { method: 'PUT', body }),
  remove: (id: string) => apiCommand(`/guide/trips/${id}`, { method: 'DELETE' }),
  share: (id: string, expiresOn: string) =>
    apiRequest<Shares>(`/guide/trips/${id}/shares`, { method: 'POST', body: { expiresOn } }),
  revoke: (id: string, shareId: string) =>
    apiRequest<Shares>(`/guide/trips/${id}/shares/${shareId}`, { method: 'DELETE' }),
  send: (id: string, shareId: string, clientIds: string[]) =>
    apiRequest<Shares>(`/guide/trips/${id}/shares/${shareId}/send`, {
      method: 'POST',
      body: { clientIds },
    }),
  shared: (token: string) => apiRequest<SharedTrip>(`/shared/trips/${encodeURIComponent(token)}`),
}

export const profileApi = {
  get: () => apiRequest<GuideProfileView>('/guide/profile'),
  save: (body: GuideProfile) =>
    apiRequest<GuideProfileView>('/guide/profile', { method: 'PUT', body }),
}
