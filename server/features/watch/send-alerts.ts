import pLimit from 'p-limit'
import { DAY_MS } from '../../../shared/time'
import type { Db } from '../../db/index'
import type { Logger } from '../../logger'
import { signLinkToken, type TokenKey } from '../auth/auth.tokens'
import { backoffMs, type OutboxPolicy } from '../../lib/backoff'
import { isPermanentMailError, type MailContext } from '../mail/mailer'
import { composeAlert, renderAlert, type AlertView } from './compose-alert'
import { matchWatches } from './watch-check'
import { watchRepo, type AlertKey, type AlertToSend, type Channel } from './watch.repo'

export const ALERT_POLICY: OutboxPolicy = {
  maxAttempts: 5,
  baseDelayMs: 60_000,
  maxDelayMs: 30 * 60_000,
  leaseMs: 10 * 60_000,
  batchSize: 500,
  concurrency: 4,
}

/** A channel that could not take an alert: `permanent` when trying again will not help. */
export class ChannelError extends Error {
  constructor(
    message: string,
    readonly permanent: boolean,
  ) {
    super(message)
  }
}

/** Sends an alert to one channel of its owner; resolves false when there is nobody to reach there. */
export type ChannelSender = (alert: AlertToSend, view: AlertView) => Promise<boolean>

export interface AlertDeps {
  db: Db
  log: Logger
  mail: MailContext
  /** Signs the links that stop a watch. */
  linkKey: TokenKey
  /** Web Push; without it (no keys configured) alerts go by mail only. */
  push?: ChannelSender
  now?: () => Date
  policy?: Partial<OutboxPolicy>
}

/** Links that stop a watch keep working for a year. */
const UNSUBSCRIBE_DAYS = 365

function mailSender(deps: AlertDeps): ChannelSender {
  return async (alert, view) => {
    // Mail goes only to a confirmed address, as the brief does.
    if (!alert.verified) return false
    const rendered = renderAlert(view)
    try {
      await deps.mail.mailer.send({
        to: alert.email,
        ...rendered,
        // The same id on every try: an alert resent after a crash is recognisably one message.
        messageId: `<watch.${alert.watchId}.${alert.date}.${alert.windowId}.${alert.episode}@chopline.invalid>`,
        headers: {
          'List-Unsubscribe': `<${view.oneClickUrl}>`,
          'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
        },
      })
    } catch (err) {
      throw new ChannelError(
        err instanceof Error ? err.message : String(err),
        isPermanentMailError(err),
      )
    }
    return true
  }
}

/**
 * Tells the owners of claimed alerts, each channel once: a channel that took an alert is recorded
 * at once, so a retry after another channel failed never repeats it.
 */
export async function deliverAlerts(deps: AlertDeps, keys: AlertKey[]) {
  const policy = { ...ALERT_POLICY, ...deps.policy }
  const clock = () => deps.now?.() ?? new Date()
  const repo = watchRepo(deps.db)
  const limit = pLimit(policy.concurrency)
  const senders: Record<Channel, ChannelSender | undefined> = {
    email: mailSender(deps),
    push: deps.push,
  }
  const totals = { sent: 0, retrying: 0, failed: 0 }

  async function deliver(alert: AlertToSend) {
    const token = await signLinkToken(deps.linkKey, {
      purpose: 'watch-unsubscribe',
      subject: alert.watchId,
      expiresAt: new Date(clock().getTime() + UNSUBSCRIBE_DAYS * DAY_MS),
    })
    const { origin } = deps.mail
    const view = composeAlert(alert, origin, {
      page: `${origin}/watch/stop?token=${token}`,
      oneClick: `${origin}/api/watch/unsubscribe?token=${token}`,
    })
    const errors: ChannelError[] = []
    for (const channel of alert.channels) {
      const send = senders[channel]
      // A server without push keys reaches nobody by push, as an angler without a device does.
      if (alert.delivered.includes(channel) || !send) continue
      try {
        if (await send(alert, view)) await repo.markDelivered(alert, channel, clock())
      } catch (err) {
        errors.push(err instanceof ChannelError ? err : new ChannelError(String(err), false))
      }
    }
    if (!errors.length) {
      await repo.markSent(alert, clock())
      totals.sent++
      return
    }
    const message = errors.map((e) => e.message).join('; ')
    const retry = errors.some((e) => !e.permanent) && alert.attempts < policy.maxAttempts
    const retryAt = retry
      ? new Date(clock().getTime() + backoffMs(policy, alert.attempts - 1))
      : null
    await repo.markFailed(alert, message, clock(), retryAt)
    if (retry) totals.retrying++
    else totals.failed++
    deps.log.warn(
      { watchId: alert.watchId, date: alert.date, attempts: alert.attempts },
      `watch alert not delivered: ${message}`,
    )
  }

  for (let i = 0; i < keys.length; i += policy.batchSize) {
    const batch = await repo.toSend(keys.slice(i, i + policy.batchSize))
    await Promise.all(batch.map((alert) => limit(() => deliver(alert))))
  }
  return totals
}

/**
 * After a refresh: every watch judged against the stored days, then the alerts this run claimed,
 * the retries that are due and those a dead runner left, told.
 */
export async function checkWatches(deps: AlertDeps) {
  const policy = { ...ALERT_POLICY, ...deps.policy }
  const now = deps.now?.() ?? new Date()
  const leaseUntil = new Date(now.getTime() + policy.leaseMs)
  const repo = watchRepo(deps.db)
  const started = performance.now()
  const matched = await matchWatches(deps.db, { now, leaseUntil })
  const matchMs = Math.round(performance.now() - started)
  const again: AlertKey[] = []
  for (;;) {
    const claims = await repo.claimAgain(now, leaseUntil, policy.batchSize)
    if (!claims.length) break
    again.push(...claims)
  }
  const totals = await deliverAlerts(deps, [...matched.claimed, ...again])
  return {
    watches: matched.watches,
    matchMs,
    claimed: matched.claimed.length,
    cleared: matched.cleared,
    retried: again.length,
    ...totals,
  }
}
