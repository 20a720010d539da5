import { performance } from 'node:perf_hooks'
import Flatbush from 'flatbush'
import { lakeProjection, polygonsOf } from '../../shared/geo/polygon'
import type { Xy } from '../../shared/geo/projection'
import { firstRingContact, segmentsMeet } from '../../shared/geo/ring-contact'
import { SHORELINE_LIMITS } from '../../shared/geo/validate'
import { outlineChecker } from '../../server/features/desk/outline-check'
import { diagonalStrips } from '../shared/geo/fixtures'

/**
 * The ring-crossing check on the worst outline we know for a box index: thin diagonal strips, every
 * edge's box overlapping every other's, up to the vertex cap. The sweep line against the R-tree
 * search it replaced (each segment tested against every segment its box overlaps), both timed in
 * this run; then the whole upload check at the cap through its worker thread.
 */
const TARGET_MS = 1000
const SIZES = [4_000, 8_000, 16_000, SHORELINE_LIMITS.maxVertices]

/** The check as it was: an R-tree of segment boxes, each segment tested against every box it overlaps. */
function boxIndexContact(rings: Xy[][]): boolean {
  const segments: { a: Xy; b: Xy; ring: number; i: number; n: number }[] = []
  rings.forEach((ring, r) => {
    for (let i = 0; i < ring.length - 1; i++)
      segments.push({ a: ring[i]!, b: ring[i + 1]!, ring: r, i, n: ring.length - 1 })
  })
  const box = ({ a, b }: { a: Xy; b: Xy }) =>
    [
      Math.min(a[0], b[0]),
      Math.min(a[1], b[1]),
      Math.max(a[0], b[0]),
      Math.max(a[1], b[1]),
    ] as const
  const tree = new Flatbush(segments.length)
  for (const s of segments) tree.add(...box(s))
  tree.finish()
  for (const [k, s] of segments.entries())
    for (const h of tree.search(...box(s))) {
      if (h <= k) continue
      const t = segments[h]!
      const neighbours =
        t.ring === s.ring && (Math.abs(t.i - s.i) === 1 || Math.abs(t.i - s.i) === s.n - 1)
      if (!neighbours && segmentsMeet(s.a, s.b, t.a, t.b)) return true
    }
  return false
}

const rows: Record<string, string | number>[] = []
const results: { vertices: number; sweepMs: number; boxIndexMs: number }[] = []
for (const vertices of SIZES) {
  const lake = diagonalStrips(vertices)
  const { project } = lakeProjection(lake)
  const rings = polygonsOf(lake).flatMap((p) => p.map((ring) => ring.map(project)))
  const t0 = performance.now()
  const sweepFound = firstRingContact(rings) !== null
  const sweepMs = performance.now() - t0
  const t1 = performance.now()
  const boxFound = boxIndexContact(rings)
  const boxIndexMs = performance.now() - t1
  if (sweepFound || boxFound) throw new Error('the strips are a valid outline: nothing should meet')
  results.push({ vertices, sweepMs, boxIndexMs })
  rows.push({
    vertices,
    'sweep line (ms)': sweepMs.toFixed(0),
    'R-tree boxes, before (ms)': boxIndexMs.toFixed(0),
    'before / sweep': (boxIndexMs / sweepMs).toFixed(1),
  })
}
console.table(rows)

const check = outlineChecker({ timeLimitMs: 60_000 })
const text = JSON.stringify(diagonalStrips(SHORELINE_LIMITS.maxVertices))
const t2 = performance.now()
await check(text)
const workerMs = performance.now() - t2

const atCap = results.at(-1)!
console.table({
  'upload check at the cap, in its worker (ms)': workerMs.toFixed(0),
  'target, sweep at the cap (ms)': `< ${TARGET_MS}`,
})
console.log(
  JSON.stringify({
    bench: 'outline',
    shape: 'diagonal strips',
    vertices: atCap.vertices,
    sweepMs: Math.round(atCap.sweepMs),
    boxIndexMs: Math.round(atCap.boxIndexMs),
    ratioBoxIndexToSweep: Number((atCap.boxIndexMs / atCap.sweepMs).toFixed(1)),
    bySize: results.map((r) => ({
      vertices: r.vertices,
      sweepMs: Math.round(r.sweepMs),
      boxIndexMs: Math.round(r.boxIndexMs),
    })),
    workerCheckMs: Math.round(workerMs),
    targetMs: TARGET_MS,
    pass: atCap.sweepMs < TARGET_MS,
  }),
)
