import Flatbush from 'flatbush'
import { assertFinite, DomainError } from '../errors'
import { assertLakeGeometry, lakeProjection, polygonsOf } from './polygon'
import type { LocalProjection, Xy } from './projection'
import type { LakeGeometry, Position } from './types'

/**
 * A lake ready for ray casting: every shoreline and island edge on the lake's tangent plane,
 * in a Flatbush R-tree so a radial only tests the edges near it.
 */
export interface ShoreIndex {
  projection: LocalProjection
  rings: Xy[][]
  /** x1, y1, x2, y2 per edge. */
  edges: Float64Array
  tree: Flatbush
  /** Diagonal of the lake's bounding box: no fetch is longer. */
  spanM: number
}

const cache = new WeakMap<LakeGeometry, ShoreIndex>()

export function shoreIndex(lake: LakeGeometry): ShoreIndex {
  const hit = cache.get(lake)
  if (hit) return hit
  assertLakeGeometry(lake)
  const projection = lakeProjection(lake)
  const rings = polygonsOf(lake).flatMap((polygon) =>
    polygon.map((ring) => ring.map(projection.project)),
  )
  const count = rings.reduce((n, r) => n + r.length - 1, 0)
  const edges = new Float64Array(count * 4)
  const tree = new Flatbush(count)
  let k = 0
  for (const ring of rings) {
    for (let i = 0; i + 1 < ring.length; i++) {
      const [x1, y1] = ring[i]!
      const [x2, y2] = ring[i + 1]!
      edges.set([x1, y1, x2, y2], k * 4)
      tree.add(Math.min(x1, x2), Math.min(y1, y2), Math.max(x1, x2), Math.max(y1, y2))
      k++
    }
  }
  tree.finish()
  const index = {
    projection,
    rings,
    edges,
    tree,
    spanM: Math.hypot(tree.maxX - tree.minX, tree.maxY - tree.minY),
  }
  cache.set(lake, index)
  return index
}

/** Hits closer than this belong to the edge the point sits on. */
const ON_EDGE_M = 0.01
/** The first stretch of a radial searched in the tree; each next stretch is twice as long. */
const FIRST_STRETCH_M = 200

/** Distance along the ray from `o` in unit direction `d` to edge `e`, or Infinity when it misses. */
function rayHit(edges: Float64Array, e: number, o: Xy, d: Xy): number {
  const x1 = edges[e * 4]!
  const y1 = edges[e * 4 + 1]!
  const ex = edges[e * 4 + 2]! - x1
  const ey = edges[e * 4 + 3]! - y1
  const denom = d[0] * ey - d[1] * ex
  if (Math.abs(denom) < 1e-12) return Infinity
  const wx = x1 - o[0]
  const wy = y1 - o[1]
  const t = (wx * ey - wy * ex) / denom
  const s = (wx * d[1] - wy * d[0]) / denom
  return s >= 0 && s <= 1 && t > ON_EDGE_M ? t : Infinity
}

/** Distance to the first edge along a ray, searching the tree in growing stretches. */
export function firstHitM(index: ShoreIndex, o: Xy, d: Xy): number {
  let from = 0
  let to = FIRST_STRETCH_M
  while (from < index.spanM) {
    const ax = o[0] + d[0] * from
    const ay = o[1] + d[1] * from
    const bx = o[0] + d[0] * to
    const by = o[1] + d[1] * to
    let best = Infinity
    for (const e of index.tree.search(
      Math.min(ax, bx),
      Math.min(ay, by),
      Math.max(ax, bx),
      Math.max(ay, by),
    )) {
      best = Math.min(best, rayHit(index.edges, e, o, d))
    }
    // A hit beyond this stretch may still have a nearer rival in the next one.
    if (best <= to) return best
    from = to
    to *= 2
  }
  return Infinity
}

/** Even-odd test using only the edges the tree finds on a horizontal ray to the east. */
function inWater(index: ShoreIndex, p: Xy): boolean {
  const near = index.tree.search(p[0], p[1], index.tree.maxX, p[1])
  let inside = false
  for (const e of near) {
    const x1 = index.edges[e * 4]!
    const y1 = index.edges[e * 4 + 1]!
    const x2 = index.edges[e * 4 + 2]!
    const y2 = index.edges[e * 4 + 3]!
    if (y1 > p[1] !== y2 > p[1] && p[0] < ((x2 - x1) * (p[1] - y1)) / (y2 - y1) + x1)
      inside = !inside
  }
  return inside
}

/** Fetch along one true bearing from a projected point: the radial's open-water length. */
export function radialFetchM(index: ShoreIndex, point: Position, bearingDeg: number): number {
  const o = index.projection.project(point)
  const d = index.projection.bearingVector(point, bearingDeg)
  const hit = firstHitM(index, o, d)
  if (!Number.isFinite(hit)) return 0
  // Nothing crosses the radial before the hit, so its midpoint says whether it runs over water.
  const probe = Math.min(hit / 2, 1)
  return inWater(index, [o[0] + d[0] * probe, o[1] + d[1] * probe]) ? hit : 0
}

function checkArgs(point: Position, windFromDeg: number): void {
  if (!Array.isArray(point) || point.length < 2) {
    throw new DomainError('invalid_geometry', 'point must be [lon, lat].', 'point')
  }
  assertFinite(point[0], 'point[0] (longitude)', { min: -180, max: 180 })
  assertFinite(point[1], 'point[1] (latitude)', { min: -90, max: 90 })
  assertFinite(windFromDeg, 'windFromDeg')
}

/**
 * Metres over water from `point` toward where the wind comes from, to the first land (islands
 * are land); 0 when the first step from the point is over land. Distances are measured on the
 * WGS84 tangent plane at the lake's centre; bearings are true at the point.
 */
export function fetchLength(lake: LakeGeometry, point: Position, windFromDeg: number): number {
  checkArgs(point, windFromDeg)
  return radialFetchM(shoreIndex(lake), point, windFromDeg)
}

/** Nine radials at 3° spacing centred on the upwind bearing (SPM 1984 procedure, as USGS applies it). */
export const EFFECTIVE_FETCH_OFFSETS_DEG = [-12, -9, -6, -3, 0, 3, 6, 9, 12]

/** Arithmetic mean of the nine radials (Rohweder et al. 2012, USGS; the procedure's details from memory). */
export function effectiveFetch(lake: LakeGeometry, point: Position, windFromDeg: number): number {
  checkArgs(point, windFromDeg)
  const index = shoreIndex(lake)
  let sum = 0
  for (const offset of EFFECTIVE_FETCH_OFFSETS_DEG)
    sum += radialFetchM(index, point, windFromDeg + offset)
  return sum / EFFECTIVE_FETCH_OFFSETS_DEG.length
}

/** The plain scan over every edge: what the tests and the benchmark compare the tree against. */
export function naiveFirstHitM(index: ShoreIndex, o: Xy, d: Xy): number {
  let best = Infinity
  for (let e = 0; e < index.edges.length / 4; e++)
    best = Math.min(best, rayHit(index.edges, e, o, d))
  return best
}
