import { describe, expect, it } from 'vitest'
import { bankStretch, MAX_BANK_ALONG_SHORE_M } from '../../../shared/conditions/bank-stretch'
import { exposureTable } from '../../../shared/conditions/exposure'
import { DomainError } from '../../../shared/errors'
import type { Polygon, Position } from '../../../shared/geo/types'
import { box, circleLake, densified, destination, distanceM } from '../geo/fixtures'

// About 7.9 km by 5.5 km, with a round island 400 m across the middle (2.5 km round).
const islandAt: Position = [-90.05, 45.025]
const lake: Polygon = {
  type: 'Polygon',
  coordinates: [densified(box(-90.1, 45, 0.1, 0.05)), circleLake(islandAt, 400).coordinates[0]!],
}
const onIsland = (az: number) => destination(islandAt, az, 400)

function refusal(points: Position[]): DomainError {
  try {
    bankStretch(lake, points)
  } catch (err) {
    if (err instanceof DomainError) return err
    throw err
  }
  throw new Error('the bank was taken')
}

describe('a bank lies along one stretch of one shore', () => {
  it('measures the stretch along the shore, whatever order the points came in (GeographicLib distances)', () => {
    const points: Position[] = [
      [-90.1, 45.01],
      [-90.1, 45.015],
      [-90.1, 45.005],
    ]
    const alongMeridian = distanceM(points[2]!, points[1]!)
    for (const order of [points, [...points].reverse()]) {
      const stretch = bankStretch(lake, order)
      expect(stretch.island).toBe(false)
      expect(Math.abs(stretch.lengthM / alongMeridian - 1)).toBeLessThan(0.005)
    }
  })

  it('takes a bank round the end of an island, across where its ring starts (geometry, from memory)', () => {
    // 60° of a 400 m circle is 419 m of shore, whichever way round the ring is numbered.
    const stretch = bankStretch(lake, [onIsland(330), onIsland(30), onIsland(0)])
    expect(stretch.island).toBe(true)
    expect(stretch.lengthM).toBeCloseTo((400 * Math.PI) / 3, 0)
  })

  it('refuses a stray tap on an island beside two on the main shore, and says what to do', () => {
    const err = refusal([[-90.1, 45.02], onIsland(270), [-90.1, 45.025]])
    expect(err.field).toBe('points')
    expect(err.message).toMatch(/same stretch of shore; point 2 jumps to an island/)
    expect(err.message).toMatch(/Pick points along one shore, within 1.5 km/)
  })

  it('refuses a tap on the main shore among points on an island', () => {
    const err = refusal([onIsland(80), onIsland(100), [-90.0, 45.025]])
    expect(err.message).toMatch(/point 3 jumps off the island to another shore/)
  })

  it(`refuses a bank longer than ${MAX_BANK_ALONG_SHORE_M / 1000} km along the shore (common practice)`, () => {
    // Round the south-west corner: 2.2 km along the shore for 1.6 km as the crow flies.
    const err = refusal([
      [-90.1, 45.01],
      [-90.086, 45],
    ])
    expect(err.field).toBe('points')
    expect(err.message).toMatch(/these run 2.2 km along it/)
    // Just inside the limit, the same corner is a bank.
    expect(
      bankStretch(lake, [
        [-90.1, 45.005],
        [-90.09, 45],
      ]).lengthM,
    ).toBeLessThan(MAX_BANK_ALONG_SHORE_M)
  })

  it('refuses a point off the shore and two picks on one spot', () => {
    expect(
      refusal([
        [-90.1, 45.01],
        [-90.09, 45.01],
      ]).message,
    ).toMatch(/Point 2 is not on the shore/)
    expect(
      refusal([
        [-90.1, 45.01],
        [-90.1, 45.01],
      ]).message,
    ).toMatch(/at least 1 m long/)
  })

  it('is what the exposure table is made from: an impossible bank gets no table', () => {
    expect(() => exposureTable(lake, [[-90.1, 45.02], onIsland(270)])).toThrow(/jumps to an island/)
  })
})
