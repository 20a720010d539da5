import { tokenKey } from '../server/features/auth/auth.tokens'
import { sendBriefs, type BriefDeps } from '../server/features/brief/send-briefs'
import { withJobLock, type JobSlot } from '../server/db/job-lock'
import { runFromCli, type JobContext } from './cli'

/** Every five minutes: briefs whose local send time has passed, and retries that are due. */
export const SEND_BRIEFS_CRON = '*/5 * * * *'

export function runSendBriefs(
  ctx: Pick<JobContext, 'db' | 'log' | 'mail' | 'sessionSecret'> &
    Pick<BriefDeps, 'now' | 'policy'>,
  slot?: JobSlot,
) {
  return withJobLock(
    ctx.db,
    'send-briefs',
    ctx.log,
    () => sendBriefs({ ...ctx, linkKey: tokenKey(ctx.sessionSecret) }),
    slot,
  )
}

runFromCli(import.meta.url, (ctx) => runSendBriefs(ctx))
