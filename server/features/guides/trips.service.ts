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
import { conflict, gone, invalid, notFound } from '../../http/errors'
import { signLinkToken, verifyLinkToken, type TokenKey } from '../auth/auth.tokens'
import type { MailContext } from '../mail/mailer'
import { mailTemplate } from '../mail/render'
import type { ClientsRepo } from './clients.repo'
import type { ProfileRepo } from './profile.repo'
import type { TripsRepo } from './trips.repo'

type TripRow = NonNullable<Awaited<ReturnType<TripsRepo['get']>>>

const noTrip = () => notFound('trip')

/** A trip is planned, or kept, within this many days of today at its lake. */
export const TRIP_DAYS_AWAY = 2 * 366
/** A share link lasts at most this many days. */
export const SHARE_MAX_DAYS = 366

/** The day chosen for a link: it ends at the start of the next day at the lake. */
const lastDay = (expiresAt: Date, timeZone: string) =>
  localDate(new Date(expiresAt.getTime() - 1), timeZone)

const renderShare = mailTemplate<{
  subject: string
  lake: string
  day: string
  meetingPoint: string
  meetingTime: string
  url: string
  expires: string
  /** The guide's name and contact from their profile; null without one. */
  guide: string | null
  contact: string | null
}>('trip-share')

export function tripsService(deps: {
  repo: TripsRepo
  clients: ClientsRepo
  profiles: ProfileRepo
  mail: MailContext
  linkKey: TokenKey
  now?: () => Date
}) {
  const { repo, mail, linkKey } = deps
  const now = () => deps.now?.() ?? new Date()

  async function owned(guideId: string, id: string): Promise<TripRow> {
    const trip = await repo.get(id, guideId)
    if (!trip) throw noTrip()
    return trip
  }

  /** The trip and link a share token names, while the link holds (404 unknown, 410 withdrawn or past). */
  async function openLink(token: string) {
    const link = await verifyLinkToken(linkKey, 'trip-share', token)
    const share = link && (await repo.share(link.subject))
    if (!share) throw notFound('link', 'This link is not one of ours.')
    if (share.revokedAt) throw gone('link_revoked', 'Your guide has withdrawn this link.')
    if (share.expiresAt <= now())
      throw gone('link_expired', 'This link has expired. Ask your guide for a new one.')
    const trip = await repo.get(share.tripId, null)
    if (!trip) throw gone('link_revoked', 'This trip has been cancelled.')
    return { trip, share }
  }

  /**
   * The trip as its client sees it: the cached day for its date with the trip's banks ranked, who
   * guides it, and (opened by a link) the last day the link works.
   */
  async function shared(trip: TripRow, link?: { expiresAt: Date }): Promise<SharedTrip> {
    const [banks, cached, guide] = await Promise.all([
      repo.tripBanks(trip.id),
      repo.day(trip.lakeId, trip.date),
      deps.profiles.get(trip.guideId),
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
        : trip.date < localDate(now(), trip.timeZone)
          ? 'This day has passed, and no plan was kept for it.'
          : 'The forecast does not reach this day yet; the plan appears here when it does.',
      cautions: plan?.cautions ?? [AUTHORITY_CAUTION],
      computedAt: isoOrNull(cached?.computedAt),
      guide,
      linkEndsOn: link ? lastDay(link.expiresAt, trip.timeZone) : null,
    }
  }

  const shareUrl = async (shareId: string) =>
    `${mail.origin}/trip/${await signLinkToken(linkKey, { purpose: 'trip-share', subject: shareId })}`

  async function shareViews(tripId: string, timeZone: string): Promise<ShareView[]> {
    const shares = await repo.shares(tripId)
    const sends = await repo.sends(shares.map((s) => s.id))
    return Promise.all(
      shares.map(async (s) => ({
        id: s.id,
        url: await shareUrl(s.id),
        expiresAt: s.expiresAt.toISOString(),
        expiresOn: lastDay(s.expiresAt, timeZone),
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
    const [client, shares] = await Promise.all([shared(trip), shareViews(trip.id, trip.timeZone)])
    return {
      ...client,
      id: trip.id,
      lake: { slug: trip.lakeSlug, name: trip.lakeName, timeZone: trip.timeZone },
      shares,
    }
  }

  /** The lake and banks of a trip as typed, checked: the banks must be the guide's, on that lake. */
  async function values(guideId: string, input: TripInput) {
    const lake = await repo.lake(input.lakeSlug)
    if (!lake) throw invalid('lakeSlug', 'No such lake.')
    const today = localDate(now(), lake.timeZone)
    if (input.date < addDays(today, -TRIP_DAYS_AWAY) || input.date > addDays(today, TRIP_DAYS_AWAY))
      throw invalid('date', 'Choose a day within two years of today.')
    const lakeId = lake.id
    const found = await repo.ownedBanks(guideId, lakeId, input.bankIds)
    if (found.length !== input.bankIds.length)
      throw invalid('bankIds', 'Choose from your own banks on this lake.')
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
      if (!(await repo.save(guideId, id, v.values, v.bankIds))) throw noTrip()
      return view(guideId, id)
    },
    async remove(guideId: string, id: string) {
      if (!(await repo.remove(guideId, id))) throw noTrip()
    },

    /** A new link for the trip, good through the end of `expiresOn` at the lake. */
    async share(guideId: string, id: string, expiresOn: string): Promise<ShareView[]> {
      const trip = await owned(guideId, id)
      const today = localDate(now(), trip.timeZone)
      if (expiresOn < today) throw invalid('expiresOn', 'Choose a day from today on.')
      if (expiresOn > addDays(today, SHARE_MAX_DAYS))
        throw invalid('expiresOn', 'A link lasts at most a year: choose an earlier day.')
      await repo.createShare(trip.id, localDayBounds(expiresOn, trip.timeZone)[1])
      return shareViews(trip.id, trip.timeZone)
    },
    async revoke(guideId: string, id: string, shareId: string): Promise<ShareView[]> {
      const trip = await owned(guideId, id)
      if (!(await repo.revokeShare(trip.id, shareId, now())))
        throw notFound('link', 'No such link on this trip.')
      return shareViews(trip.id, trip.timeZone)
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
      if (!link || link.tripId !== trip.id) throw notFound('link', 'No such link on this trip.')
      if (link.revokedAt || link.expiresAt <= now())
        throw conflict('link_ended', 'This link has ended; make a new one to send.')
      const chosen = await deps.clients.byIds(guideId, clientIds)
      if (chosen.length !== new Set(clientIds).size)
        throw invalid('clientIds', 'Choose from your own clients.')
      const url = await shareUrl(link.id)
      const guide = await deps.profiles.get(guideId)
      const contact = guide && [guide.phone, guide.email].filter(Boolean).join(' or ')
      const message = renderShare({
        guide: guide?.name ?? null,
        contact: contact || null,
        subject: `Your fishing trip on ${trip.lakeName}, ${dateLabel(trip.date)}`,
        lake: trip.lakeName,
        day: dateLabel(trip.date, 'long'),
        meetingPoint: trip.meetingPoint,
        meetingTime: trip.meetingTime.slice(0, 5),
        url,
        expires: dateLabel(lastDay(link.expiresAt, trip.timeZone), 'long'),
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
      return shareViews(trip.id, trip.timeZone)
    },

    /** What a share link opens: 404 for a link that is not ours, 410 once it is revoked or expired. */
    async openShared(token: string): Promise<SharedTrip> {
      const { trip, share } = await openLink(token)
      return shared(trip, share)
    },

    /** The trip a share link names, while the link holds. */
    sharedTrip: async (token: string) => (await openLink(token)).trip,
  }
}
export type TripsService = ReturnType<typeof tripsService>
