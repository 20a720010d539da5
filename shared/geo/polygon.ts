import { DomainError } from '../errors'
import { localProjection, type LocalProjection, type Xy } from './projection'
import type { LakeGeometry, Position, Ring } from './types'

/** The polygons of a lake, each as [shoreline, ...islands]. */
export function polygonsOf(lake: LakeGeometry): Ring[][] {
  return lake.type === 'Polygon' ? [lake.coordinates] : lake.coordinates
}

/** Checks what a lake geometry must be before any computation: closed rings of finite WGS84 positions. */
export function assertLakeGeometry(lake: LakeGeometry): void {
  if (!lake || (lake.type !== 'Polygon' && lake.type !== 'MultiPolygon')) {
    throw new DomainError(
      'invalid_geometry',
      'A lake must be a GeoJSON Polygon or MultiPolygon.',
      'lake',
    )
  }
  const polygons = polygonsOf(lake)
  if (!polygons.length)
    throw new DomainError('invalid_geometry', 'The lake has no polygons.', 'lake')
  polygons.forEach((rings, i) => {
    if (!rings.length)
      throw new DomainError('invalid_geometry', `Polygon ${i} has no rings.`, 'lake')
    rings.forEach((ring, j) => {
      const where = `polygon ${i}, ring ${j}`
      if (!Array.isArray(ring) || ring.length < 4) {
        throw new DomainError(
          'invalid_geometry',
          `The ring at ${where} needs at least 4 positions.`,
          'lake',
        )
      }
      for (const p of ring) {
        const [lon, lat] = p
        if (
          !Number.isFinite(lon) ||
          !Number.isFinite(lat) ||
          Math.abs(lon) > 180 ||
          Math.abs(lat) > 90
        ) {
          throw new DomainError(
            'invalid_geometry',
            `The ring at ${where} has a position outside WGS84.`,
            'lake',
          )
        }
      }
      const first = ring[0]!
      const last = ring[ring.length - 1]!
      if (first[0] !== last[0] || first[1] !== last[1]) {
        throw new DomainError(
          'invalid_geometry',
          `The ring at ${where} is open: its last position must repeat its first.`,
          'lake',
        )
      }
    })
  })
}

/** Mean of the shoreline vertices: the origin of the lake's local projection. */
export function lakeCenter(lake: LakeGeometry): Position {
  let lon = 0
  let lat = 0
  let n = 0
  for (const rings of polygonsOf(lake)) {
    for (const [x, y] of rings[0]!.slice(1)) {
      lon += x
      lat += y
      n++
    }
  }
  return [lon / n, lat / n]
}

export function lakeProjection(lake: LakeGeometry): LocalProjection {
  return localProjection(lakeCenter(lake))
}

/** Signed area by the shoelace formula; positive when counter-clockwise. */
export function ringAreaXy(ring: Xy[]): number {
  let sum = 0
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    sum += (ring[j]![0] - ring[i]![0]) * (ring[j]![1] + ring[i]![1])
  }
  return sum / 2
}

/** Water area in square metres: shorelines minus islands. */
export function lakeAreaM2(lake: LakeGeometry): number {
  assertLakeGeometry(lake)
  const { project } = lakeProjection(lake)
  let area = 0
  for (const rings of polygonsOf(lake)) {
    rings.forEach((ring, i) => {
      const a = Math.abs(ringAreaXy(ring.map(project)))
      area += i === 0 ? a : -a
    })
  }
  return area
}

/** Even-odd rule over every ring, so a point on an island is not in the water. */
export function inWaterXy(rings: Xy[][], [x, y]: Xy): boolean {
  let inside = false
  for (const ring of rings) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const [xi, yi] = ring[i]!
      const [xj, yj] = ring[j]!
      if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside
    }
  }
  return inside
}

/**
 * The lake with its rings wound one way in lon/lat: shorelines counter-clockwise and islands
 * clockwise (RFC 7946), or the reverse, which is what spherical renderers such as d3-geo expect.
 */
export function rewound(lake: LakeGeometry, shorelineClockwise = false): LakeGeometry {
  const wind = (rings: Ring[]) =>
    rings.map((ring, i) => {
      const ccw = ringAreaXy(ring as Xy[]) > 0
      const wantCcw = (i === 0) !== shorelineClockwise
      return ccw === wantCcw ? ring : [...ring].reverse()
    })
  return lake.type === 'Polygon'
    ? { type: 'Polygon', coordinates: wind(lake.coordinates) }
    : { type: 'MultiPolygon', coordinates: lake.coordinates.map(wind) }
}
