import { describe, expect, it } from 'vitest'
import {
  bankExposure,
  bankFacing,
  compassName,
  EXPOSURE_TABLE_VERSION,
  exposureTable,
  onshoreComponent,
} from '../../../shared/conditions/exposure'
import type { Polygon, Position } from '../../../shared/geo/types'
import { box, circleLake, densified, destination } from '../geo/fixtures'

describe('onshoreComponent (cosine of the angle, geometry)', () => {
  it.each([
    [90, 90, 1],
    [90, 270, -1],
    [90, 0, 0],
    [90, 180, 0],
    [0, 60, 0.5],
    [350, 10, Math.cos((20 * Math.PI) / 180)],
  ])('bank facing %d°, wind from %d° gives %d', (facing, from, expected) => {
    expect(onshoreComponent(facing, from)).toBeCloseTo(expected, 9)
  })
})

describe('bank exposure on a rectangular lake', () => {
  const lake: Polygon = { type: 'Polygon', coordinates: [densified(box(-90.1, 45, 0.1, 0.05))] }
  // A bank along the west shore looks east over the water, whichever way its points run.
  const westBank: [number, number][] = [
    [-90.1, 45.02],
    [-90.1, 45.03],
  ]

  it('faces the water', () => {
    expect(bankFacing(lake, westBank)).toBeCloseTo(90, 0)
    expect(bankFacing(lake, [...westBank].reverse())).toBeCloseTo(90, 0)
    expect(compassName(bankFacing(lake, westBank))).toBe('E')
  })

  it('is windward in an east wind, lee in a west wind, and rough when the chop reaches 1 ft', () => {
    const table = exposureTable(lake, westBank)
    expect(table.rows).toHaveLength(16)
    expect(bankExposure(table, 270, 6).exposure).toBe('lee')
    expect(bankExposure(table, 0, 6).exposure).toBe('side wind')
    expect(bankExposure(table, 90, 4).exposure).toBe('windward')
    const strong = bankExposure(table, 90, 12)
    expect(strong.exposure).toBe('rough')
    expect(strong.waveHeightM).toBeGreaterThanOrEqual(0.3)
  })
})

describe('a bank tapped in either order faces the same water', () => {
  const center: Position = [-90, 45]
  const round = circleLake(center, 2000)
  const islandAt: Position = [-90.05, 45.025]
  const withIsland: Polygon = {
    type: 'Polygon',
    coordinates: [densified(box(-90.1, 45, 0.1, 0.05)), circleLake(islandAt, 400).coordinates[0]!],
  }
  const onCircle = (c: Position, r: number, azimuths: number[]) =>
    azimuths.map((az) => destination(c, az, r))
  const gap = (a: number, b: number) => Math.abs(((((a - b) % 360) + 540) % 360) - 180)

  // A circle's normal runs through its centre (from memory): a lake's round shore looks in at the
  // centre, an island's looks out from it; a straight shore looks square off it.
  it.each<[string, Polygon, Position[], number]>([
    [
      'a curved shore, east side of a round lake',
      round,
      onCircle(center, 2000, [75, 85, 105]),
      270,
    ],
    ['a curved shore, south side of a round lake', round, onCircle(center, 2000, [170, 200]), 5],
    [
      'a straight west shore',
      withIsland,
      [
        [-90.1, 45.01],
        [-90.1, 45.012],
        [-90.1, 45.02],
      ],
      90,
    ],
    [
      'a straight north shore',
      withIsland,
      [
        [-90.07, 45.05],
        [-90.06, 45.05],
      ],
      180,
    ],
    ['the south side of an island', withIsland, onCircle(islandAt, 400, [165, 180, 195]), 180],
    ['the east side of an island', withIsland, onCircle(islandAt, 400, [80, 100]), 90],
  ])('on %s (geometry, from memory)', (_where, lake, points, expected) => {
    const orders = [points, [...points].reverse(), [...points.slice(1), points[0]!]]
    const facings = orders.map((p) => bankFacing(lake, p))
    for (const facing of facings) {
      expect(gap(facing, expected), `${facing}° vs ${expected}°`).toBeLessThan(1)
      expect(gap(facing, facings[0]!)).toBeLessThan(0.01)
    }
  })

  it('reads windward or lee alike for both orders of a bank on an island (geometry, from memory)', () => {
    const points = onCircle(islandAt, 400, [170, 190])
    const there = exposureTable(withIsland, points)
    const back = exposureTable(withIsland, [...points].reverse())
    expect(back.facingDeg).toBeCloseTo(there.facingDeg, 6)
    // A north wind blows off the island's south shore; a south wind onto it.
    expect(bankExposure(there, 0, 6).exposure).toBe('lee')
    expect(bankExposure(back, 0, 6).exposure).toBe('lee')
    expect(there.version).toBe(EXPOSURE_TABLE_VERSION)
  })

  it('feels a wind blowing straight onto the point of an island: fetch measured from the water, not the island (geometry, from memory)', () => {
    // The middle of the line between the two picks lies 6 m inside the island.
    const table = exposureTable(withIsland, onCircle(islandAt, 400, [170, 190]))
    const south = bankExposure(table, 180, 6)
    // About 2.4 km of water lies between the island's south point and the lake's south shore.
    expect(table.rows.find((r) => r.windFromDeg === 180)!.fetchM).toBeGreaterThan(2_300)
    expect(south.exposure).toBe('windward')
  })
})
