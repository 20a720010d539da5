import type { Position } from './types'

const EARTH_RADIUS_M = 6_371_008.8

/** Great-circle distance on a sphere of the Earth's mean radius (haversine; IUGG mean radius R1). */
export function haversineM([lon1, lat1]: Position, [lon2, lat2]: Position): number {
  const rad = Math.PI / 180
  const dLat = (lat2 - lat1) * rad
  const dLon = (lon2 - lon1) * rad
  const a =
    Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * rad) * Math.cos(lat2 * rad) * Math.sin(dLon / 2) ** 2
  return 2 * EARTH_RADIUS_M * Math.asin(Math.min(1, Math.sqrt(a)))
}

/** A catch this far from every point of a bank is not on it (our threshold: a long cast and a drift). */
export const NEAREST_BANK_MAX_M = 300

/** The bank with a point nearest `at`, within `maxM`; null when none is that close. */
export function nearestBank<B extends { points: Position[] }>(
  at: Position,
  banks: B[],
  maxM = NEAREST_BANK_MAX_M,
): (B & { distanceM: number }) | null {
  let best: (B & { distanceM: number }) | null = null
  for (const bank of banks) {
    const distanceM = Math.min(...bank.points.map((p) => haversineM(at, p)))
    if (distanceM <= maxM && (!best || distanceM < best.distanceM)) best = { ...bank, distanceM }
  }
  return best
}
