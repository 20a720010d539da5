import { DomainError } from '../errors'
import { shoreIndex, type ShorePlace } from '../geo/fetch'
import type { Xy } from '../geo/projection'
import type { LakeGeometry, Position } from '../geo/types'

/** A picked point this close to the shore counts as on it (and the server moves it onto it). */
export const SHORE_SNAP_M = 40

/**
 * The longest bank, measured along the shore: about a mile, what an angler works on foot or on
 * the trolling motor in one go (common practice). Longer, and one facing no longer describes it.
 */
export const MAX_BANK_ALONG_SHORE_M = 1500

/** The stretch of one ring of the shore that a bank's points cover. */
export interface BankStretch {
  ring: number
  island: boolean
  /** Where the stretch starts, metres along its ring in the ring's water-on-the-left direction. */
  fromM: number
  lengthM: number
  /** Its two ends on the lake's plane, in that direction: the water lies left of start -> end. */
  start: Xy
  end: Xy
}

const PICK_AGAIN = `Pick points along one shore, within ${MAX_BANK_ALONG_SHORE_M / 1000} km.`

function jumped(island: boolean, strayIsland: boolean): string {
  if (strayIsland) return island ? 'to another island' : 'to an island'
  return island ? 'off the island to another shore' : 'to another shore'
}

/** The ring most of the points lie on; the first point's ring when that is a tie. */
function mainRing(places: ShorePlace[]): number {
  const counts = new Map<number, number>()
  for (const p of places) counts.set(p.ring, (counts.get(p.ring) ?? 0) + 1)
  let best = places[0]!.ring
  for (const [ring, n] of counts) if (n > counts.get(best)!) best = ring
  return best
}

/**
 * The one continuous stretch of shore a bank's points lie along, whatever order they were picked
 * in: every point on the same ring (shoreline or island), and the shortest run of that ring that
 * covers them all at most `MAX_BANK_ALONG_SHORE_M` long. Throws a DomainError on `points` that
 * says what to pick instead.
 */
export function bankStretch(lake: LakeGeometry, points: Position[]): BankStretch {
  if (points.length < 2)
    throw new DomainError('invalid_geometry', 'A bank needs at least two points.', 'points')
  const index = shoreIndex(lake)
  const places = points.map((p, i) => {
    const place = index.locate(p, SHORE_SNAP_M)
    if (!place)
      throw new DomainError(
        'invalid_geometry',
        `Point ${i + 1} is not on the shore. Pick points along the shoreline.`,
        'points',
      )
    return place
  })
  const ring = mainRing(places)
  const island = index.ringIsIsland[ring]!
  const stray = places.findIndex((p) => p.ring !== ring)
  if (stray >= 0) {
    const where = jumped(island, index.ringIsIsland[places[stray]!.ring]!)
    throw new DomainError(
      'invalid_geometry',
      `All points of a bank must be on the same stretch of shore; point ${stray + 1} jumps ${where}. ${PICK_AGAIN}`,
      'points',
    )
  }
  // On the ring's circle, the stretch covering every point is all of it but the widest gap.
  const ringM = index.ringLengthM[ring]!
  const along = places.map((p) => p.alongM).sort((a, b) => a - b)
  let gap = along[0]! + ringM - along[along.length - 1]!
  let fromM = along[0]!
  for (let i = 1; i < along.length; i++) {
    if (along[i]! - along[i - 1]! > gap) {
      gap = along[i]! - along[i - 1]!
      fromM = along[i]!
    }
  }
  const lengthM = ringM - gap
  if (lengthM > MAX_BANK_ALONG_SHORE_M)
    throw new DomainError(
      'invalid_geometry',
      `All points of a bank must be on the same stretch of shore; these run ${(lengthM / 1000).toFixed(1)} km along it. ${PICK_AGAIN}`,
      'points',
    )
  if (lengthM < 1)
    throw new DomainError('invalid_geometry', 'A bank must be at least 1 m long.', 'points')
  return {
    ring,
    island,
    fromM,
    lengthM,
    start: index.pointAlong(ring, fromM),
    end: index.pointAlong(ring, fromM + lengthM),
  }
}
