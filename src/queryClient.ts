import { onlineManager, QueryClient } from '@tanstack/vue-query'
import { ApiError } from '@/api/http'

/**
 * Whether a failed query is worth asking again: a network failure or a server error may pass, but
 * a client error (no such lake, a date outside the plans, not allowed) answers the same every
 * time, so the page says so at once instead of showing loading bars through three retries.
 * A timeout (408) and too many requests (429) are worth another try.
 */
export function retryUnlessClientError(failureCount: number, error: Error): boolean {
  // Offline, nothing comes of asking again: the page says so, and refetches when the network is back.
  if (error instanceof ApiError && error.code === 'offline' && !onlineManager.isOnline())
    return false
  if (
    error instanceof ApiError &&
    error.status >= 400 &&
    error.status < 500 &&
    error.status !== 408 &&
    error.status !== 429
  )
    return false
  return failureCount < 3
}

/**
 * The app's one query cache: the plugin serves it to components, the router prefetches into it.
 * Queries ask even offline ('offlineFirst'): the service worker answers with what it kept.
 */
export const queryClient = new QueryClient({
  defaultOptions: { queries: { retry: retryUnlessClientError, networkMode: 'offlineFirst' } },
})
