import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { Xy } from '../../../shared/geo/projection'
import { firstRingContact, segmentsMeet } from '../../../shared/geo/ring-contact'

/** Every pair of segments against every other: the definition the sweep must agree with. */
function anyContactByPairs(rings: Xy[][]): boolean {
  const segs = rings.flatMap((ring, r) =>
    ring.slice(0, -1).map((a, i) => ({ a, b: ring[i + 1]!, r, i, n: ring.length - 1 })),
  )
  for (let k = 0; k < segs.length; k++)
    for (let h = k + 1; h < segs.length; h++) {
      const s = segs[k]!
      const t = segs[h]!
      if (!segmentsMeet(s.a, s.b, t.a, t.b)) continue
      const gap = Math.abs(s.i - t.i)
      if (s.r !== t.r || (gap !== 1 && gap !== s.n - 1)) return true
      // Consecutive segments may share their vertex, and nothing more.
      const shared = s.b[0] === t.a[0] && s.b[1] === t.a[1] ? s.b : t.b
      const [p, q] = shared === s.b ? [s.a, t.b] : [t.a, s.b]
      const back =
        (p[0] - shared[0]) * (q[1] - shared[1]) === (p[1] - shared[1]) * (q[0] - shared[0]) &&
        (p[0] - shared[0]) * (q[0] - shared[0]) + (p[1] - shared[1]) * (q[1] - shared[1]) > 0
      const zeroLength = (u: Xy, v: Xy) => u[0] === v[0] && u[1] === v[1]
      if (back || zeroLength(s.a, s.b) || zeroLength(t.a, t.b)) return true
    }
  return false
}

const closed = (ring: Xy[]) => [...ring, ring[0]!]

describe('firstRingContact', () => {
  it.each([
    [
      'a square',
      [
        closed([
          [0, 0],
          [4, 0],
          [4, 4],
          [0, 4],
        ]),
      ],
      false,
    ],
    [
      'a bow tie',
      [
        closed([
          [0, 0],
          [4, 4],
          [4, 0],
          [0, 4],
        ]),
      ],
      true,
    ],
    [
      'a vertex on another edge',
      [
        closed([
          [0, 0],
          [4, 0],
          [2, 2],
          [4, 4],
          [2, 0.0],
          [0, 4],
        ]),
      ],
      true,
    ],
    [
      'a ring doubling back on itself',
      [
        closed([
          [0, 0],
          [4, 0],
          [2, 0],
          [2, 3],
        ]),
      ],
      true,
    ],
    [
      'a vertical edge crossed',
      [
        closed([
          [0, 0],
          [4, 0],
          [4, 4],
          [2, 4],
          [2, -1],
          [0, 3],
        ]),
      ],
      true,
    ],
    [
      'an island inside',
      [
        closed([
          [0, 0],
          [9, 0],
          [9, 9],
          [0, 9],
        ]),
        closed([
          [3, 3],
          [3, 6],
          [6, 6],
          [6, 3],
        ]),
      ],
      false,
    ],
    [
      'an island touching the shore at a vertex',
      [
        closed([
          [0, 0],
          [9, 0],
          [9, 9],
          [0, 9],
        ]),
        closed([
          [0, 0],
          [3, 6],
          [6, 6],
          [6, 3],
        ]),
      ],
      true,
    ],
  ] as [string, Xy[][], boolean][])('%s: contact %s', (_, rings, contact) => {
    expect(firstRingContact(rings) !== null).toBe(contact)
  })

  it('agrees with testing every pair on small rings of grid points, where ties abound', () => {
    const ring = fc
      .array(fc.tuple(fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 6 })), {
        minLength: 4,
        maxLength: 9,
      })
      .map((points) => closed(points as Xy[]))
    fc.assert(
      fc.property(fc.array(ring, { minLength: 1, maxLength: 3 }), (rings) => {
        expect(firstRingContact(rings) !== null).toBe(anyContactByPairs(rings))
      }),
      { numRuns: 20_000 },
    )
  })

  it('agrees with testing every pair on simple rings (star polygons) and their islands', () => {
    const star = (cx: number, cy: number, radii: number[]): Xy[] =>
      closed(
        radii.map((r, i) => {
          const t = (2 * Math.PI * i) / radii.length
          return [Math.round(cx + r * Math.cos(t)), Math.round(cy + r * Math.sin(t))]
        }),
      )
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 5, max: 40 }), { minLength: 4, maxLength: 30 }),
        fc.array(fc.integer({ min: 1, max: 6 }), { minLength: 4, maxLength: 8 }),
        fc.integer({ min: -30, max: 30 }),
        (shore, island, dx) => {
          const rings = [star(0, 0, shore), star(dx, 0, island)]
          expect(firstRingContact(rings) !== null).toBe(anyContactByPairs(rings))
        },
      ),
      { numRuns: 5_000 },
    )
  })
})
