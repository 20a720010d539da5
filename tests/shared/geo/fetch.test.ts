import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { effectiveFetch, fetchLength, shoreIndex } from '../../../shared/geo/fetch'
import { DomainError } from '../../../shared/errors'
import type { Polygon, Position } from '../../../shared/geo/types'
import {
  box,
  circleLake,
  densified,
  destination,
  distanceM,
  distanceToMeridian,
  distanceToParallel,
} from './fixtures'

const within = (actual: number, expected: number, rel = 0.005) =>
  expect(Math.abs(actual / expected - 1), `${actual} vs ${expected}`).toBeLessThan(rel)

describe.each([
  ['northern', 45],
  ['southern', -38],
])('a rectangular lake, %s hemisphere', (_h, south) => {
  // About 8 km by 5.5 km; edges densified so they follow the parallels.
  const corners = box(-90.1, south, 0.1, 0.05)
  const lake: Polygon = { type: 'Polygon', coordinates: [densified(corners)] }
  const west: Position = [-90.1, south + 0.025]

  it('has the fetch to the opposite shore along the geodesic, to 0.5 % (GeographicLib)', () => {
    within(fetchLength(lake, west, 90), distanceToMeridian(west, 90, -90.0))
    // At 60° the radial reaches the north shore first.
    within(fetchLength(lake, west, 60), distanceToParallel(west, 60, south + 0.05))
  })

  it('gives the same fetch from a point inside an edge as from the vertex beside it', () => {
    // west is a vertex of the densified ring; this point lies between two vertices.
    const onEdge: Position = [-90.1, south + 0.0256]
    within(fetchLength(lake, onEdge, 90), distanceToMeridian(onEdge, 90, -90.0))
    expect(fetchLength(lake, onEdge, 270)).toBe(0)
  })

  it('is 0 when the first step upwind is over land', () => {
    expect(fetchLength(lake, west, 270)).toBe(0)
    expect(fetchLength(lake, west, 200)).toBe(0)
  })

  it('runs from a vertex along the diagonal to the far corner', () => {
    const sw = corners[0]!
    const ne = corners[2]!
    const toNe = fetchLength(lake, sw, 45)
    expect(toNe).toBeGreaterThan(0)
    expect(toNe).toBeLessThanOrEqual(distanceM(sw, ne) * 1.005)
  })
})

describe('a lake 50 km across', () => {
  const lake: Polygon = {
    type: 'Polygon',
    coordinates: [densified(box(-90.6, 44.8, 0.65, 0.2), 200)],
  }
  it.each([80, 90, 100])('measures a 50 km radial at %d° to 0.5 %% (GeographicLib)', (az) => {
    const west: Position = [-90.6, 44.9]
    within(fetchLength(lake, west, az), distanceToMeridian(west, az, -89.95))
  })
})

describe('a circular lake', () => {
  const center: Position = [-85.3, 36.1]
  const r = 3000
  const lake = circleLake(center, r)

  it.each([0, 20, 45, 70])(
    'gives the chord 2r cos(%d°) from a shore point (geometry, GeographicLib radius)',
    (off) => {
      // The point on the south shore; the wind comes from the north, off° to one side.
      const south = destination(center, 180, r)
      within(fetchLength(lake, south, off), 2 * r * Math.cos((off * Math.PI) / 180), 0.005)
    },
  )

  it('has an effective fetch that is the mean of nine chords (SPM 1984 radial method)', () => {
    const south = destination(center, 180, r)
    const chords = [-12, -9, -6, -3, 0, 3, 6, 9, 12].map(
      (d) => 2 * r * Math.cos((d * Math.PI) / 180),
    )
    within(effectiveFetch(lake, south, 0), chords.reduce((a, b) => a + b) / 9)
  })

  it('never exceeds the lake’s longest dimension (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: 0, max: 0.95, noNaN: true }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        (az, frac, wind) => {
          const p = destination(center, az, frac * r)
          expect(fetchLength(lake, p, wind)).toBeLessThanOrEqual(2 * r * 1.001)
        },
      ),
    )
  })

  it('finds the same first hit with the R-tree as with a scan of every edge', () => {
    const index = shoreIndex(lake)
    fc.assert(
      fc.property(
        fc.double({ min: -2500, max: 2500, noNaN: true }),
        fc.double({ min: -2500, max: 2500, noNaN: true }),
        fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
        (x, y, a) => {
          const d: [number, number] = [Math.sin(a), Math.cos(a)]
          expect(index.firstHit([x, y], d)).toBeCloseTo(index.naiveFirstHit([x, y], d), 6)
        },
      ),
    )
  })
})

describe('islands and coves', () => {
  // A 0.1° x 0.05° lake with a square island in the middle.
  const outer = densified(box(-90.1, 45, 0.1, 0.05))
  const island = [...densified(box(-90.06, 45.02, 0.02, 0.01), 4)].reverse()
  const lake: Polygon = { type: 'Polygon', coordinates: [outer, island] }
  const west: Position = [-90.1, 45.025]

  it('stops a radial at an island’s shore (GeographicLib)', () => {
    within(fetchLength(lake, west, 90), distanceToMeridian(west, 90, -90.06))
  })

  it('gives 0 from an island shore facing inland, and open fetch facing out', () => {
    const islandWest: Position = [-90.06, 45.025]
    expect(fetchLength(lake, islandWest, 90)).toBe(0)
    within(fetchLength(lake, islandWest, 270), distanceToMeridian(islandWest, 270, -90.1))
  })

  it('shelters a bank at the back of a cove from one side and exposes it to the other', () => {
    // A main basin with a narrow cove cut northward from its north shore.
    const cove: Polygon = {
      type: 'Polygon',
      coordinates: [
        densified(
          [
            [-90.1, 45],
            [-90.0, 45],
            [-90.0, 45.05],
            [-90.045, 45.05],
            [-90.045, 45.08],
            [-90.055, 45.08],
            [-90.055, 45.05],
            [-90.1, 45.05],
          ],
          10,
        ),
      ],
    }
    const back: Position = [-90.05, 45.08]
    // Wind from the south runs the cove and the whole basin.
    within(fetchLength(cove, back, 180), distanceM(back, [-90.05, 45]), 0.005)
    // Wind from the east crosses only the cove's width.
    const coveSide: Position = [-90.055, 45.065]
    within(fetchLength(cove, coveSide, 90), distanceToMeridian(coveSide, 90, -90.045))
    expect(fetchLength(cove, back, 0)).toBe(0)
  })
})

describe('bad input', () => {
  const open: Polygon = { type: 'Polygon', coordinates: [box(-90, 45, 0.1, 0.1)] }
  it('rejects an open ring, NaN points and other geometry with typed errors', () => {
    expect(() => fetchLength(open, [-89.95, 45.05], 0)).toThrow(/open/)
    const lake: Polygon = { type: 'Polygon', coordinates: [densified(box(-90, 45, 0.1, 0.1))] }
    expect(() => fetchLength(lake, [NaN, 45], 0)).toThrow(DomainError)
    expect(() => fetchLength(lake, [-89.95, 45.05], NaN)).toThrow(/windFromDeg/)
    expect(() => fetchLength({ type: 'Point' } as unknown as Polygon, [-89.95, 45.05], 0)).toThrow(
      /Polygon/,
    )
  })
})

describe('nearestShorePoint', () => {
  const outer = densified(box(-90.1, 45, 0.1, 0.05))
  const island = [...densified(box(-90.06, 45.02, 0.02, 0.01), 4)].reverse()
  const lake: Polygon = { type: 'Polygon', coordinates: [outer, island] }
  const index = shoreIndex(lake)

  it('moves a point 25 m out in the water onto the west shore, 25 m away (GeographicLib)', () => {
    const picked = destination([-90.1, 45.013], 90, 25)
    const near = index.nearestShorePoint(picked, 40)!
    within(near.distanceM, 25, 0.01)
    expect(near.point[0]).toBeCloseTo(-90.1, 9)
    within(distanceM(picked, near.point), 25, 0.01)
  })

  it('finds an island’s shore when it is the nearer one', () => {
    const picked = destination([-90.06, 45.025], 270, 10)
    const near = index.nearestShorePoint(picked, 40)!
    expect(near.point[0]).toBeCloseTo(-90.06, 9)
    within(near.distanceM, 10, 0.01)
  })

  it('gives null for a point farther than the limit from every shore', () => {
    expect(index.nearestShorePoint([-90.08, 45.01], 40)).toBeNull()
  })

  it('tells which ring a shore point is on and how far along it, and finds it again there', () => {
    const onIsland = index.locate([-90.06, 45.025], 1)!
    expect(index.ringIsIsland[onIsland.ring]).toBe(true)
    const onShore = index.locate([-90.1, 45.013], 1)!
    expect(index.ringIsIsland[onShore.ring]).toBe(false)
    for (const place of [onIsland, onShore]) {
      const [x, y] = index.pointAlong(place.ring, place.alongM)
      const [ex, ey] = index.pointAlong(place.ring, place.alongM + index.ringLengthM[place.ring]!)
      const e = place.edge * 4
      const f = place.f
      const ox = index.edges[e]! + f * (index.edges[e + 2]! - index.edges[e]!)
      const oy = index.edges[e + 1]! + f * (index.edges[e + 3]! - index.edges[e + 1]!)
      expect(Math.hypot(x - ox, y - oy)).toBeLessThan(1e-6)
      expect(Math.hypot(ex - ox, ey - oy)).toBeLessThan(1e-6)
    }
  })
})
