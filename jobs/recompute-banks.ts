import { banksRepo } from '../server/features/banks/banks.repo'
import { recomputeOldExposure } from '../server/features/banks/banks.service'
import { withJobLock } from '../server/db/job-lock'
import { runFromCli, type JobContext } from './cli'

/**
 * Run once at every start (`startScheduler`): banks whose stored exposure table an older engine
 * made get it made again, so a new facing rule reaches banks saved before it.
 */
export function runRecomputeBanks(ctx: Pick<JobContext, 'db' | 'log'>) {
  return withJobLock(ctx.db, 'recompute-banks', ctx.log, () =>
    recomputeOldExposure(banksRepo(ctx.db)),
  )
}

runFromCli(import.meta.url, (ctx) => runRecomputeBanks(ctx))
