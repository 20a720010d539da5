/** Retry delays shared by the feed client and the mail and push senders. */
export interface Backoff {
  baseDelayMs: number
  maxDelayMs: number
}

/** Exponential backoff with "equal jitter": half the delay fixed, half random. */
export function backoffMs(policy: Backoff, attempt: number): number {
  const ceiling = Math.min(policy.maxDelayMs, policy.baseDelayMs * 2 ** attempt)
  return ceiling / 2 + (Math.random() * ceiling) / 2
}
