import { randomUUID } from 'node:crypto'
import Papa from 'papaparse'
import {
  CATCH_CSV_COLUMNS,
  CATCH_CSV_CONDITIONS,
  CATCH_CSV_REQUIRED,
  catchCsvRow,
  csvBoolean,
  csvNumber,
  unescapeCell,
} from '../../../shared/journal/csv'
import { nearestBank } from '../../../shared/geo/nearest'
import { insights, MIN_SAMPLE, seasonOf } from '../../../shared/journal/insights'
import { roleAllows } from '../../../shared/roles'
import type { User } from '../../../shared/schemas/auth'
import {
  CatchInput,
  type CatchConditions,
  type CatchList,
  type CatchListQuery,
  type CatchView,
  type Insights,
  type InsightsQuery,
  type PhotoUpload,
  type PhotoView,
} from '../../../shared/schemas/journal'
import { processPhoto, takenInstant } from './photo-process'
import type { PhotoStore } from './photo-store'
import {
  badCsv,
  fieldMessages,
  HttpError,
  invalid,
  missingColumns,
  notFound,
  unavailable,
} from '../../http/errors'
import type { CatchListRow, CatchValues, JournalRepo } from './journal.repo'
import type { LakeRow } from '../lakes/lake-read.repo'
import type { CsvImportReport } from '../../../shared/schemas/csv-import'
import { importReport } from '../../lib/csv-import'

/** A catch logged this far ahead of the server's clock is a wrong clock or a typo. */
const FUTURE_SLACK_MS = 10 * 60_000
const EARLIEST = Date.parse('1990-01-01T00:00:00Z')

/** At most this many rows in one import. */
export const MAX_CATCH_IMPORT_ROWS = 2000

/** A CatchInput field's CSV column, for an import's per-row messages. */
const COLUMN_OF: Record<string, string> = {
  lakeSlug: 'lake',
  caughtAt: 'caught_at',
  species: 'species',
  lengthM: 'length_cm',
  weightKg: 'weight_kg',
  released: 'released',
  'lure.family': 'lure',
  'lure.blade': 'blade',
  'lure.color': 'color',
  'lure.size': 'size',
  'lure.trailer': 'trailer',
  'lure.trailerHook': 'trailer_hook',
  'lure.retrieve': 'retrieve',
  bankId: 'bank',
  note: 'note',
}
const byColumn = (fields: Record<string, string>) =>
  Object.fromEntries(Object.entries(fields).map(([k, v]) => [COLUMN_OF[k] ?? '_', v]))

/** The same fish twice: a re-imported export is found, not doubled. */
const sameFish = (caughtAt: Date, lakeSlug: string, species: string, family: string) =>
  `${caughtAt.getTime()} ${lakeSlug} ${species} ${family.trim().toLowerCase()}`

const noCatch = () => notFound('catch', 'No such catch in your journal.')

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
    clientId: c.clientId,
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

  /** Checks what a catch names (lake, bank, trip, photo); throws a 400 naming the field. */
  async function check(user: User, input: CatchInput, exceptCatchId?: string) {
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
    return { lake, caughtAt, bank }
  }

  /** A checked catch with its conditions worked out. */
  async function values(
    user: User,
    input: CatchInput,
    exceptCatchId?: string,
  ): Promise<CatchValues> {
    const { lake, caughtAt, bank } = await check(user, input, exceptCatchId)
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
      throw unavailable('photos_unavailable', 'Photos cannot be stored here just now.')
    return deps.photos
  }
  const noPhoto = () => notFound('photo')
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
      if (query.lake && !lake) throw notFound('lake')
      const { rows, total } = await repo.list(userId, lake?.id, query.page, query.pageSize)
      return {
        items: rows.map((r) => toCatchView(r)),
        total,
        page: query.page,
        pageSize: query.pageSize,
      }
    },

    get: view,

    /** The angler's whole journal as CSV, oldest first, every cell safe to open in a spreadsheet. */
    async exportCsv(userId: string): Promise<string> {
      const rows = (await repo.all(userId)).map((r) => catchCsvRow(toCatchView(r)))
      return Papa.unparse(
        { fields: [...CATCH_CSV_COLUMNS, ...CATCH_CSV_CONDITIONS], data: rows },
        { newline: '\r\n' },
      )
    },

    /**
     * A CSV of catches (the export's columns; conditions are worked out again, never read), checked
     * row by row against the same rules as the form, the angler's banks by name, and the journal
     * (the same fish twice is refused). A preview changes nothing; an import adds every row or, if
     * any row is bad, none.
     */
    async importCsv(user: User, csv: string, commit: boolean): Promise<CsvImportReport> {
      const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
        header: true,
        skipEmptyLines: 'greedy',
        transformHeader: (h) => h.trim().toLowerCase(),
      })
      const columns = parsed.meta.fields ?? []
      const missing = CATCH_CSV_REQUIRED.filter((c) => !columns.includes(c))
      if (missing.length) throw missingColumns(missing, CATCH_CSV_COLUMNS)
      if (parsed.data.length > MAX_CATCH_IMPORT_ROWS)
        throw badCsv(
          `Import at most ${MAX_CATCH_IMPORT_ROWS} catches at a time.`,
          `Split the file: at most ${MAX_CATCH_IMPORT_ROWS} rows.`,
        )
      const banks = await repo.banks(user.id)
      const known = new Set(
        (await repo.all(user.id)).map((r) =>
          sameFish(r.catch.caughtAt, r.lakeSlug, r.catch.species, r.catch.lure.family),
        ),
      )
      const lakes = new Map<string, boolean>()
      const lakeKnown = async (slug: string) => {
        if (!lakes.has(slug)) lakes.set(slug, !!(await repo.lakeBySlug(slug)))
        return lakes.get(slug)
      }
      const seen = new Map<string, number>()
      const good: CatchInput[] = []
      const rows = []
      for (const [i, raw] of parsed.data.entries()) {
        const line = i + 2 // line 1 is the header
        const values = Object.fromEntries(
          CATCH_CSV_COLUMNS.map((c) => [c, unescapeCell((raw[c] ?? '').toString().trim())]),
        ) as Record<(typeof CATCH_CSV_COLUMNS)[number], string>
        const errors: Record<string, string> = {}
        const length = csvNumber(values.length_cm)
        const weight = csvNumber(values.weight_kg)
        const released = csvBoolean(values.released)
        const trailerHook = csvBoolean(values.trailer_hook)
        const bank = values.bank
          ? banks.find(
              (b) =>
                b.lakeSlug === values.lake && b.name.toLowerCase() === values.bank.toLowerCase(),
            )
          : null
        if (Number.isNaN(length)) errors.length_cm = 'Give the length in centimetres, as a number.'
        if (Number.isNaN(weight)) errors.weight_kg = 'Give the weight in kilograms, as a number.'
        if (released === undefined || released === null)
          errors.released = 'Say yes (released) or no (kept).'
        if (trailerHook === undefined) errors.trailer_hook = 'Say yes, no, or leave it empty.'
        if (bank === undefined) errors.bank = 'Not one of your banks on this lake.'
        const result = CatchInput.safeParse({
          lakeSlug: values.lake,
          caughtAt: values.caught_at,
          species: values.species.toLowerCase(),
          lengthM: length === null || Number.isNaN(length) ? null : length / 100,
          weightKg: Number.isNaN(weight) ? null : weight,
          released: released ?? false,
          lure: {
            family: values.lure,
            blade: values.blade ? values.blade.toLowerCase() : null,
            color: values.color,
            size: values.size,
            trailer: values.trailer,
            trailerHook: trailerHook ?? null,
            retrieve: values.retrieve,
          },
          bankId: bank?.id ?? null,
          note: values.note,
        })
        if (values.lake && !(await lakeKnown(values.lake))) errors.lake = 'No such lake.'
        if (!result.success) Object.assign(errors, byColumn(fieldMessages(result.error)), errors)
        else if (!Object.keys(errors).length) {
          // Checked like the form: the lake's catch times, the trip; a bad one names its column.
          try {
            await check(user, result.data)
            const key = sameFish(
              new Date(result.data.caughtAt),
              values.lake,
              result.data.species,
              result.data.lure.family,
            )
            if (known.has(key)) errors._ = 'Already in your journal.'
            else if (seen.has(key)) errors._ = `The same fish as line ${seen.get(key)}.`
            else good.push(result.data)
            seen.set(key, seen.get(key) ?? line)
          } catch (err) {
            if (!(err instanceof HttpError) || !err.fields) throw err
            Object.assign(errors, byColumn(err.fields))
          }
        }
        for (const e of parsed.errors.filter((e) => e.row === i)) errors._ = e.message
        rows.push({ line, values, errors })
      }
      const report = importReport(rows, commit)
      if (!commit) return report
      const all: CatchValues[] = []
      for (const input of good) all.push(await values(user, input))
      await repo.insertAll(user.id, all)
      return { ...report, imported: all.length }
    },

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

    /**
     * Logs a catch; `created` is false when the angler already logged one with this `clientId`
     * (a phone sending its kept catch again), which is answered as it is and nothing is added.
     */
    async create(user: User, input: CatchInput): Promise<{ created: boolean; view: CatchView }> {
      const sent = input.clientId ? await repo.byClientId(user.id, input.clientId) : undefined
      if (sent) return { created: false, view: toCatchView(sent) }
      const checked = { ...(await values(user, input)), clientId: input.clientId }
      const row = await repo.insert(user.id, checked, input.photoId)
      if (!row) throw invalid('photoId', 'Upload the photo again.')
      return { created: row.created, view: await view(user.id, row.id) }
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
      if (!(await repo.ownTrip(guideId, tripId))) throw notFound('trip')
      return { items: (await repo.ofTrip(tripId)).map((r) => toCatchView(r)) }
    },

    /**
     * A trip's catches as its clients see them through the share link: photos through the same
     * link, and no positions (where a guide's fish came from stays the guide's).
     */
    async sharedCatches(token: string): Promise<{ items: CatchView[] }> {
      if (!deps.sharedTrip) throw notFound('trip', 'This link is not one of ours.')
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
