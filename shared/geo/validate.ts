import { DomainError } from '../errors'
import { assertLakeGeometry, inWaterXy, lakeAreaM2, lakeProjection, polygonsOf } from './polygon'
import { firstRingContact } from './ring-contact'
import type { LakeGeometry } from './types'

/** Our bounds for a lake outline: a pond of a hectare up to a great reservoir, 200 km across. */
export const SHORELINE_LIMITS = {
  minKm2: 0.01,
  maxKm2: 5000,
  maxRadiusKm: 100,
  maxVertices: 50_000,
}

export interface ShorelineStats {
  areaKm2: number
  vertices: number
  islands: number
}

const invalid = (message: string) => new DomainError('invalid_geometry', message, 'shoreline')

/**
 * An uploaded lake outline checked for use: well-formed (closed rings in WGS84), a plausible size
 * and place, no ring crossing itself or another, every island inside its shoreline. Crossings are
 * found by a sweep line (`firstRingContact`), whose cost does not grow with how much the segments'
 * boxes overlap: `npm run bench -- outline` times the worst shape for a box index at the cap.
 */
export function assertPlausibleShoreline(lake: LakeGeometry): ShorelineStats {
  assertLakeGeometry(lake)
  const polygons = polygonsOf(lake)
  const vertices = polygons.flat().reduce((n, ring) => n + ring.length - 1, 0)
  if (vertices > SHORELINE_LIMITS.maxVertices)
    throw invalid(
      `The outline has ${vertices} vertices; simplify it to ${SHORELINE_LIMITS.maxVertices} or fewer.`,
    )
  const { project } = lakeProjection(lake)
  const rings = polygons.map((p) => p.map((ring) => ring.map(project)))
  const farKm = Math.max(...rings.flat(2).map(([x, y]) => Math.hypot(x, y))) / 1000
  if (farKm > SHORELINE_LIMITS.maxRadiusKm)
    throw invalid(
      `The outline reaches ${Math.round(farKm)} km from its centre: not one lake. Check the coordinates are longitude, latitude.`,
    )
  const met = firstRingContact(rings.flat())
  if (met) {
    const { ring, segment, otherRing, otherSegment } = met
    throw invalid(
      ring === otherRing
        ? `A ring crosses or touches itself (between its segments ${segment + 1} and ${otherSegment + 1}).`
        : 'Two rings cross or touch: an island must lie wholly inside its shoreline.',
    )
  }
  const areaKm2 = lakeAreaM2(lake) / 1e6
  if (areaKm2 < SHORELINE_LIMITS.minKm2 || areaKm2 > SHORELINE_LIMITS.maxKm2)
    throw invalid(
      `The water covers ${areaKm2.toPrecision(3)} km²; a lake here is ${SHORELINE_LIMITS.minKm2} to ${SHORELINE_LIMITS.maxKm2} km².`,
    )

  rings.forEach(([shore, ...islands]) => {
    for (const island of islands)
      if (!inWaterXy([shore!], island[0]!)) throw invalid('An island lies outside its shoreline.')
  })
  return {
    areaKm2: Math.round(areaKm2 * 100) / 100,
    vertices,
    islands: rings.reduce((n, p) => n + p.length - 1, 0),
  }
}
