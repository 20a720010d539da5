import { tokenKey } from '../server/features/auth/auth.tokens'
import { withJobLock } from '../server/db/job-lock'
import { checkWatches, type AlertDeps } from '../server/features/watch/send-alerts'
import { runFromCli, type JobContext } from './cli'

/**
 * After each refresh of the lakes' days (the ingest jobs run it): every watch judged, new matches
 * told once. The alert rows' keys keep it once per watch and window even without the lock.
 */
export function runCheckWatches(
  ctx: Pick<JobContext, 'db' | 'log' | 'mail' | 'sessionSecret'> &
    Pick<AlertDeps, 'now' | 'policy' | 'push'>,
) {
  return withJobLock(ctx.db, 'check-watches', ctx.log, () =>
    checkWatches({ ...ctx, linkKey: tokenKey(ctx.sessionSecret) }),
  )
}

runFromCli(import.meta.url, (ctx) => runCheckWatches(ctx))
