import exifr from 'exifr'
import sharp from 'sharp'
import type { Position } from '../../../shared/geo/types'
import { zoneOffsetMs } from '../../../shared/time'
import { badFile, HttpError } from '../../http/errors'

/** The long side of the copy an entry shows, and of its thumbnail, in pixels. */
export const DISPLAY_PX = 1600
export const THUMB_PX = 320
/** A photo with more pixels than this (a 50-megapixel camera's) is refused before decoding. */
const MAX_INPUT_PIXELS = 60_000_000

export interface ProcessedPhoto {
  display: { data: Buffer; width: number; height: number }
  thumb: { data: Buffer; width: number; height: number }
  /** The camera's wall-clock time as written, "YYYY-MM-DDTHH:MM:SS", and its offset when it gave one. */
  taken: { local: string; offset: string | null } | null
  position: Position | null
}

const notImage = () =>
  badFile(
    'not_an_image',
    'That file is not a photo we can read (JPEG, PNG or WebP).',
    'Choose a JPEG, PNG or WebP photo.',
    415,
  )

/** EXIF's "YYYY:MM:DD HH:MM:SS" as an ISO local time, or null when it is not one. */
function exifLocal(value: unknown): string | null {
  const m =
    typeof value === 'string' && /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})/.exec(value)
  return m ? `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6]}` : null
}

/** The instant a camera's wall-clock time names: its own offset, else the lake's time zone. */
export function takenInstant(taken: ProcessedPhoto['taken'], timeZone: string | null): Date | null {
  if (!taken) return null
  if (taken.offset && /^[+-]\d{2}:\d{2}$/.test(taken.offset))
    return new Date(`${taken.local}${taken.offset}`)
  if (!timeZone) return null
  const guess = new Date(`${taken.local}Z`)
  // The zone's offset at the guess, then again at the corrected instant (a DST change in between).
  const first = new Date(guess.getTime() - zoneOffsetMs(guess, timeZone))
  return new Date(guess.getTime() - zoneOffsetMs(first, timeZone))
}

/**
 * Reads a photo's time and GPS position, then makes the stored copies: turned upright, resized,
 * re-encoded as JPEG with no metadata at all (sharp keeps none unless asked), so no copy carries
 * where it was taken. Anything sharp cannot decode is a 415.
 */
export async function processPhoto(data: Buffer): Promise<ProcessedPhoto> {
  const meta = await sharp(data, { limitInputPixels: MAX_INPUT_PIXELS })
    .metadata()
    .catch(() => {
      throw notImage()
    })
  if (!meta.format || !['jpeg', 'png', 'webp'].includes(meta.format)) throw notImage()

  const [tags, gps] = await Promise.all([
    exifr
      .parse(data, {
        pick: ['DateTimeOriginal', 'OffsetTimeOriginal', 'CreateDate'],
        reviveValues: false,
      })
      .catch(() => undefined) as Promise<Record<string, unknown> | undefined>,
    exifr.gps(data).catch(() => undefined),
  ])
  const local = exifLocal(tags?.DateTimeOriginal) ?? exifLocal(tags?.CreateDate)
  const offset = typeof tags?.OffsetTimeOriginal === 'string' ? tags.OffsetTimeOriginal : null
  const position: Position | null =
    gps && Number.isFinite(gps.latitude) && Number.isFinite(gps.longitude)
      ? [gps.longitude, gps.latitude]
      : null

  // One decode: turned upright and brought down to the display size once, both copies encoded
  // from those pixels (decoding a phone's 12-megapixel JPEG is most of the work).
  const copies = async () => {
    const upright = await sharp(data, { limitInputPixels: MAX_INPUT_PIXELS })
      .rotate()
      .resize({ width: DISPLAY_PX, height: DISPLAY_PX, fit: 'inside', withoutEnlargement: true })
      .raw()
      .toBuffer({ resolveWithObject: true })
    const { width, height, channels } = upright.info
    const pixels = () => sharp(upright.data, { raw: { width, height, channels } })
    const encode = async (image: ReturnType<typeof sharp>, quality: number) => {
      const { data: out, info } = await image
        .jpeg({ quality, mozjpeg: true })
        .toBuffer({ resolveWithObject: true })
      return { data: out, width: info.width, height: info.height }
    }
    return Promise.all([
      encode(pixels(), 82),
      encode(
        pixels().resize({
          width: THUMB_PX,
          height: THUMB_PX,
          fit: 'inside',
          withoutEnlargement: true,
        }),
        75,
      ),
    ])
  }
  const [display, thumb] = await copies().catch((err: unknown) => {
    if (err instanceof HttpError) throw err
    throw notImage()
  })
  return { display, thumb, taken: local ? { local, offset } : null, position }
}
