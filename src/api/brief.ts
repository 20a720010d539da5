import type {
  BriefDeliveryList,
  BriefSettingsView,
  CaughtMail,
  CaughtMailList,
  BriefDelivery,
  BriefSettings,
} from '@shared/schemas/brief'
import { apiRequest } from './http'

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
