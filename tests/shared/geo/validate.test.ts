import { describe, expect, it } from 'vitest'
import { DomainError } from '../../../shared/errors'
import { SHORELINE_LIMITS, assertPlausibleShoreline } from '../../../shared/geo/validate'
import type { Polygon, Position } from '../../../shared/geo/types'
import { DEMO_LAKES, demoShoreline } from '../../../server/db/seed/demo-lakes'
import { box, densified, diagonalStrips } from './fixtures'

const poly = (...rings: Position[][]): Polygon => ({ type: 'Polygon', coordinates: rings })
const closed = (ring: Position[]) => [...ring, ring[0]!]
const message = (lake: Polygon) => {
  try {
    assertPlausibleShoreline(lake)
    return 'accepted'
  } catch (err) {
    expect(err).toBeInstanceOf(DomainError)
    return (err as Error).message
  }
}

describe('assertPlausibleShoreline', () => {
  it('accepts every demo lake, islands and all', () => {
    for (const shape of DEMO_LAKES) {
      const stats = assertPlausibleShoreline(demoShoreline(shape))
      expect(stats.islands).toBeGreaterThanOrEqual(1)
      expect(stats.areaKm2).toBeGreaterThan(5)
    }
  })

  it('refuses a ring that crosses itself (a bow tie)', () => {
    const bowTie = closed([
      [-88.1, 35],
      [-88.0, 35.05],
      [-88.0, 35],
      [-88.1, 35.05],
    ])
    expect(message(poly(bowTie))).toMatch(/crosses or touches itself/)
  })

  it('refuses an island outside its shoreline, and rings that cross', () => {
    const shore = densified(box(-88.1, 35, 0.1, 0.05))
    const outside = densified(box(-87.9, 35.01, 0.01, 0.01)).reverse()
    expect(message(poly(shore, outside))).toMatch(/outside its shoreline/)
    const straddling = densified(box(-88.005, 35.01, 0.01, 0.01)).reverse()
    expect(message(poly(shore, straddling))).toMatch(/cross or touch/)
  })

  it('refuses open rings, positions off the globe, and sizes no lake has', () => {
    const shore = densified(box(-88.1, 35, 0.1, 0.05))
    expect(message(poly(shore.slice(0, -1)))).toMatch(/open/)
    expect(message(poly(shore.map(([lon, lat]) => [lon, lat + 60] as Position)))).toMatch(/WGS84/)
    expect(message(poly(densified(box(-88.1, 35, 0.0001, 0.0001))))).toMatch(/km²/)
    expect(message(poly(densified(box(-100, 30, 20, 10))))).toMatch(/km from its centre/)
  })

  it('checks 50,000 vertices of thin diagonal strips, every edge box overlapping the rest, in under 2 s', () => {
    const lake = diagonalStrips(SHORELINE_LIMITS.maxVertices)
    const start = performance.now()
    expect(assertPlausibleShoreline(lake).vertices).toBe(SHORELINE_LIMITS.maxVertices)
    expect(performance.now() - start).toBeLessThan(2000)
    // One vertex nudged across the next strip still gets caught.
    const ring = lake.coordinates[0]!
    const [lon, lat] = ring[20_001]!
    const crossed = ring.map((p, i) => (i === 20_001 ? ([lon + 0.001, lat] as Position) : p))
    expect(message(poly(crossed))).toMatch(/crosses or touches itself/)
  })

  it('refuses more vertices than the cap before any geometry', () => {
    expect(message(diagonalStrips(SHORELINE_LIMITS.maxVertices + 4))).toMatch(/simplify it/)
  })
})
