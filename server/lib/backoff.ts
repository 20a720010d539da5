/** Retry delays shared by the feed client and the mail and push senders. */
export interface Backoff {
  baseDelayMs: number
  maxDelayMs: number
}

/** How an outbox (briefs, watch alerts) is worked through: tries, backoff, leases and batches. */
export interface OutboxPolicy extends Backoff {
  /** Tries per message before it is recorded as failed. */
  maxAttempts: number
  /** How long a claimed message is left to its runner before another run takes it over. */
  leaseMs: number
  /** Messages claimed per round trip. */
  batchSize: number
  /** Sends in flight at once. */
  concurrency: number
}

/** Exponential backoff with "equal jitter": half the delay fixed, half random. */
export function backoffMs(policy: Backoff, attempt: number): number {
  const ceiling = Math.min(policy.maxDelayMs, policy.baseDelayMs * 2 ** attempt)
  return ceiling / 2 + (Math.random() * ceiling) / 2
}

/** What a failed delivery try writes on its outbox row (briefs, watch alerts): `retryAt` schedules another, null gives up. */
export const failedTry = (error: string, at: Date, retryAt: Date | null) => ({
  status: retryAt ? ('retry' as const) : ('failed' as const),
  nextAttemptAt: retryAt,
  lastError: error,
  leaseUntil: null,
  updatedAt: at,
})
