import type { CatchConditions } from '../schemas/journal'

/** Fewer catches than this in a group say nothing yet (our threshold). */
export const MIN_SAMPLE = 5

export const SEASONS = ['spring', 'summer', 'fall', 'winter'] as const
export type Season = (typeof SEASONS)[number]

/** Meteorological seasons by local month, turned around south of the equator. */
export function seasonOf(localDate: string, latitude: number): Season {
  const month = Number(localDate.slice(5, 7))
  const north: Season[] = ['winter', 'spring', 'summer', 'fall']
  const i = Math.floor((month % 12) / 3)
  return latitude >= 0 ? north[i]! : north[(i + 2) % 4]!
}

/** Water temperature bands, °C (the client names them in the angler's units). */
export const WATER_BANDS_C = [10, 15, 20, 25] as const

export function waterBand(waterC: number): string {
  const i = WATER_BANDS_C.findIndex((b) => waterC < b)
  return i === -1
    ? `${WATER_BANDS_C.at(-1)}+`
    : i === 0
      ? `<${WATER_BANDS_C[0]}`
      : `${WATER_BANDS_C[i - 1]}-${WATER_BANDS_C[i]}`
}

export const DIMENSIONS = ['clarity', 'water', 'phase', 'bankExposure', 'sky', 'timeOfDay'] as const
export type Dimension = (typeof DIMENSIONS)[number]

export interface InsightCatch {
  conditions: CatchConditions | null
  lureFamily: string
}

export interface InsightGroup {
  key: string
  count: number
  /** Of all catches with this dimension known, the share in this group, 0-1. */
  share: number
  /** The lure that took most fish in this group, and how many. */
  topLure: { family: string; count: number } | null
  /** At least MIN_SAMPLE catches: enough to say something. */
  enough: boolean
}

export interface InsightDimension {
  dimension: Dimension
  /** Catches where the conditions knew this dimension. */
  known: number
  groups: InsightGroup[]
}

const keyOf: Record<Dimension, (c: CatchConditions) => string | null> = {
  clarity: (c) => c.clarity?.class ?? null,
  water: (c) => (c.waterC === null ? null : waterBand(c.waterC)),
  phase: (c) => c.phase,
  bankExposure: (c) => c.bankExposure,
  sky: (c) => c.sky,
  timeOfDay: (c) => c.timeOfDay,
}

/** Counts, shares and the best lure per group of each dimension, most catches first. */
export function insights(catches: InsightCatch[]): InsightDimension[] {
  return DIMENSIONS.map((dimension) => {
    const groups = new Map<string, Map<string, number>>()
    let known = 0
    for (const c of catches) {
      const key = c.conditions && keyOf[dimension](c.conditions)
      if (!key) continue
      known++
      const lures = groups.get(key) ?? new Map<string, number>()
      const lure = c.lureFamily.toLowerCase()
      lures.set(lure, (lures.get(lure) ?? 0) + 1)
      groups.set(key, lures)
    }
    return {
      dimension,
      known,
      groups: [...groups.entries()]
        .map(([key, lures]): InsightGroup => {
          const count = [...lures.values()].reduce((a, b) => a + b, 0)
          const top = [...lures.entries()].sort(
            (a, b) => b[1] - a[1] || a[0].localeCompare(b[0]),
          )[0]
          return {
            key,
            count,
            share: count / known,
            topLure: top ? { family: top[0], count: top[1] } : null,
            enough: count >= MIN_SAMPLE,
          }
        })
        .sort((a, b) => b.count - a.count || a.key.localeCompare(b.key)),
    }
  })
}

/** "3 catches — too few to say", or null when there are enough. */
export function sampleNote(count: number): string | null {
  if (count >= MIN_SAMPLE) return null
  return `${count} ${count === 1 ? 'catch' : 'catches'} — too few to say`
}
