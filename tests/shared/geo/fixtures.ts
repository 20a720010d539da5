import geodesic from 'geographiclib-geodesic'
import type { Polygon, Position, Ring } from '../../../shared/geo/types'

/** Karney's GeographicLib on WGS84: the reference for every distance these tests expect. */
export const geod = geodesic.Geodesic.WGS84

export function destination([lon, lat]: Position, azimuthDeg: number, metres: number): Position {
  const r = geod.Direct(lat, lon, azimuthDeg, metres)
  return [r.lon2!, r.lat2!]
}

export function distanceM(a: Position, b: Position): number {
  return geod.Inverse(a[1], a[0], b[1], b[0]).s12!
}

/** A ring through `corners`, with vertices every `stepDeg` of lon/lat so long edges follow parallels. */
export function densified(corners: Position[], steps = 40): Ring {
  const ring: Ring = []
  corners.forEach((a, i) => {
    const b = corners[(i + 1) % corners.length]!
    for (let k = 0; k < steps; k++)
      ring.push([a[0] + ((b[0] - a[0]) * k) / steps, a[1] + ((b[1] - a[1]) * k) / steps])
  })
  ring.push(ring[0]!)
  return ring
}

/** A lon/lat box from its south-west corner and its size in degrees, counter-clockwise. */
export function box(west: number, south: number, dLon: number, dLat: number): Position[] {
  return [
    [west, south],
    [west + dLon, south],
    [west + dLon, south + dLat],
    [west, south + dLat],
  ]
}

/** A circle of geodesic radius `r` around `center`, as a 720-gon (chord error under 1e-5). */
export function circleLake(center: Position, r: number): Polygon {
  const ring = Array.from({ length: 720 }, (_, i) => destination(center, 360 - i / 2, r))
  return { type: 'Polygon', coordinates: [[...ring, ring[0]!]] }
}

/**
 * How far a geodesic leaving `from` at `azimuth` runs before `crossed` turns true: the exact fetch
 * to a straight shore, found by bisection on GeographicLib's direct problem.
 */
export function distanceUntil(
  from: Position,
  azimuth: number,
  crossed: (p: Position) => boolean,
): number {
  let lo = 0
  let hi = 200_000
  for (let i = 0; i < 80; i++) {
    const mid = (lo + hi) / 2
    if (crossed(destination(from, azimuth, mid))) hi = mid
    else lo = mid
  }
  return (lo + hi) / 2
}

export const distanceToMeridian = (from: Position, azimuth: number, lon: number) =>
  distanceUntil(from, azimuth, ([x]) => (x - lon) * (from[0] - lon) <= 0)

export const distanceToParallel = (from: Position, azimuth: number, lat: number) =>
  distanceUntil(from, azimuth, ([, y]) => (y - lat) * (from[1] - lat) <= 0)

/**
 * The worst outline we know for a box index: a comb of `vertices / 4` thin strips laid diagonally,
 * so that every long edge's bounding box overlaps every other's. A valid lake of about 20 km.
 */
export function diagonalStrips(vertices: number, [lon0, lat0]: Position = [-88.1, 35]): Polygon {
  const teeth = Math.floor(vertices / 4)
  const w = 0.5 / teeth
  const uv: [number, number][] = []
  for (let k = 0; k < teeth; k++)
    uv.push([k * w, 0.02], [k * w, 1], [k * w + w / 2, 1], [k * w + w / 2, 0.02])
  // The last tooth's foot comes down to the base line, which runs back to the first.
  uv[uv.length - 1] = [uv[uv.length - 1]![0], 0]
  uv[0] = [0, 0]
  const size = 0.15
  const ring: Position[] = uv.map(([u, v]) => [
    lon0 + ((u - v) * size) / Math.SQRT2,
    lat0 + ((u + v) * size) / Math.SQRT2,
  ])
  return { type: 'Polygon', coordinates: [[...ring, ring[0]!]] }
}
