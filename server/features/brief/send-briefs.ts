import pLimit from 'p-limit'
import type { Bank } from '../../../shared/conditions/ranking'
import type { LogCatch } from '../../../shared/journal/feedback'
import { DAY_MS } from '../../../shared/time'
import type { Db } from '../../db/index'
import type { Logger } from '../../logger'
import { signLinkToken, type TokenKey } from '../auth/auth.tokens'
import { backoffMs, type OutboxPolicy } from '../../lib/backoff'
import { logCatches } from '../journal/your-log'
import { isPermanentMailError, type MailContext } from '../mail/mailer'
import { briefSendsRepo, type CachedLake, type Claim, type Recipient } from './brief-sends.repo'
import { composeBrief, renderBrief } from './compose'

export const BRIEF_POLICY: OutboxPolicy = {
  maxAttempts: 5,
  baseDelayMs: 2 * 60_000,
  maxDelayMs: 60 * 60_000,
  leaseMs: 10 * 60_000,
  batchSize: 500,
  concurrency: 4,
}

export interface BriefDeps {
  db: Db
  log: Logger
  mail: MailContext
  /** The key that signs unsubscribe links. */
  linkKey: TokenKey
  now?: () => Date
  policy?: Partial<OutboxPolicy>
}

/** Unsubscribe links keep working long after the brief is read. */
const UNSUBSCRIBE_DAYS = 365

/**
 * Sends every brief that is due: first the retries and the briefs whose runner died, then the
 * subscribers whose send time has passed. Each brief is claimed (a row per subscriber and local
 * date) before it is composed, and marked sent the moment the SMTP server accepts it.
 */
export async function sendBriefs(deps: BriefDeps) {
  const policy = { ...BRIEF_POLICY, ...deps.policy }
  const clock = () => deps.now?.() ?? new Date()
  const now = clock()
  const repo = briefSendsRepo(deps.db)
  const limit = pLimit(policy.concurrency)
  const lakes = new Map<string, CachedLake>()
  const totals = { sent: 0, retrying: 0, failed: 0 }

  await repo.expirePast(now)

  /** The cached lakes a batch needs that earlier batches have not loaded. */
  async function loadLakes(claims: Claim[], recipients: Map<string, Recipient>) {
    const missing = new Map<string, { lakeId: string; date: string }>()
    for (const c of claims)
      for (const lakeId of recipients.get(c.userId)?.lakeIds ?? []) {
        const key = `${lakeId} ${c.localDate}`
        if (!lakes.has(key)) missing.set(key, { lakeId, date: c.localDate })
      }
    if (!missing.size) return
    for (const lake of await repo.lakes([...missing.values()]))
      lakes.set(`${lake.id} ${lake.date}`, lake)
  }

  /** Records a try that failed: another later when it may still succeed, else failed for good. */
  async function fail(claim: Claim, err: unknown, retryable: boolean) {
    const message = err instanceof Error ? err.message : String(err)
    const retry = retryable && claim.attempts < policy.maxAttempts
    const retryAt = retry ? new Date(now.getTime() + backoffMs(policy, claim.attempts - 1)) : null
    await repo.markFailed(claim, message, clock(), retryAt)
    if (retry) totals.retrying++
    else totals.failed++
    deps.log.warn(
      { userId: claim.userId, localDate: claim.localDate, attempts: claim.attempts, retryAt },
      `morning brief not delivered: ${message}`,
    )
  }

  async function deliver(
    claim: Claim,
    to: Recipient,
    banks: Map<string, Bank[]>,
    logs: Map<string, LogCatch[]>,
  ) {
    const { origin } = deps.mail
    const token = await signLinkToken(deps.linkKey, {
      purpose: 'brief-unsubscribe',
      subject: to.userId,
      expiresAt: new Date(now.getTime() + UNSUBSCRIBE_DAYS * DAY_MS),
    })
    let rendered
    try {
      rendered = renderBrief(
        composeBrief({
          date: claim.localDate,
          units: to.units,
          origin,
          unsubscribeUrl: `${origin}/unsubscribe?token=${token}`,
          log: logs.get(to.userId) ?? [],
          lakes: to.lakeIds.map((lakeId) => ({
            ...lakes.get(`${lakeId} ${claim.localDate}`)!,
            banks: banks.get(`${to.userId} ${lakeId}`) ?? [],
          })),
        }),
      )
    } catch (err) {
      // Bad cached data will not mend itself by the next try; one subscriber never stops the rest.
      return fail(claim, err, false)
    }
    let sent
    try {
      sent = await deps.mail.mailer.send({
        to: to.email,
        ...rendered,
        // The same id on every try, so a brief resent after a crash is recognisably one message.
        messageId: `<brief.${claim.localDate}.${to.userId}@chopline.invalid>`,
        headers: {
          'List-Unsubscribe': `<${origin}/api/brief/unsubscribe?token=${token}>`,
          'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
        },
      })
    } catch (err) {
      return fail(claim, err, !isPermanentMailError(err))
    }
    // Outside the catch: a database error here must not count as a refused send and retry it.
    await repo.markSent(claim, sent.messageId, clock())
    totals.sent++
  }

  async function deliverBatch(claims: Claim[]) {
    const userIds = claims.map((c) => c.userId)
    const recipients = new Map((await repo.recipients(userIds)).map((r) => [r.userId, r]))
    const [, bankRows, logs] = await Promise.all([
      loadLakes(claims, recipients),
      repo.banks(userIds),
      logCatches(deps.db, userIds),
    ])
    const banks = new Map<string, Bank[]>()
    for (const { userId, lakeId, depthM, ...bank } of bankRows) {
      const key = `${userId} ${lakeId}`
      const list = banks.get(key) ?? []
      list.push({ ...bank, depthM: depthM ?? undefined })
      banks.set(key, list)
    }
    await Promise.all(
      claims.map((claim) =>
        limit(async () => {
          const to = recipients.get(claim.userId)
          // Gone since the claim (account deleted): nothing to send, and the row went with it.
          if (to) await deliver(claim, to, banks, logs)
        }),
      ),
    )
  }

  const leaseUntil = new Date(now.getTime() + policy.leaseMs)
  let claimed = 0
  for (const claim of [repo.claimAgain, repo.claimDue]) {
    for (;;) {
      const claims = await claim(now, leaseUntil, policy.batchSize)
      if (!claims.length) break
      claimed += claims.length
      await deliverBatch(claims)
    }
  }
  return { claimed, ...totals }
}
