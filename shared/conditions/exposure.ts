import { assertFinite, DomainError } from '../errors'
import { effectiveFetch, fetchLength, shoreIndex } from '../geo/fetch'
import { lakeCenter } from '../geo/polygon'
import type { LakeGeometry, Position } from '../geo/types'
import { bankStretch } from './bank-stretch'
import { waveGrowth } from './waves'

/** cos of the angle between where the bank looks out and where the wind comes from: 1 onto the bank, -1 off it. */
export function onshoreComponent(bankFacingDeg: number, windFromDeg: number): number {
  assertFinite(bankFacingDeg, 'bankFacingDeg')
  assertFinite(windFromDeg, 'windFromDeg')
  return Math.cos(((windFromDeg - bankFacingDeg) * Math.PI) / 180)
}

/** The 16 compass points, clockwise from north. */
export const COMPASS_16 = Array.from({ length: 16 }, (_, i) => i * 22.5)
const COMPASS_NAMES = [
  'N',
  'NNE',
  'NE',
  'ENE',
  'E',
  'ESE',
  'SE',
  'SSE',
  'S',
  'SSW',
  'SW',
  'WSW',
  'W',
  'WNW',
  'NW',
  'NNW',
]

export function compassName(deg: number): string {
  return COMPASS_NAMES[Math.round((((deg % 360) + 360) % 360) / 22.5) % 16]!
}

export interface ExposureRow {
  windFromDeg: number
  fetchM: number
  effectiveFetchM: number
}

/**
 * How the tables made now are computed. 1 (no `version`): facing square to the first and last
 * points picked, so a bank could face either way by the order it was picked in. 2: facing from
 * the shore the bank lies along (`bankFacing`). 3: fetch measured from the middle of that stretch,
 * a step into the water (the middle of the points picked round a point or island lies on land,
 * where every fetch is 0 and the bank read lee in any wind).
 */
export const EXPOSURE_TABLE_VERSION = 3

/** What the server stores for each saved bank, so a day plan never recomputes geometry. */
export interface ExposureTable {
  /** Absent on tables stored before versions were kept: version 1. */
  version?: number
  point: Position
  facingDeg: number
  rows: ExposureRow[]
}

/** The middle of a bank's polyline, measured along it. */
export function bankMidpoint(points: Position[]): Position {
  if (points.length < 1)
    throw new DomainError('invalid_geometry', 'A bank needs at least one point.', 'points')
  if (points.length === 1) return points[0]!
  // Degrees of longitude shrink with latitude; this weighting is enough to find a middle.
  const k = Math.cos((points[0]![1] * Math.PI) / 180)
  const lens = points
    .slice(1)
    .map((p, i) => Math.hypot((p[0] - points[i]![0]) * k, p[1] - points[i]![1]))
  let half = lens.reduce((a, b) => a + b, 0) / 2
  for (let i = 0; i < lens.length; i++) {
    if (half <= lens[i]!) {
      const f = lens[i]! ? half / lens[i]! : 0
      const a = points[i]!
      const b = points[i + 1]!
      return [a[0] + (b[0] - a[0]) * f, a[1] + (b[1] - a[1]) * f]
    }
    half -= lens[i]!
  }
  return points[points.length - 1]!
}

/**
 * The true bearing a bank looks out over the water, from the shore itself: the stretch of ring
 * its points cover (`bankStretch`), and the outward normal of that stretch — the edges' normals
 * averaged by length, which is the left normal of the chord from the stretch's start to its end,
 * since water lies left of every oriented edge. The order the points were picked in plays no part.
 */
export function bankFacing(lake: LakeGeometry, points: Position[]): number {
  const stretch = bankStretch(lake, points)
  const index = shoreIndex(lake)
  let [a, b] = [stretch.start, stretch.end]
  // A bank almost all the way round an island has ends too close to say: face out from its middle.
  if (Math.hypot(b[0] - a[0], b[1] - a[1]) < 1) {
    const middleM = stretch.fromM + stretch.lengthM / 2
    a = index.pointAlong(stretch.ring, middleM - 0.5)
    b = index.pointAlong(stretch.ring, middleM + 0.5)
  }
  const len = Math.hypot(b[0] - a[0], b[1] - a[1])
  const nx = -(b[1] - a[1]) / len
  const ny = (b[0] - a[0]) / len
  // On the tangent plane near the lake, grid and true north differ by well under a degree.
  const north = index.projection.bearingVector(bankMidpoint(points), 0)
  const east: [number, number] = [north[1], -north[0]]
  const deg =
    (Math.atan2(nx * east[0] + ny * east[1], nx * north[0] + ny * north[1]) * 180) / Math.PI
  return (deg + 360) % 360
}

/** Where a bank's fetch is measured from: its stretch's middle on the shore, a step into the water. */
function fetchOrigin(lake: LakeGeometry, points: Position[]): Position {
  const stretch = bankStretch(lake, points)
  const index = shoreIndex(lake)
  const middleM = stretch.fromM + stretch.lengthM / 2
  const a = index.pointAlong(stretch.ring, middleM - 0.5)
  const b = index.pointAlong(stretch.ring, middleM + 0.5)
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1
  // Water lies left of the ring's direction; the middle of a chord across a point may be on land.
  const step = WATER_STEP_M / len
  return index.projection.unproject([
    (a[0] + b[0]) / 2 - (b[1] - a[1]) * step,
    (a[1] + b[1]) / 2 + (b[0] - a[0]) * step,
  ])
}
/** How far into the water from the shore a bank's fetch is measured. */
const WATER_STEP_M = 2

export function exposureTable(lake: LakeGeometry, points: Position[]): ExposureTable {
  const point = fetchOrigin(lake, points)
  return {
    version: EXPOSURE_TABLE_VERSION,
    point,
    facingDeg: bankFacing(lake, points),
    rows: COMPASS_16.map((windFromDeg) => ({
      windFromDeg,
      fetchM: fetchLength(lake, point, windFromDeg),
      effectiveFetchM: effectiveFetch(lake, point, windFromDeg),
    })),
  }
}

/** Effective fetch for any direction, interpolated between the two nearest compass points. */
export function fetchFromTable(table: ExposureTable, windFromDeg: number): number {
  const deg = ((windFromDeg % 360) + 360) % 360
  const i = Math.floor(deg / 22.5) % 16
  const f = (deg - i * 22.5) / 22.5
  const a = table.rows[i]!.effectiveFetchM
  const b = table.rows[(i + 1) % 16]!.effectiveFetchM
  return a + (b - a) * f
}

/** From sheltered to too rough to fish. */
export const EXPOSURE_CLASSES = ['lee', 'side wind', 'windward', 'rough'] as const
export type ExposureClass = (typeof EXPOSURE_CLASSES)[number]

/** Waves a small boat notices as a chop: 0.3 m (1 ft), our line between windward and rough. */
export const ROUGH_WAVE_M = 0.3

export interface BankExposure {
  exposure: ExposureClass
  onshore: number
  fetchM: number
  waveHeightM: number
}

/**
 * Our classes: lee when the wind blows off the bank (onshore < -0.34, i.e. more than 110° off) or
 * crosses too little water to raise a ripple; side wind within ±70° of along-shore; windward when it
 * blows onto the bank; rough when waves there reach 0.3 m (1 ft), a chop a small boat notices.
 */
export function bankExposure(
  table: ExposureTable,
  windFromDeg: number,
  windMs: number,
): BankExposure {
  const onshore = onshoreComponent(table.facingDeg, windFromDeg)
  const fetchM = fetchFromTable(table, windFromDeg)
  const waveHeightM = onshore > 0 ? waveGrowth(windMs, fetchM).heightM : 0
  let exposure: ExposureClass
  if (onshore < -0.34 || fetchM < 50 || windMs < 1) exposure = 'lee'
  else if (onshore < 0.34) exposure = 'side wind'
  else exposure = waveHeightM >= ROUGH_WAVE_M ? 'rough' : 'windward'
  return { exposure, onshore, fetchM, waveHeightM }
}

/**
 * Significant wave height on the open lake for a wind: the downwind shore through the centre sees
 * the whole chord along the wind, both radials from the centre added.
 */
export function openWaterWaveM(lake: LakeGeometry, windFromDeg: number, windMs: number): number {
  const center = lakeCenter(lake)
  const chord =
    fetchLength(lake, center, windFromDeg) + fetchLength(lake, center, windFromDeg + 180)
  return waveGrowth(windMs, chord).heightM
}
