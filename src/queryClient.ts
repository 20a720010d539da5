import { QueryClient } from '@tanstack/vue-query'
import { ApiError } from '@/api/http'

/**
 * Whether a failed query is worth asking again: a network failure or a server error may pass, but
 * a client error (no such lake, a date outside the plans, not allowed) answers the same every
 * time, so the page says so at once instead of showing loading bars through three retries.
 * A timeout (408) and too many requests (429) are worth another try.
 */
export function retryUnlessClientError(failureCount: number, error: Error): boolean {
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

/** The app's one query cache: the plugin serves it to components, the router prefetches into it. */
export const queryClient = new QueryClient({
  defaultOptions: { queries: { retry: retryUnlessClientError } },
})
