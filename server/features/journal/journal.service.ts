import { randomUUID } from 'node:crypto'
import { nearestBank } from '../../../shared/geo/nearest'
import { insights, MIN_SAMPLE, seasonOf } from '../../../shared/journal/insights'
import { roleAllows } from '../../../shared/roles'
import type { User } from '../../../shared/schemas/auth'
import type {
  CatchConditions,
  CatchInput,
  CatchList,
  CatchListQuery,
  CatchView,
  Insights,
  InsightsQuery,
  PhotoUpload,
  PhotoView,
} from '../../../shared/schemas/journal'
import { processPhoto, takenInstant } from './photo-process'
import type { PhotoStore } from './photo-store'
import { HttpError } from '../../http/errors'
import type { CatchListRow, CatchValues, JournalRepo } from './journal.repo'
import type { LakeRow } from '../lakes/lake-read.repo'

/** A catch logged this far ahead of the server's clock is a wrong clock or a typo. */
const FUTURE_SLACK_MS = 10 * 60_000
const EARLIEST = Date.parse('1990-01-01T00:00:00Z')

const invalid = (field: string, message: string) =>
  new HttpError(400, 'invalid_input', 'Some fields need attention.', { [field]: message })
const noCatch = () => new HttpError(404, 'not_found', 'No such catch in your journal.')

/** Where a photo's copies are served from, for its angler or for a trip's clients. */
export type PhotoUrl = (photoId: string, size: 'display' | 'thumb') => string
export const ownPhotoUrl: PhotoUrl = (id, size) => `/api/journal/photos/${id}/${size}`

export function toCatchView(row: CatchListRow, photoUrl: PhotoUrl = ownPhotoUrl): CatchView {
  const c = row.catch
  const photo: PhotoView | null = row.photo && {
    id: row.photo.id,
    displayUrl: photoUrl(row.photo.id, 'display'),
    thumbUrl: photoUrl(row.photo.id, 'thumb'),
    width: row.photo.width,
    height: row.photo.height,
  }
  return {
    id: c.id,
    lake: { slug: row.lakeSlug, name: row.lakeName, timeZone: row.timeZone },
    caughtAt: c.caughtAt.toISOString(),
    species: c.species,
    lengthM: c.lengthM,
    weightKg: c.weightKg,
    released: c.released,
    lure: c.lure,
    bank: c.bankId && row.bankName ? { id: c.bankId, name: row.bankName } : null,
    position: c.position,
    note: c.note,
    tripId: c.tripId,
    photo,
    conditions: c.conditions,
    createdAt: c.createdAt.toISOString(),
  }
}

export interface JournalDeps {
  repo: JournalRepo
  /** The conditions at a time and place, from stored readings and weather; null when none are stored. */
  conditionsAt?: (
    lake: LakeRow,
    at: Date,
    bank: { exposure: NonNullable<Awaited<ReturnType<JournalRepo['ownBank']>>>['exposure'] } | null,
  ) => Promise<CatchConditions | null>
  /** Object storage for photos; without it, photo uploads answer 503. */
  photos?: PhotoStore
  /** The trip a client's share link opens (404 or 410 once it no longer holds). */
  sharedTrip?: (token: string) => Promise<{ id: string }>
  now?: () => Date
}

export function journalService(deps: JournalDeps) {
  const { repo } = deps
  const now = () => deps.now?.() ?? new Date()

  /** Checks what a catch names (lake, bank, trip, photo) and works out its conditions. */
  async function values(
    user: User,
    input: CatchInput,
    exceptCatchId?: string,
  ): Promise<CatchValues> {
    const lake = await repo.lakeBySlug(input.lakeSlug)
    if (!lake) throw invalid('lakeSlug', 'No such lake.')
    const caughtAt = new Date(input.caughtAt)
    if (caughtAt.getTime() > now().getTime() + FUTURE_SLACK_MS)
      throw invalid('caughtAt', 'That time has not come yet: check the date and time.')
    if (caughtAt.getTime() < EARLIEST) throw invalid('caughtAt', 'Give a date after 1990.')
    const bank = input.bankId ? await repo.ownBank(user.id, lake.id, input.bankId) : null
    if (input.bankId && !bank) throw invalid('bankId', 'Choose one of your banks on this lake.')
    if (input.tripId) {
      const trip = roleAllows(user.role, 'guide') && (await repo.ownTrip(user.id, input.tripId))
      if (!trip) throw invalid('tripId', 'Not one of your trips.')
      if (trip.lakeId !== lake.id) throw invalid('tripId', 'That trip is on another lake.')
    }
    if (input.photoId) {
      const photo = await repo.ownPhoto(user.id, input.photoId)
      if (!photo || (photo.catchId && photo.catchId !== exceptCatchId))
        throw invalid('photoId', 'Upload the photo again.')
    }
    const conditions = (await deps.conditionsAt?.(lake, caughtAt, bank ?? null)) ?? null
    return {
      lakeId: lake.id,
      tripId: input.tripId,
      bankId: input.bankId,
      caughtAt,
      species: input.species,
      lengthM: input.lengthM,
      weightKg: input.weightKg,
      released: input.released,
      lure: input.lure,
      position: input.position,
      note: input.note,
      conditions,
    }
  }

  function store(): PhotoStore {
    if (!deps.photos)
      throw new HttpError(503, 'photos_unavailable', 'Photos cannot be stored here just now.')
    return deps.photos
  }
  const noPhoto = () => new HttpError(404, 'not_found', 'No such photo.')
  const keyOf = (photo: { displayKey: string; thumbKey: string }, size: 'display' | 'thumb') =>
    size === 'display' ? photo.displayKey : photo.thumbKey

  async function view(userId: string, id: string) {
    const row = await repo.get(userId, id)
    if (!row) throw noCatch()
    return toCatchView(row)
  }

  return {
    async list(userId: string, query: CatchListQuery): Promise<CatchList> {
      const lake = query.lake ? await repo.lakeBySlug(query.lake) : undefined
      if (query.lake && !lake) throw new HttpError(404, 'not_found', 'No such lake.')
      const { rows, total } = await repo.list(userId, lake?.id, query.page, query.pageSize)
      return {
        items: rows.map((r) => toCatchView(r)),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }
    },

    get: view,

    /** What worked for this angler, by condition, on a lake and in a season if asked. */
    async insights(userId: string, query: InsightsQuery): Promise<Insights> {
      const lake = query.lake ? await repo.lakeBySlug(query.lake) : undefined
      if (query.lake && !lake) throw invalid('lake', 'No such lake.')
      const rows = (await repo.forInsights(userId, lake?.id)).filter(
        (r) =>
          !query.season ||
          (r.conditions && seasonOf(r.conditions.localDate, r.latitude) === query.season),
      )
      return { total: rows.length, minSample: MIN_SAMPLE, dimensions: insights(rows) }
    },

    async create(user: User, input: CatchInput): Promise<CatchView> {
      const row = await repo.insert(user.id, await values(user, input), input.photoId)
      if (!row) throw invalid('photoId', 'Upload the photo again.')
      return view(user.id, row.id)
    },

    async update(user: User, id: string, input: CatchInput): Promise<CatchView> {
      if (!(await repo.get(user.id, id))) throw noCatch()
      // A photo is added or kept on create only; an edit leaves it as it is.
      const row = await repo.update(
        user.id,
        id,
        await values(user, { ...input, photoId: null }, id),
      )
      if (!row) throw noCatch()
      return view(user.id, id)
    },

    /** A guide's catches on one of their trips; another guide's trip is a 404. */
    async tripCatches(guideId: string, tripId: string): Promise<{ items: CatchView[] }> {
      if (!(await repo.ownTrip(guideId, tripId)))
        throw new HttpError(404, 'not_found', 'No such trip.')
      return { items: (await repo.ofTrip(tripId)).map((r) => toCatchView(r)) }
    },

    /**
     * A trip's catches as its clients see them through the share link: photos through the same
     * link, and no positions (where a guide's fish came from stays the guide's).
     */
    async sharedCatches(token: string): Promise<{ items: CatchView[] }> {
      if (!deps.sharedTrip) throw new HttpError(404, 'not_found', 'This link is not one of ours.')
      const trip = await deps.sharedTrip(token)
      const url: PhotoUrl = (id, size) => `/api/shared/trips/${token}/photos/${id}/${size}`
      return {
        items: (await repo.ofTrip(trip.id)).map((r) => ({
          ...toCatchView(r, url),
          position: null,
        })),
      }
    },

    /** Deletes the catch, then its photo's stored copies. */
    async remove(userId: string, id: string) {
      const photos = await repo.remove(userId, id)
      if (!photos) throw noCatch()
      if (photos.length) await store().remove(photos.flatMap((p) => [p.displayKey, p.thumbKey]))
    },

    /**
     * Stores a photo's copies (display and thumbnail, no location in either) before its catch is
     * saved, and answers what its EXIF said: the time (read in the lake's zone, or the nearest
     * bank's) and the nearest of the angler's banks to where it was taken. A file that is not an
     * image is refused before anything is stored.
     */
    async uploadPhoto(userId: string, data: Buffer, lakeSlug?: string): Promise<PhotoUpload> {
      const photos = store()
      const lake = lakeSlug ? await repo.lakeBySlug(lakeSlug) : undefined
      if (lakeSlug && !lake) throw invalid('lake', 'No such lake.')
      const processed = await processPhoto(data)
      const near = processed.position
        ? nearestBank(processed.position, await repo.banks(userId, lake?.id))
        : null
      const takenAt = takenInstant(processed.taken, lake?.timeZone ?? near?.timeZone ?? null)
      const id = randomUUID()
      const displayKey = `catches/${userId}/${id}/display.jpg`
      const thumbKey = `catches/${userId}/${id}/thumb.jpg`
      await photos.put(displayKey, processed.display.data, 'image/jpeg')
      await photos.put(thumbKey, processed.thumb.data, 'image/jpeg')
      try {
        await repo.insertPhoto({
          id,
          userId,
          displayKey,
          thumbKey,
          width: processed.display.width,
          height: processed.display.height,
          bytes: processed.display.data.length + processed.thumb.data.length,
          takenAt,
        })
      } catch (err) {
        await photos.remove([displayKey, thumbKey])
        throw err
      }
      return {
        id,
        displayUrl: ownPhotoUrl(id, 'display'),
        thumbUrl: ownPhotoUrl(id, 'thumb'),
        width: processed.display.width,
        height: processed.display.height,
        takenAt: takenAt?.toISOString() ?? null,
        position: processed.position,
        nearestBank: near && { id: near.id, name: near.name, lakeSlug: near.lakeSlug },
      }
    },

    async photo(userId: string, id: string, size: 'display' | 'thumb'): Promise<Buffer> {
      const photo = await repo.ownPhoto(userId, id)
      if (!photo) throw noPhoto()
      return store().get(keyOf(photo, size))
    },

    async sharedPhoto(token: string, id: string, size: 'display' | 'thumb'): Promise<Buffer> {
      if (!deps.sharedTrip) throw noPhoto()
      const trip = await deps.sharedTrip(token)
      const photo = await repo.photoOfTrip(trip.id, id)
      if (!photo) throw noPhoto()
      return store().get(keyOf(photo, size))
    },
  }
}
export type JournalService = ReturnType<typeof journalService>
