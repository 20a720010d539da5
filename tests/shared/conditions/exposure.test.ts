import { describe, expect, it } from 'vitest'
import {
  bankExposure,
  bankFacing,
  compassName,
  exposureTable,
  onshoreComponent,
} from '../../../shared/conditions/exposure'
import type { Polygon } from '../../../shared/geo/types'
import { box, densified } from '../geo/fixtures'

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
