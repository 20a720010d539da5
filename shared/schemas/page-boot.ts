import type { User } from './auth'
import type { LakeRead } from './lake-read'
import type { Settings } from './settings'

/**
 * What the server writes into a page for its first render, as JSON in the element with this id:
 * the signed-in user, their settings and, on a Lake read, the read itself. A page that has it
 * draws at once instead of waiting on three API round trips over a phone's weak signal.
 */
export const PAGE_BOOT_ID = 'page-boot'

export interface PageBoot {
  user: User | null
  settings?: Settings
  lakeRead?: LakeRead
}
