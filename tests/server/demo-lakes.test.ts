import { describe, expect, it } from 'vitest'
import { inWaterXy, lakeAreaM2, lakeProjection } from '../../shared/geo/polygon'
import type { Position } from '../../shared/geo/types'
import { DEMO_LAKES, demoShoreline } from '../../server/db/seed/demo-lakes'

type Seg = [Position, Position]

function properlyCross([a, b]: Seg, [c, d]: Seg): boolean {
  const orient = (p: Position, q: Position, r: Position) =>
    Math.sign((q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]))
  return orient(a, b, c) * orient(a, b, d) < 0 && orient(c, d, a) * orient(c, d, b) < 0
}

describe.each(DEMO_LAKES.map((shape) => [shape.name, shape] as const))(
  'demo lake %s',
  (_name, shape) => {
    const lake = demoShoreline(shape)
    const [shore, ...islands] = lake.coordinates

    it('has a closed shoreline of 300+ vertices and at least one island', () => {
      expect(shore!.length).toBeGreaterThan(300)
      expect(shore![0]).toEqual(shore![shore!.length - 1])
      expect(islands.length).toBeGreaterThanOrEqual(1)
    })

    it('covers 5 to 40 km² of water', () => {
      const km2 = lakeAreaM2(lake) / 1e6
      expect(km2).toBeGreaterThan(5)
      expect(km2).toBeLessThan(40)
    })

    it('keeps every island inside the shoreline and the shoreline free of self-crossings', () => {
      const { project } = lakeProjection(lake)
      const shoreXy = [shore!.map(project)]
      for (const island of islands)
        for (const p of island) expect(inWaterXy(shoreXy, project(p))).toBe(true)
      const segs: Seg[] = shore!.slice(1).map((p, i) => [shore![i]!, p])
      let crossings = 0
      for (let i = 0; i < segs.length; i++) {
        for (let j = i + 2; j < segs.length; j++) if (properlyCross(segs[i]!, segs[j]!)) crossings++
      }
      expect(crossings).toBe(0)
    })
  },
)
