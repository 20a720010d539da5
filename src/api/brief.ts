import { z } from 'zod'
import {
  BriefDeliveryList,
  BriefSettingsView,
  CaughtMail,
  CaughtMailList,
  type BriefDelivery,
  type BriefSettings,
} from '@shared/schemas/brief'
import { apiRequest } from './http'

const SentTo = z.object({ sentTo: z.string() })
const Verified = z.object({ email: z.string() })
const Unsubscribed = z.object({ unsubscribed: z.literal(true) })

export const briefApi = {
  get: () => apiRequest(BriefSettingsView, '/me/brief'),
  save: (body: BriefSettings) =>
    apiRequest(BriefSettingsView, '/me/brief', { method: 'PUT', body }),
  requestVerification: () => apiRequest(SentTo, '/me/brief/verification', { method: 'POST' }),
  verify: (token: string) =>
    apiRequest(Verified, '/brief/verify', { method: 'POST', body: { token } }),
  unsubscribe: (token: string) =>
    apiRequest(Unsubscribed, '/brief/unsubscribe', { method: 'POST', query: { token } }),
  undelivered: (status?: BriefDelivery['status']) =>
    apiRequest(BriefDeliveryList, '/admin/brief-deliveries', { query: { status } }),
  mailbox: () => apiRequest(CaughtMailList, '/admin/mailbox'),
  mail: (id: number) => apiRequest(CaughtMail, `/admin/mailbox/${id}`),
}
