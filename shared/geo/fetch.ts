import Flatbush from 'flatbush'
import { assertFinite, DomainError } from '../errors'
import { assertLakeGeometry, lakeProjection, polygonsOf, ringAreaXy } from './polygon'
import type { LocalProjection, Xy } from './projection'
import type { LakeGeometry, Position } from './types'

/** Hits closer than this belong to the edge the point sits on. */
const ON_EDGE_M = 0.01
/** The first stretch of a radial searched in the tree; each next stretch is twice as long. */
const FIRST_STRETCH_M = 500
/** Small tree nodes: a short stretch of ray then tests few edges it does not touch. */
const NODE_SIZE = 8

/** Where a point lies on the shore: its edge, the fraction along it, and the metres along the ring. */
export interface ShorePlace {
  edge: number
  f: number
  ring: number
  /** Metres along the ring from its first vertex, in its water-on-the-left direction. */
  alongM: number
  /** How far the located point was from this place. */
  distanceM: number
}

/**
 * A lake ready for ray casting: every shoreline and island edge on the lake's tangent plane,
 * in a Flatbush R-tree so a radial only tests the edges near it.
 */
export class ShoreIndex {
  readonly projection: LocalProjection
  readonly rings: Xy[][]
  /** x1, y1, x2, y2 per edge. */
  readonly edges: Float64Array
  /** lon1, lat1, lon2, lat2 per edge, in the same order: to turn a point on an edge back into WGS84. */
  readonly edgesLonLat: Float64Array
  readonly tree: Flatbush
  /** Diagonal of the lake's bounding box: no fetch is longer. */
  readonly spanM: number
  /** The ring each edge belongs to (an index into `rings`). */
  readonly edgeRing: Uint32Array
  /** Metres along its ring at the start of each edge. */
  readonly edgeAlongM: Float64Array
  /** The first edge of each ring; a ring's edges follow one another in its oriented order. */
  readonly ringFirstEdge: number[]
  /** Each ring's length in metres. */
  readonly ringLengthM: number[]
  /** Whether each ring is an island's (the water lies outside it) rather than a shoreline. */
  readonly ringIsIsland: boolean[]

  // Scratch state for the tree's visitor callbacks, so casting a radial allocates nothing.
  private ox = 0
  private oy = 0
  private dx = 0
  private dy = 0
  private best = Infinity
  /** Whether the nearest hit so far reaches its edge from the water side. */
  private fromWater = false

  constructor(lake: LakeGeometry) {
    assertLakeGeometry(lake)
    this.projection = lakeProjection(lake)
    const { project } = this.projection
    // Shorelines counter-clockwise and islands clockwise, so water is always left of an edge.
    const oriented = polygonsOf(lake).flatMap((polygon) =>
      polygon.map((ring, i) => {
        const xy = ring.map(project)
        const island = i > 0
        return ringAreaXy(xy) > 0 === !island
          ? { xy, lonLat: ring, island }
          : { xy: xy.reverse(), lonLat: [...ring].reverse(), island }
      }),
    )
    this.rings = oriented.map((r) => r.xy)
    this.ringIsIsland = oriented.map((r) => r.island)
    const count = this.rings.reduce((n, r) => n + r.length - 1, 0)
    this.edges = new Float64Array(count * 4)
    this.edgesLonLat = new Float64Array(count * 4)
    this.edgeRing = new Uint32Array(count)
    this.edgeAlongM = new Float64Array(count)
    this.ringFirstEdge = []
    this.ringLengthM = []
    this.tree = new Flatbush(count, NODE_SIZE)
    let k = 0
    for (const [r, { xy, lonLat }] of oriented.entries()) {
      this.ringFirstEdge.push(k)
      let along = 0
      for (let i = 0; i + 1 < xy.length; i++) {
        const [x1, y1] = xy[i]!
        const [x2, y2] = xy[i + 1]!
        this.edgesLonLat.set([...lonLat[i]!, ...lonLat[i + 1]!], k * 4)
        this.edgeRing[k] = r
        this.edgeAlongM[k] = along
        along += Math.hypot(x2 - x1, y2 - y1)
        this.edges.set([x1, y1, x2, y2], k++ * 4)
        this.tree.add(Math.min(x1, x2), Math.min(y1, y2), Math.max(x1, x2), Math.max(y1, y2))
      }
      this.ringLengthM.push(along)
    }
    this.tree.finish()
    this.spanM = Math.hypot(this.tree.maxX - this.tree.minX, this.tree.maxY - this.tree.minY)
  }

  /** Distance along the current ray to edge `e`, or Infinity when it misses. Sets `denom`. */
  private denom = 0
  private hit(e: number): number {
    const x1 = this.edges[e * 4]!
    const y1 = this.edges[e * 4 + 1]!
    const ex = this.edges[e * 4 + 2]! - x1
    const ey = this.edges[e * 4 + 3]! - y1
    const denom = this.dx * ey - this.dy * ex
    this.denom = denom
    if (Math.abs(denom) < 1e-12) return Infinity
    const wx = x1 - this.ox
    const wy = y1 - this.oy
    const t = (wx * ey - wy * ex) / denom
    const s = (wx * this.dy - wy * this.dx) / denom
    return s >= 0 && s <= 1 && t > ON_EDGE_M ? t : Infinity
  }

  private readonly keepNearest = (e: number): boolean => {
    const t = this.hit(e)
    if (t < this.best) {
      this.best = t
      // Water lies left of every edge: a ray crossing it left to right came over water.
      this.fromWater = this.denom > 0
    }
    return false
  }

  private readonly touching: number[] = []
  private readonly collectTouching = (e: number): boolean => {
    const x1 = this.edges[e * 4]!
    const y1 = this.edges[e * 4 + 1]!
    const ex = this.edges[e * 4 + 2]! - x1
    const ey = this.edges[e * 4 + 3]! - y1
    const len2 = ex * ex + ey * ey
    const f = len2
      ? Math.max(0, Math.min(1, ((this.ox - x1) * ex + (this.oy - y1) * ey) / len2))
      : 0
    if (Math.hypot(x1 + f * ex - this.ox, y1 + f * ey - this.oy) < ON_EDGE_M) this.touching.push(e)
    return false
  }

  /** Whether direction d points left of edge e, to its water side. */
  private leftOf(e: number, dx: number, dy: number): boolean {
    const ex = this.edges[e * 4 + 2]! - this.edges[e * 4]!
    const ey = this.edges[e * 4 + 3]! - this.edges[e * 4 + 1]!
    return ex * dy - ey * dx > 0
  }

  /**
   * The shore edges a point sits on, found once per point: one edge it lies inside, or the edges
   * into and out of the vertex it lies on. Empty when the point is off the shore.
   */
  private shoreAt([ox, oy]: Xy): { inside?: number; into?: number; out?: number } {
    this.ox = ox
    this.oy = oy
    this.touching.length = 0
    this.tree.search(
      ox - ON_EDGE_M,
      oy - ON_EDGE_M,
      ox + ON_EDGE_M,
      oy + ON_EDGE_M,
      this.collectTouching,
    )
    const found: { inside?: number; into?: number; out?: number } = {}
    for (const e of this.touching) {
      const atStart = Math.hypot(this.edges[e * 4]! - ox, this.edges[e * 4 + 1]! - oy) < ON_EDGE_M
      const atEnd = Math.hypot(this.edges[e * 4 + 2]! - ox, this.edges[e * 4 + 3]! - oy) < ON_EDGE_M
      if (atStart) found.out = e
      else if (atEnd) found.into = e
      else found.inside = e
    }
    return found
  }

  /**
   * Whether the first step along d is over land: right of the edge the point sits on, or, at a
   * vertex, outside the water's corner between the edge in and the edge out.
   */
  private firstStepOverLand(
    at: { inside?: number; into?: number; out?: number },
    [dx, dy]: Xy,
  ): boolean {
    if (at.inside !== undefined) return !this.leftOf(at.inside, dx, dy)
    if (at.into === undefined || at.out === undefined) return false
    const ox = this.edges[at.out * 4]!
    const oy = this.edges[at.out * 4 + 1]!
    const convex = this.leftOf(
      at.into,
      this.edges[at.out * 4 + 2]! - ox,
      this.edges[at.out * 4 + 3]! - oy,
    )
    const li = this.leftOf(at.into, dx, dy)
    const lo = this.leftOf(at.out, dx, dy)
    return !(convex ? li && lo : li || lo)
  }

  /** Distance to the first edge along a ray (Infinity when none), searching the tree in growing stretches. */
  firstHit([ox, oy]: Xy, [dx, dy]: Xy): number {
    const maxM = this.spanM
    this.ox = ox
    this.oy = oy
    this.dx = dx
    this.dy = dy
    this.best = Infinity
    let from = 0
    let to = Math.min(FIRST_STRETCH_M, maxM)
    while (from < maxM) {
      const ax = ox + dx * from
      const ay = oy + dy * from
      const bx = ox + dx * to
      const by = oy + dy * to
      this.tree.search(
        Math.min(ax, bx),
        Math.min(ay, by),
        Math.max(ax, bx),
        Math.max(ay, by),
        this.keepNearest,
      )
      // A hit beyond this stretch may still have a nearer rival in the next one.
      if (this.best <= to) return this.best
      from = to
      to = Math.min(to * 2, maxM)
    }
    return Infinity
  }

  /** The plain scan over every edge: what the tests and the benchmark compare the tree against. */
  naiveFirstHit([ox, oy]: Xy, [dx, dy]: Xy): number {
    this.ox = ox
    this.oy = oy
    this.dx = dx
    this.dy = dy
    let best = Infinity
    for (let e = 0; e < this.edges.length / 4; e++) best = Math.min(best, this.hit(e))
    return best
  }

  /**
   * Where on any shore (islands included) the point nearest `point` lies, within `maxM` metres;
   * null when no shore is that close.
   */
  locate(point: Position, maxM: number): ShorePlace | null {
    const [ox, oy] = this.projection.project(point)
    let best: { distanceM: number; edge: number; f: number } | null = null
    for (const e of this.tree.neighbors(ox, oy, Infinity, maxM)) {
      const x1 = this.edges[e * 4]!
      const y1 = this.edges[e * 4 + 1]!
      const ex = this.edges[e * 4 + 2]! - x1
      const ey = this.edges[e * 4 + 3]! - y1
      const len2 = ex * ex + ey * ey
      const f = len2 ? Math.max(0, Math.min(1, ((ox - x1) * ex + (oy - y1) * ey) / len2)) : 0
      const distanceM = Math.hypot(x1 + f * ex - ox, y1 + f * ey - oy)
      if (distanceM <= maxM && (!best || distanceM < best.distanceM))
        best = { distanceM, edge: e, f }
    }
    if (!best) return null
    const { edge, f } = best
    const edgeM = Math.hypot(
      this.edges[edge * 4 + 2]! - this.edges[edge * 4]!,
      this.edges[edge * 4 + 3]! - this.edges[edge * 4 + 1]!,
    )
    return {
      ...best,
      ring: this.edgeRing[edge]!,
      alongM: this.edgeAlongM[edge]! + f * edgeM,
    }
  }

  /**
   * The nearest point on any shore (islands included) within `maxM` metres of `point`, with its
   * distance; null when no shore is that close. Edges are short, so the point found on the plane
   * maps back to WGS84 by its fraction along the edge.
   */
  nearestShorePoint(point: Position, maxM: number): { point: Position; distanceM: number } | null {
    const place = this.locate(point, maxM)
    if (!place) return null
    const { edge, f } = place
    const [lon1, lat1, lon2, lat2] = this.edgesLonLat.subarray(edge * 4, edge * 4 + 4)
    return {
      point: [lon1! + f * (lon2! - lon1!), lat1! + f * (lat2! - lat1!)],
      distanceM: place.distanceM,
    }
  }

  /** The point `alongM` metres along ring `ring` (wrapping past its end), on the lake's plane. */
  pointAlong(ring: number, alongM: number): Xy {
    const length = this.ringLengthM[ring]!
    const m = ((alongM % length) + length) % length
    // Binary search for the last edge of the ring that starts at or before m.
    let lo = this.ringFirstEdge[ring]!
    let hi = (this.ringFirstEdge[ring + 1] ?? this.edgeRing.length) - 1
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1
      if (this.edgeAlongM[mid]! <= m) lo = mid
      else hi = mid - 1
    }
    const x1 = this.edges[lo * 4]!
    const y1 = this.edges[lo * 4 + 1]!
    const ex = this.edges[lo * 4 + 2]! - x1
    const ey = this.edges[lo * 4 + 3]! - y1
    const len = Math.hypot(ex, ey)
    const f = len ? Math.min(1, (m - this.edgeAlongM[lo]!) / len) : 0
    return [x1 + f * ex, y1 + f * ey]
  }

  /**
   * Radials from one point: the projection and the local true north are worked out once, so each
   * bearing costs only the ray cast. A radial's length is 0 when it starts over land.
   */
  radialsFrom(point: Position): (bearingDeg: number) => number {
    const o = this.projection.project(point)
    const [nx, ny] = this.projection.bearingVector(point, 0)
    const shore = this.shoreAt(o)
    return (bearingDeg) => {
      const b = (bearingDeg * Math.PI) / 180
      const c = Math.cos(b)
      const s = Math.sin(b)
      // North turned clockwise by the bearing (east is north turned a right angle clockwise).
      const d: Xy = [c * nx + s * ny, c * ny - s * nx]
      if (this.firstStepOverLand(shore, d)) return 0
      // Nothing crosses the radial before its first hit, so the side it meets that edge from says
      // whether it ran over water or over land from its first step.
      const hit = this.firstHit(o, d)
      return Number.isFinite(hit) && this.fromWater ? hit : 0
    }
  }
}

const cache = new WeakMap<LakeGeometry, ShoreIndex>()

/** The lake's index, built once per geometry object. */
export function shoreIndex(lake: LakeGeometry): ShoreIndex {
  let index = cache.get(lake)
  if (!index) cache.set(lake, (index = new ShoreIndex(lake)))
  return index
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
  return shoreIndex(lake).radialsFrom(point)(windFromDeg)
}

/** Nine radials at 3° spacing centred on the upwind bearing (SPM 1984 procedure, as USGS applies it). */
export const EFFECTIVE_FETCH_OFFSETS_DEG = [-12, -9, -6, -3, 0, 3, 6, 9, 12]

/** Arithmetic mean of the nine radials (Rohweder et al. 2012, USGS; the procedure's details from memory). */
export function effectiveFetch(lake: LakeGeometry, point: Position, windFromDeg: number): number {
  checkArgs(point, windFromDeg)
  const radial = shoreIndex(lake).radialsFrom(point)
  let sum = 0
  for (const offset of EFFECTIVE_FETCH_OFFSETS_DEG) sum += radial(windFromDeg + offset)
  return sum / EFFECTIVE_FETCH_OFFSETS_DEG.length
}
