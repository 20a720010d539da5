import type { BankList, BankView, BankInput } from '@shared/schemas/banks'
import { apiCommand, apiRequest } from './http'

const base = (slug: string) => `/lakes/${encodeURIComponent(slug)}/banks`

export const banksApi = {
  list: (slug: string) => apiRequest<BankList>(base(slug)),
  create: (slug: string, bank: BankInput) =>
    apiRequest<BankView>(base(slug), { method: 'POST', body: bank }),
  update: (slug: string, id: string, bank: BankInput) =>
    apiRequest<BankView>(`${base(slug)}/${id}`, { method: 'PUT', body: bank }),
  remove: (slug: string, id: string) => apiCommand(`${base(slug)}/${id}`, { method: 'DELETE' }),
}
