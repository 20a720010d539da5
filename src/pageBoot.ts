import type { Pinia } from 'pinia'
import { lakeApiPaths, lakeReadQuery } from '@/api/lakes'
import { answeredAt } from '@/offline/network'
import { settingsQuery } from '@/api/settings'
import { queryClient } from '@/queryClient'
import { useAuthStore } from '@/stores/auth'
import { PAGE_BOOT_ID, type PageBoot } from '@shared/schemas/page-boot'

/**
 * Takes the data the server wrote into the page (absent under `npm run dev`) into the stores and
 * the query cache, once, before the router's first navigation: the first page then renders in the
 * task that loads the app, with no request for who is signed in, their units or the lake.
 */
export function adoptPageBoot(pinia: Pinia) {
  const element = document.getElementById(PAGE_BOOT_ID)
  if (!element?.textContent) return
  element.remove()
  const boot = JSON.parse(element.textContent) as PageBoot
  useAuthStore(pinia).adopt(boot.user)
  if (boot.settings) queryClient.setQueryData(settingsQuery.queryKey, boot.settings)
  if (boot.lakeRead) {
    queryClient.setQueryData(lakeReadQuery(boot.lakeRead.lake.slug).queryKey, boot.lakeRead)
    answeredAt.set(lakeApiPaths.read(boot.lakeRead.lake.slug), Date.now())
  }
}
