import sharp from 'sharp'
import type { Position } from '../../shared/geo/types'

/** Degrees as EXIF's rational degrees, minutes and seconds. */
const dms = (deg: number) => {
  const d = Math.floor(Math.abs(deg))
  const m = Math.floor((Math.abs(deg) - d) * 60)
  const s = Math.round(((Math.abs(deg) - d) * 60 - m) * 60 * 10000)
  return `${d}/1 ${m}/1 ${s}/10000`
}

/**
 * A camera's JPEG: its wall-clock time (EXIF DateTimeOriginal, "YYYY:MM:DD HH:MM:SS") and, when
 * given, the GPS position it was taken at.
 */
export async function cameraPhoto(opts: { at?: string; gps?: Position; width?: number } = {}) {
  const [lon, lat] = opts.gps ?? [0, 0]
  return sharp({
    create: { width: opts.width ?? 2400, height: 1600, channels: 3, background: '#3d6b52' },
  })
    .withExif({
      IFD0: { Make: 'TestCam' },
      ...(opts.at ? { IFD2: { DateTimeOriginal: opts.at } } : {}),
      ...(opts.gps
        ? {
            IFD3: {
              GPSLatitudeRef: lat >= 0 ? 'N' : 'S',
              GPSLatitude: dms(lat),
              GPSLongitudeRef: lon >= 0 ? 'E' : 'W',
              GPSLongitude: dms(lon),
            },
          }
        : {}),
    })
    .jpeg()
    .toBuffer()
}
