import { getMoonIllumination, getMoonTimes, getTimes } from 'suncalc'
import { assertFinite } from '../errors'
import { HOUR_MS, isoOrNull, localDayBounds } from '../time'

export type MoonPhaseName =
  | 'new moon'
  | 'waxing crescent'
  | 'first quarter'
  | 'waxing gibbous'
  | 'full moon'
  | 'waning gibbous'
  | 'last quarter'
  | 'waning crescent'

export interface SkyDay {
  sunrise: string | null
  sunset: string | null
  civilDawn: string | null
  civilDusk: string | null
  solarNoon: string | null
  moonrise: string | null
  moonset: string | null
  /** Illuminated fraction of the moon at local noon, 0-1. */
  moonIllumination: number
  moonPhase: MoonPhaseName
}

function within(d: Date | null | undefined, [start, end]: [Date, Date]): Date | null {
  return d && d >= start && d < end ? d : null
}

const PRINCIPAL: [number, MoonPhaseName][] = [
  [0, 'new moon'],
  [0.25, 'first quarter'],
  [0.5, 'full moon'],
  [0.75, 'last quarter'],
]

/** A principal phase names the local day whose span contains its instant; other days get the in-between name. */
function phaseName(start: Date, end: Date, noon: Date): MoonPhaseName {
  const p0 = getMoonIllumination(start).phase
  let p1 = getMoonIllumination(end).phase
  if (p1 < p0) p1 += 1
  for (const [target, name] of PRINCIPAL) {
    for (const t of [target, target + 1]) if (p0 <= t && t < p1) return name
  }
  const p = getMoonIllumination(noon).phase
  if (p < 0.25) return 'waxing crescent'
  if (p < 0.5) return 'waxing gibbous'
  if (p < 0.75) return 'waning gibbous'
  return 'waning crescent'
}

/** Sun and moon for a local calendar date, from suncalc 2 (degrees; times as UTC instants). */
export function skyDay(lat: number, lon: number, date: string, timeZone: string): SkyDay {
  assertFinite(lat, 'lat', { min: -90, max: 90 })
  assertFinite(lon, 'lon', { min: -180, max: 180 })
  const bounds = localDayBounds(date, timeZone)
  const [start, end] = bounds
  const noon = new Date((start.getTime() + end.getTime()) / 2)
  const sun = getTimes(noon, lat, lon)
  // getMoonTimes works on UTC days; a local day overlaps two of them.
  const moonDays = [start, new Date(start.getTime() + 24 * HOUR_MS)].map((d) =>
    getMoonTimes(d, lat, lon),
  )
  const first = (pick: (t: (typeof moonDays)[number]) => Date | undefined) =>
    moonDays
      .map((t) => within(pick(t), bounds))
      .filter((d): d is Date => d !== null)
      .sort((a, b) => a.getTime() - b.getTime())[0]
  return {
    sunrise: isoOrNull(within(sun.sunrise, bounds)),
    sunset: isoOrNull(within(sun.sunset, bounds)),
    civilDawn: isoOrNull(within(sun.dawn, bounds)),
    civilDusk: isoOrNull(within(sun.dusk, bounds)),
    solarNoon: isoOrNull(within(sun.solarNoon, bounds)),
    moonrise: isoOrNull(first((t) => t.rise)),
    moonset: isoOrNull(first((t) => t.set)),
    moonIllumination: getMoonIllumination(noon).fraction,
    moonPhase: phaseName(start, end, noon),
  }
}
