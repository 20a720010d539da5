import { describe, expect, it } from 'vitest'
import { ringAreaXy, rewound } from '../../../shared/geo/polygon'
import type { Polygon } from '../../../shared/geo/types'

const square = (x: number, y: number, s: number): [number, number][] => [
  [x, y],
  [x + s, y],
  [x + s, y + s],
  [x, y + s],
  [x, y],
]

describe('rewound', () => {
  // Orientation by the sign of the shoelace area (positive is counter-clockwise), geometry.
  const lake: Polygon = { type: 'Polygon', coordinates: [square(0, 0, 1), square(0.4, 0.4, 0.2)] }
  const sign = (p: Polygon) => p.coordinates.map((r) => Math.sign(ringAreaXy(r)))

  it('winds shorelines counter-clockwise and islands clockwise, as RFC 7946 asks', () => {
    expect(sign(rewound(lake) as Polygon)).toEqual([1, -1])
  })

  it('winds them the other way for spherical renderers', () => {
    expect(sign(rewound(lake, true) as Polygon)).toEqual([-1, 1])
  })
})
