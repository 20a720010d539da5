import type {
  BriefDeliveryList,
  BriefSettingsView,
  CaughtMail,
  CaughtMailList,
  BriefDelivery,
  BriefSettings,
} from '@shared/schemas/brief'
import type { MaybeRef } from 'vue'
import { apiRequest } from './http'

const ADMIN = ['admin'] as const
export const briefKeys = {
  settings: ['brief'] as const,
  /** The admin's Mail page: undelivered briefs and caught mail (watch alerts: `watchKeys`). */
  deliveries: (status: MaybeRef<string>) => [...ADMIN, 'brief-deliveries', status] as const,
  mailbox: [...ADMIN, 'mailbox'] as const,
  mail: (id: MaybeRef<number | null>) => [...ADMIN, 'mailbox', id] as const,
}

type SentTo = { sentTo: string }
type Verified = { email: string }
type Unsubscribed = { unsubscribed: true }

export const briefApi = {
  get: () => apiRequest<BriefSettingsView>('/me/brief'),
  save: (body: BriefSettings) =>
    apiRequest<BriefSettingsView>('/me/brief', { method: 'PUT', body }),
  requestVerification: () => apiRequest<SentTo>('/me/brief/verification', { method: 'POST' }),
  verify: (token: string) =>
    apiRequest<Verified>('/brief/verify', { method: 'POST', body: { token } }),
  unsubscribe: (token: string) =>
    apiRequest<Unsubscribed>('/brief/unsubscribe', { method: 'POST', query: { token } }),
  undelivered: (status?: BriefDelivery['status']) =>
    apiRequest<BriefDeliveryList>('/admin/brief-deliveries', { query: { status } }),
  mailbox: () => apiRequest<CaughtMailList>('/admin/mailbox'),
  mail: (id: number) => apiRequest<CaughtMail>(`/admin/mailbox/${id}`),
}
