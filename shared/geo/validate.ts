import Flatbush from 'flatbush'
import { DomainError } from '../errors'
import { assertLakeGeometry, inWaterXy, lakeAreaM2, lakeProjection, polygonsOf } from './polygon'
import type { Xy } from './projection'
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

const orient = (p: Xy, q: Xy, r: Xy) =>
  Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]))
const within = (p: Xy, q: Xy, r: Xy) =>
  Math.min(p[0], r[0]) <= q[0] &&
  q[0] <= Math.max(p[0], r[0]) &&
  Math.min(p[1], r[1]) <= q[1] &&
  q[1] <= Math.max(p[1], r[1])
/** Whether two segments meet at all: crossing, touching, or overlapping along a line. */
function meet(a: Xy, b: Xy, c: Xy, d: Xy): boolean {
  const o1 = orient(a, b, c)
  const o2 = orient(a, b, d)
  const o3 = orient(c, d, a)
  const o4 = orient(c, d, b)
  if (o1 !== o2 && o3 !== o4) return true
  return (
    (o1 === 0 && within(a, c, b)) ||
    (o2 === 0 && within(a, d, b)) ||
    (o3 === 0 && within(c, a, d)) ||
    (o4 === 0 && within(c, b, d))
  )
}

const invalid = (message: string) => new DomainError('invalid_geometry', message, 'shoreline')

/**
 * An uploaded lake outline checked for use: well-formed (closed rings in WGS84), a plausible size
 * and place, no ring crossing itself or another, every island inside its shoreline. Segments are
 * found in an R-tree, so a 50,000-vertex outline is checked in well under a second.
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
  // Every segment of every ring, to find any two that cross.
  const segments: { a: Xy; b: Xy; ring: number; i: number; n: number }[] = []
  rings.flat().forEach((ring, r) => {
    for (let i = 0; i < ring.length - 1; i++)
      segments.push({ a: ring[i]!, b: ring[i + 1]!, ring: r, i, n: ring.length - 1 })
  })
  const tree = new Flatbush(segments.length)
  for (const { a, b } of segments)
    tree.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]))
  tree.finish()
  segments.forEach((s, k) => {
    const hits = tree.search(
      Math.min(s.a[0], s.b[0]),
      Math.min(s.a[1], s.b[1]),
      Math.max(s.a[0], s.b[0]),
      Math.max(s.a[1], s.b[1]),
    )
    for (const h of hits) {
      if (h <= k) continue
      const t = segments[h]!
      const neighbours =
        t.ring === s.ring && (Math.abs(t.i - s.i) === 1 || Math.abs(t.i - s.i) === s.n - 1)
      if (!neighbours && meet(s.a, s.b, t.a, t.b))
        throw invalid(
          t.ring === s.ring
            ? `A ring crosses or touches itself (between its segments ${s.i + 1} and ${t.i + 1}).`
            : 'Two rings cross or touch: an island must lie wholly inside its shoreline.',
        )
    }
  })
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
