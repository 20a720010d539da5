import { planForBanks } from '../../../shared/conditions/day-plan'
import { AUTHORITY_CAUTION } from '../../../shared/conditions/safety'
import type {
  SharedTrip,
  ShareView,
  TripInput,
  TripList,
  TripView,
} from '../../../shared/schemas/guides'
import { addDays, dateLabel, isoOrNull, localDate, localDayBounds } from '../../../shared/time'
import { HttpError } from '../../http/errors'
import { signLinkToken, verifyLinkToken, type TokenKey } from '../auth/auth.tokens'
import type { MailContext } from '../mail/mailer'
import { mailTemplate } from '../mail/render'
import type { ClientsRepo } from './clients.repo'
import type { TripsRepo } from './trips.repo'

type TripRow = NonNullable<Awaited<ReturnType<TripsRepo['get']>>>

const notFound = () => new HttpError(404, 'not_found', 'No such trip.')

const renderShare = mailTemplate<{
  subject: string
  lake: string
  day: string
  meetingPoint: string
  meetingTime: string
  url: string
  expires: string
}>('trip-share')

export function tripsService(deps: {
  repo: TripsRepo
  clients: ClientsRepo
  mail: MailContext
  linkKey: TokenKey
  now?: () => Date
}) {
  const { repo, mail, linkKey } = deps
  const now = () => deps.now?.() ?? new Date()

  async function owned(guideId: string, id: string): Promise<TripRow> {
    const trip = await repo.get(id, guideId)
    if (!trip) throw notFound()
    return trip
  }

  /** The trip a share link names, while the link holds (the same 404 and 410 as `openShared`). */
  async function sharedTrip(token: string): Promise<TripRow> {
    const link = await verifyLinkToken(linkKey, 'trip-share', token)
    const share = link && (await repo.share(link.subject))
    if (!share) throw new HttpError(404, 'not_found', 'This link is not one of ours.')
    if (share.revokedAt)
      throw new HttpError(410, 'link_revoked', 'Your guide has withdrawn this link.')
    if (share.expiresAt <= now())
      throw new HttpError(
        410,
        'link_expired',
        'This link has expired. Ask your guide for a new one.',
      )
    const trip = await repo.get(share.tripId, null)
    if (!trip) throw new HttpError(410, 'link_revoked', 'This trip has been cancelled.')
    return trip
  }

  /** The trip as its client sees it: the cached day for its date with the trip's banks ranked. */
  async function shared(trip: TripRow): Promise<SharedTrip> {
    const [banks, cached] = await Promise.all([
      repo.tripBanks(trip.id),
      repo.day(trip.lakeId, trip.date),
    ])
    const plan = cached
      ? planForBanks(
          cached.day,
          banks.map((b) => ({ ...b, depthM: b.depthM ?? undefined })),
        )
      : null
    return {
      lake: { name: trip.lakeName, timeZone: trip.timeZone },
      date: trip.date,
      meetingPoint: trip.meetingPoint,
      meetingTime: trip.meetingTime.slice(0, 5),
      tackle: trip.tackle,
      notes: trip.notes,
      banks: banks.map((b) => ({ id: b.id, name: b.name })),
      plan,
      unavailable: plan
        ? null
        : 'The forecast does not reach this day yet; the plan appears here when it does.',
      cautions: plan?.cautions ?? [AUTHORITY_CAUTION],
      computedAt: isoOrNull(cached?.computedAt),
    }
  }

  const shareUrl = async (shareId: string) =>
    `${mail.origin}/trip/${await signLinkToken(linkKey, { purpose: 'trip-share', subject: shareId })}`

  async function shareViews(tripId: string): Promise<ShareView[]> {
    const shares = await repo.shares(tripId)
    const sends = await repo.sends(shares.map((s) => s.id))
    return Promise.all(
      shares.map(async (s) => ({
        id: s.id,
        url: await shareUrl(s.id),
        expiresAt: s.expiresAt.toISOString(),
        revokedAt: isoOrNull(s.revokedAt),
        createdAt: s.createdAt.toISOString(),
        sends: sends
          .filter((x) => x.shareId === s.id)
          .map((x) => ({
            name: x.name,
            email: x.email,
            status: x.status,
            error: x.error,
            sentAt: x.sentAt.toISOString(),
          })),
      })),
    )
  }

  async function view(guideId: string, id: string): Promise<TripView> {
    const trip = await owned(guideId, id)
    const [client, shares] = await Promise.all([shared(trip), shareViews(trip.id)])
    return {
      ...client,
      id: trip.id,
      lake: { slug: trip.lakeSlug, name: trip.lakeName, timeZone: trip.timeZone },
      shares,
    }
  }

  /** The lake and banks of a trip as typed, checked: the banks must be the guide's, on that lake. */
  async function values(guideId: string, input: TripInput) {
    const lakeId = await repo.lakeId(input.lakeSlug)
    if (!lakeId)
      throw new HttpError(400, 'invalid_input', 'Some fields need attention.', {
        lakeSlug: 'No such lake.',
      })
    const found = await repo.ownedBanks(guideId, lakeId, input.bankIds)
    if (found.length !== input.bankIds.length)
      throw new HttpError(400, 'invalid_input', 'Some fields need attention.', {
        bankIds: 'Choose from your own banks on this lake.',
      })
    const { lakeSlug: _slug, bankIds, ...rest } = input
    return { values: { ...rest, lakeId }, bankIds }
  }

  return {
    async list(guideId: string): Promise<TripList> {
      return {
        items: (await repo.list(guideId)).map((t) => ({
          id: t.id,
          lake: { slug: t.lakeSlug, name: t.lakeName },
          date: t.date,
          meetingPoint: t.meetingPoint,
          meetingTime: t.meetingTime.slice(0, 5),
          bankCount: t.bankCount,
        })),
      }
    },
    view,
    async create(guideId: string, input: TripInput): Promise<TripView> {
      const v = await values(guideId, input)
      const id = await repo.save(guideId, null, v.values, v.bankIds)
      return view(guideId, id!)
    },
    async update(guideId: string, id: string, input: TripInput): Promise<TripView> {
      await owned(guideId, id)
      const v = await values(guideId, input)
      if (!(await repo.save(guideId, id, v.values, v.bankIds))) throw notFound()
      return view(guideId, id)
    },
    async remove(guideId: string, id: string) {
      if (!(await repo.remove(guideId, id))) throw notFound()
    },

    /** A new link for the trip, good through the end of `expiresOn` at the lake. */
    async share(guideId: string, id: string, expiresOn: string): Promise<ShareView[]> {
      const trip = await owned(guideId, id)
      if (expiresOn < localDate(now(), trip.timeZone))
        throw new HttpError(400, 'invalid_input', 'Some fields need attention.', {
          expiresOn: 'Choose a day from today on.',
        })
      await repo.createShare(trip.id, localDayBounds(expiresOn, trip.timeZone)[1])
      return shareViews(trip.id)
    },
    async revoke(guideId: string, id: string, shareId: string): Promise<ShareView[]> {
      const trip = await owned(guideId, id)
      if (!(await repo.revokeShare(trip.id, shareId, now())))
        throw new HttpError(404, 'not_found', 'No such link on this trip.')
      return shareViews(trip.id)
    },

    /** E-mails a link to chosen clients of the guide; each send is recorded, sent or failed. */
    async send(
      guideId: string,
      id: string,
      shareId: string,
      clientIds: string[],
    ): Promise<ShareView[]> {
      const trip = await owned(guideId, id)
      const link = await repo.share(shareId)
      if (!link || link.tripId !== trip.id)
        throw new HttpError(404, 'not_found', 'No such link on this trip.')
      if (link.revokedAt || link.expiresAt <= now())
        throw new HttpError(409, 'link_ended', 'This link has ended; make a new one to send.')
      const chosen = await deps.clients.byIds(guideId, clientIds)
      if (chosen.length !== new Set(clientIds).size)
        throw new HttpError(400, 'invalid_input', 'Some fields need attention.', {
          clientIds: 'Choose from your own clients.',
        })
      const url = await shareUrl(link.id)
      const message = renderShare({
        subject: `Your fishing trip on ${trip.lakeName}, ${dateLabel(trip.date)}`,
        lake: trip.lakeName,
        day: dateLabel(trip.date, 'long'),
        meetingPoint: trip.meetingPoint,
        meetingTime: trip.meetingTime.slice(0, 5),
        url,
        expires: dateLabel(addDays(link.expiresAt.toISOString().slice(0, 10), -1), 'long'),
      })
      const outcomes = await Promise.all(
        chosen.map(async (c) => {
          try {
            await mail.mailer.send({ to: c.email, ...message })
            return { status: 'sent' as const, error: null }
          } catch (err) {
            return {
              status: 'failed' as const,
              error: err instanceof Error ? err.message : String(err),
            }
          }
        }),
      )
      await repo.recordSends(
        chosen.map((c, i) => ({
          shareId: link.id,
          clientId: c.id,
          name: c.name,
          email: c.email,
          ...outcomes[i]!,
          sentAt: now(),
        })),
      )
      return shareViews(trip.id)
    },

    /** What a share link opens: 404 for a link that is not ours, 410 once it is revoked or expired. */
    async openShared(token: string): Promise<SharedTrip> {
      return shared(await sharedTrip(token))
    },

    sharedTrip,
  }
}
export type TripsService = ReturnType<typeof tripsService>
