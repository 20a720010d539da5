import type { BankList, BankView, BankInput } from '@shared/schemas/banks'
import type { MaybeRef } from 'vue'
import { apiCommand, apiRequest } from './http'

const base = (slug: string) => `/lakes/${encodeURIComponent(slug)}/banks`

/** The banks domain's query keys: an angler's banks on one lake. */
export const bankKeys = {
  all: ['banks'] as const,
  list: (slug: MaybeRef<string>) => ['banks', slug] as const,
}

export const banksApi = {
  list: (slug: string) => apiRequest<BankList>(base(slug)),
  create: (slug: string, bank: BankInput) =>
    apiRequest<BankView>(base(slug), { method: 'POST', body: bank }),
  update: (slug: string, id: string, bank: BankInput) =>
    apiRequest<BankView>(`${base(slug)}/${id}`, { method: 'PUT', body: bank }),
  remove: (slug: string, id: string) => apiCommand(`${base(slug)}/${id}`, { method: 'DELETE' }),
}
