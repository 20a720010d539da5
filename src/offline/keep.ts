import type { Me } from '@shared/schemas/auth'
import type { LakeRead } from '@shared/schemas/lake-read'
import type { LakePage } from '@shared/schemas/lakes'
import { addDays, localDate } from '@shared/time'

/** Asking again within this long does nothing: the answers were kept a moment ago. */
const EVERY_MS = 10 * 60_000
const MAX_PAGES = 5
let keptAt = 0
let running: Promise<void> | null = null

/**
 * Reads, through the service worker (which keeps each answer), what an angler needs at the ramp
 * with no network: who they are and their settings (a page served with its data never asked), and
 * for each lake they follow its read, today's and tomorrow's Day plan, and their banks. Runs only
 * online, signed in and under the worker's control; at most every ten minutes.
 */
export function keepForTheRamp(): Promise<void> {
  if (
    running ||
    Date.now() - keptAt < EVERY_MS ||
    !navigator.onLine ||
    !navigator.serviceWorker?.controller
  )
    return running ?? Promise.resolve()
  running = keep().finally(() => (running = null))
  return running
}

async function get<T>(path: string): Promise<T | null> {
  try {
    const res = await fetch(`/api${path}`, { credentials: 'same-origin' })
    return res.ok ? ((await res.json()) as T) : null
  } catch {
    return null
  }
}

async function keep() {
  const me = await get<Me>('/me')
  if (!me?.user) return
  await get('/me/settings')
  const slugs: string[] = []
  // The Lakes screen's own first page, so it opens offline too.
  for (let page = 1; page <= MAX_PAGES; page++) {
    const list = await get<LakePage>(`/lakes?page=${page}&pageSize=20`)
    if (!list) break
    slugs.push(...list.items.filter((l) => l.subscribed).map((l) => l.slug))
    if (page * 20 >= list.total) break
  }
  for (const slug of slugs) {
    const path = `/lakes/${encodeURIComponent(slug)}`
    const read = await get<LakeRead>(`${path}/read`)
    if (!read) continue
    const today = localDate(new Date(), read.lake.timeZone)
    await Promise.all([
      get(`${path}/plan/${today}`),
      get(`${path}/plan/${addDays(today, 1)}`),
      get(`${path}/banks`),
    ])
  }
  keptAt = Date.now()
}
