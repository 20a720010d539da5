import type { Watch, WatchInput, WatchPatch } from '../../../shared/schemas/watch'
import { verifyLinkToken, type TokenKey } from '../auth/auth.tokens'
import { conflict, invalid, invalidLink, notFound as noSuch } from '../../http/errors'
import type { WatchRepo, WatchValues } from './watch.repo'

const notFound = () => noSuch('watch')

/** An angler's watches: each query is scoped to its owner, so another's watch is a 404. */
export function watchService(deps: { repo: WatchRepo; linkKey: TokenKey }) {
  const { repo } = deps

  /** The stored form of a watch: its lake by slug, its bank the angler's own and on that lake. */
  async function values(userId: string, input: WatchInput): Promise<WatchValues> {
    const lake = await repo.lake(input.lakeSlug)
    if (!lake) throw invalid('lakeSlug', 'No such lake.')
    if (input.bankId) {
      const bank = await repo.bankOf(userId, input.bankId)
      if (!bank) throw invalid('bankId', 'No such bank among yours.')
      if (bank.lakeId !== lake.id) throw invalid('bankId', 'That bank is on another lake.')
    }
    if (input.channels.includes('email') && !(await repo.verified(userId)))
      throw invalid(
        'channels',
        'Confirm your address first (Settings, Morning brief) to be told by e-mail.',
      )
    return {
      name: input.name,
      lakeId: lake.id,
      bankId: input.bankId,
      conditions: input.conditions,
      channels: input.channels,
      active: input.active,
    }
  }

  return {
    list: async (userId: string) => ({ items: await repo.list(userId) }),

    async create(userId: string, input: WatchInput): Promise<Watch> {
      const id = await repo.insert(userId, await values(userId, input))
      return (await repo.one(userId, id))!
    },

    async update(userId: string, id: string, input: WatchInput): Promise<Watch> {
      const kind = await repo.kindOf(userId, id)
      if (!kind) throw notFound()
      if (kind === 'trip')
        throw conflict(
          'trip_watch',
          'A trip’s watch follows its trip: pause it or change how you are told.',
        )
      await repo.update(userId, id, await values(userId, input))
      return (await repo.one(userId, id))!
    },

    async patch(userId: string, id: string, patch: WatchPatch): Promise<Watch> {
      if (patch.channels?.includes('email') && !(await repo.verified(userId)))
        throw invalid('channels', 'Confirm your address first to be told by e-mail.')
      if (!(await repo.update(userId, id, patch))) throw notFound()
      return (await repo.one(userId, id))!
    },

    async remove(userId: string, id: string) {
      if (!(await repo.remove(userId, id))) throw notFound()
    },

    /** A link from an alert pauses its watch; following it twice changes nothing. */
    async unsubscribe(token: string) {
      const link = await verifyLinkToken(deps.linkKey, 'watch-unsubscribe', token)
      if (!link) throw invalidLink('Pause or delete the watch from the Watches screen.')
      await repo.pause(link.subject)
    },
  }
}
export type WatchService = ReturnType<typeof watchService>
