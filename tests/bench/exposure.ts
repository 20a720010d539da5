import { performance } from 'node:perf_hooks'
import { bankFacing, COMPASS_16 } from '../../shared/conditions/exposure'
import { EFFECTIVE_FETCH_OFFSETS_DEG, shoreIndex } from '../../shared/geo/fetch'
import type { Position } from '../../shared/geo/types'
import { DEMO_LAKES, demoShoreline } from '../../server/db/seed/demo-lakes'

/**
 * Fetch and effective fetch for 1,000 banks x 16 directions on a 2,400-vertex lake with 10 islands,
 * through the R-tree, and each bank's facing from the shore; the baseline is the same radials
 * scanning every edge, timed in the same run. The target covers radials and facings together.
 */
const TARGET_MS = 1000
const shape = {
  ...DEMO_LAKES[0]!,
  islands: Array.from({ length: 10 }, (_, i) => ({
    atDeg: i * 36,
    distance: 0.3 + 0.4 * (i % 2),
    size: 0.06,
  })),
}
const lake = demoShoreline(shape, 2400)
const shore = lake.coordinates[0]!
const vertices = lake.coordinates.reduce((n, ring) => n + ring.length - 1, 0)
const banks: Position[] = Array.from(
  { length: 1000 },
  (_, i) => shore[Math.floor((i * (shore.length - 1)) / 1000)]!,
)
const radialsPerBank = COMPASS_16.length * (1 + EFFECTIVE_FETCH_OFFSETS_DEG.length)

const t0 = performance.now()
const index = shoreIndex(lake)
const buildMs = performance.now() - t0

const t1 = performance.now()
let checksum = 0
for (const bank of banks) {
  const radial = index.radialsFrom(bank)
  for (const dir of COMPASS_16) {
    checksum += radial(dir)
    for (const off of EFFECTIVE_FETCH_OFFSETS_DEG) checksum += radial(dir + off) / 9
  }
}
const indexedMs = performance.now() - t1
const radials = banks.length * radialsPerBank

// Each bank as a stretch of five shore vertices (about 100 m), picked in reverse every other time.
const t3 = performance.now()
for (let i = 0; i < banks.length; i++) {
  const at = Math.floor((i * (shore.length - 6)) / banks.length)
  const points = [shore[at]!, shore[at + 2]!, shore[at + 5]!]
  checksum += bankFacing(lake, i % 2 ? points.reverse() : points) / 360
}
const facingMs = performance.now() - t3
const tablesMs = indexedMs + facingMs

// Baseline: the naive first-hit scan for a tenth of the banks, scaled up.
const sample = banks.filter((_, i) => i % 10 === 0)
const t2 = performance.now()
for (const bank of sample) {
  const o = index.projection.project(bank)
  for (const dir of COMPASS_16) {
    for (const off of [0, ...EFFECTIVE_FETCH_OFFSETS_DEG])
      index.naiveFirstHit(o, index.projection.bearingVector(bank, dir + off))
  }
}
const naiveMs = ((performance.now() - t2) * banks.length) / sample.length

const rows = [
  ['lake vertices', vertices],
  ['islands', lake.coordinates.length - 1],
  ['banks x directions', `${banks.length} x ${COMPASS_16.length}`],
  ['radials', radials],
  ['index build (ms)', buildMs.toFixed(1)],
  ['R-tree fetch + effective fetch (ms)', indexedMs.toFixed(0)],
  ['bank facing from the shore (ms)', facingMs.toFixed(1)],
  ['exposure tables in all (ms)', tablesMs.toFixed(0)],
  ['naive edge scan, same radials (ms, est.)', naiveMs.toFixed(0)],
  ['naive / R-tree', (naiveMs / indexedMs).toFixed(1)],
  ['target (ms)', `< ${TARGET_MS}`],
]
console.table(Object.fromEntries(rows))
console.log(
  JSON.stringify({
    bench: 'exposure',
    vertices,
    islands: lake.coordinates.length - 1,
    banks: banks.length,
    directions: COMPASS_16.length,
    radials,
    indexedMs: Math.round(indexedMs),
    facingMs: Math.round(facingMs),
    tablesMs: Math.round(tablesMs),
    naiveMs: Math.round(naiveMs),
    ratioNaiveToIndexed: Number((naiveMs / indexedMs).toFixed(2)),
    targetMs: TARGET_MS,
    pass: tablesMs < TARGET_MS,
    checksum: Math.round(checksum),
  }),
)
