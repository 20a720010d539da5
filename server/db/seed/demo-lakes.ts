import type { Polygon, Position, Ring } from '../../../shared/geo/types'

/** An invented lake: a shoreline traced from a radius that varies with angle, with arms, coves and islands. */
export interface DemoLakeShape {
  slug: string
  name: string
  region: string
  timeZone: string
  normalPoolM: number
  center: Position
  /** Typical radius of the main basin, metres. */
  radiusM: number
  /** Long arms (creek channels) and short coves: bearing of the bump in degrees, width in degrees, length as a share of the radius (negative for a bay that cuts in). */
  bumps: { atDeg: number; widthDeg: number; length: number }[]
  /** Gentle waviness of the bank: [harmonic, amplitude, phase in degrees]. */
  waves: [number, number, number][]
  /** Islands: bearing and distance from the centre as a share of the smallest radius, and size. */
  islands: { atDeg: number; distance: number; size: number }[]
}

export const DEMO_REGION = 'Tessel Highlands'

export const DEMO_LAKES: DemoLakeShape[] = [
  {
    slug: 'quillmere',
    name: 'Quillmere Reservoir',
    region: DEMO_REGION,
    timeZone: 'America/Chicago',
    normalPoolM: 248.4,
    center: [-88.214, 34.872],
    radiusM: 1900,
    bumps: [
      { atDeg: 20, widthDeg: 9, length: 1.6 },
      { atDeg: 140, widthDeg: 12, length: 1.1 },
      { atDeg: 250, widthDeg: 7, length: 0.8 },
      { atDeg: 300, widthDeg: 5, length: -0.35 },
      { atDeg: 95, widthDeg: 4, length: -0.3 },
    ],
    waves: [
      [3, 0.12, 10],
      [7, 0.05, 40],
      [13, 0.025, 0],
    ],
    islands: [
      { atDeg: 60, distance: 0.45, size: 0.16 },
      { atDeg: 210, distance: 0.5, size: 0.09 },
    ],
  },
  {
    slug: 'vessandra',
    name: 'Lake Vessandra',
    region: DEMO_REGION,
    timeZone: 'America/Chicago',
    normalPoolM: 182.9,
    center: [-89.037, 33.418],
    radiusM: 2300,
    bumps: [
      { atDeg: 175, widthDeg: 10, length: 1.3 },
      { atDeg: 330, widthDeg: 8, length: 0.9 },
      { atDeg: 75, widthDeg: 6, length: -0.4 },
      { atDeg: 240, widthDeg: 5, length: 0.5 },
    ],
    waves: [
      [2, 0.18, 70],
      [5, 0.06, 15],
      [11, 0.03, 80],
    ],
    islands: [{ atDeg: 120, distance: 0.4, size: 0.2 }],
  },
  {
    slug: 'tanglewhit',
    name: 'Tanglewhit Lake',
    region: DEMO_REGION,
    timeZone: 'America/New_York',
    normalPoolM: 311.2,
    center: [-84.602, 36.947],
    radiusM: 1500,
    bumps: [
      { atDeg: 0, widthDeg: 14, length: 0.9 },
      { atDeg: 110, widthDeg: 6, length: 1.4 },
      { atDeg: 200, widthDeg: 9, length: -0.3 },
      { atDeg: 265, widthDeg: 8, length: 1.0 },
    ],
    waves: [
      [4, 0.1, 25],
      [9, 0.04, 60],
    ],
    islands: [
      { atDeg: 300, distance: 0.35, size: 0.18 },
      { atDeg: 30, distance: 0.55, size: 0.08 },
      { atDeg: 170, distance: 0.5, size: 0.1 },
    ],
  },
]

const ISLAND_VERTICES = 28
const DEG = Math.PI / 180

function angleGap(a: number, b: number): number {
  return ((a - b + 540) % 360) - 180
}

function shoreRadius(shape: DemoLakeShape, bearingDeg: number): number {
  let r = 1
  for (const [k, amp, phase] of shape.waves) r += amp * Math.cos((k * bearingDeg + phase) * DEG)
  for (const bump of shape.bumps) {
    r += bump.length * Math.exp(-((angleGap(bearingDeg, bump.atDeg) / bump.widthDeg) ** 2))
  }
  return Math.max(0.25, r) * shape.radiusM
}

function toPosition(center: Position, eastM: number, northM: number): Position {
  const [lon0, lat0] = center
  const lon = lon0 + eastM / (111_320 * Math.cos(lat0 * DEG))
  const lat = lat0 + northM / 110_574
  return [Number(lon.toFixed(6)), Number(lat.toFixed(6))]
}

function closed(ring: Position[]): Ring {
  return [...ring, ring[0]!]
}

/**
 * A star-shaped shoreline is always a simple ring, and every island sits inside the circle of the
 * smallest shore radius, so rings never cross. Outer ring counter-clockwise, islands clockwise (RFC 7946).
 */
export function demoShoreline(shape: DemoLakeShape, shoreVertices = 480): Polygon {
  const bearings = Array.from({ length: shoreVertices }, (_, i) => (360 * i) / shoreVertices)
  const radii = bearings.map((b) => shoreRadius(shape, b))
  const minRadius = Math.min(...radii)
  // Counter-clockwise in map terms means bearings decreasing.
  const shore = bearings
    .map((b, i) =>
      toPosition(shape.center, radii[i]! * Math.sin(b * DEG), radii[i]! * Math.cos(b * DEG)),
    )
    .reverse()
  const islands = shape.islands.map((island) => {
    const cx = island.distance * minRadius * Math.sin(island.atDeg * DEG)
    const cy = island.distance * minRadius * Math.cos(island.atDeg * DEG)
    const size = island.size * minRadius
    return closed(
      Array.from({ length: ISLAND_VERTICES }, (_, i) => {
        const b = (360 * i) / ISLAND_VERTICES
        const r = size * (1 + 0.2 * Math.cos(3 * b * DEG + island.atDeg))
        return toPosition(
          shape.center,
          cx + r * Math.sin(b * DEG),
          cy + 0.7 * r * Math.cos(b * DEG),
        )
      }),
    )
  })
  return { type: 'Polygon', coordinates: [closed(shore), ...islands] }
}
