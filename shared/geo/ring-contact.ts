import type { Xy } from './projection'

/** Where two rings, or two parts of one ring, meet: ring and segment numbers (from 0). */
export interface RingContact {
  ring: number
  segment: number
  otherRing: number
  otherSegment: number
}

interface Segment {
  /** The lower end in sweep order (x, then y), and the upper. */
  l: Xy
  r: Xy
  ring: number
  i: number
  /** Segments in the ring. */
  n: number
}

const cross = (p: Xy, q: Xy, r: Xy) => (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0])
const orient = (p: Xy, q: Xy, r: Xy) => Math.sign(cross(p, q, r))
const within = (p: Xy, q: Xy, r: Xy) =>
  Math.min(p[0], r[0]) <= q[0] &&
  q[0] <= Math.max(p[0], r[0]) &&
  Math.min(p[1], r[1]) <= q[1] &&
  q[1] <= Math.max(p[1], r[1])

/** Whether two segments meet at all: crossing, touching, or overlapping along a line. */
export function segmentsMeet(a: Xy, b: Xy, c: Xy, d: Xy): boolean {
  const o1 = orient(a, b, c)
  const o2 = orient(a, b, d)
  const o3 = orient(c, d, a)
  const o4 = orient(c, d, b)
  if (o1 !== o2 && o3 !== o4) return true
  return (
    (o1 === 0 && within(a, c, b)) ||
    (o2 === 0 && within(a, d, b)) ||
    (o3 === 0 && within(c, a, d)) ||
    (o4 === 0 && within(c, b, d))
  )
}

const before = (p: Xy, q: Xy) => p[0] < q[0] || (p[0] === q[0] && p[1] < q[1])
const neighbours = (s: Segment, t: Segment) =>
  s.ring === t.ring && (Math.abs(s.i - t.i) === 1 || Math.abs(s.i - t.i) === s.n - 1)
const contact = (s: Segment, t: Segment): RingContact =>
  s.ring < t.ring || (s.ring === t.ring && s.i < t.i)
    ? { ring: s.ring, segment: s.i, otherRing: t.ring, otherSegment: t.i }
    : { ring: t.ring, segment: t.i, otherRing: s.ring, otherSegment: s.i }

/** The sweep line's status: segments in order from below to above, as a skip list. */
interface Node {
  seg: Segment | null
  next: (Node | null)[]
  prev: (Node | null)[]
}
const LEVELS = 24

/**
 * The first contact found between segments of closed rings (each ring's last position repeats its
 * first), other than the shared vertex of a ring's consecutive segments; null when there is none.
 * A sweep line in the manner of Shamos and Hoffman (1976), "Geometric intersection problems": the
 * segments the sweep crosses are kept in order, and only segments that become neighbours in that
 * order are tested, so the cost is O(n log n) however the segments' boxes overlap. Repeated vertices
 * and a ring doubling back on itself are found first, which leaves the sweep one kind of allowed
 * contact: the vertex two consecutive segments share.
 */
export function firstRingContact(rings: Xy[][]): RingContact | null {
  const segments: Segment[] = []
  const seen = new Map<string, { ring: number; i: number }>()
  for (const [ring, points] of rings.entries()) {
    const n = points.length - 1
    for (let i = 0; i < n; i++) {
      const key = `${points[i]![0]},${points[i]![1]}`
      const other = seen.get(key)
      // A vertex twice: the ring touches itself there, or two rings touch.
      if (other)
        return {
          ring: other.ring,
          segment: other.i,
          otherRing: ring,
          otherSegment: (i + n - 1) % n,
        }
      seen.set(key, { ring, i })
    }
    for (let i = 0; i < n; i++) {
      const a = points[i]!
      const b = points[i + 1]!
      const c = points[(i + 2) % n]!
      // Back along the same line: the next segment overlaps this one.
      if (
        n > 2 &&
        cross(a, b, c) === 0 &&
        (c[0] - b[0]) * (a[0] - b[0]) + (c[1] - b[1]) * (a[1] - b[1]) > 0
      )
        return { ring, segment: i, otherRing: ring, otherSegment: (i + 1) % n }
      segments.push(before(a, b) ? { l: a, r: b, ring, i, n } : { l: b, r: a, ring, i, n })
    }
  }

  // Events: each segment's lower end (enter) and upper end (leave); at one point, leaves first.
  const events = new Int32Array(segments.length * 2)
  for (let k = 0; k < segments.length; k++) {
    events[2 * k] = 2 * k + 1 // enter
    events[2 * k + 1] = 2 * k // leave
  }
  const at = (e: number) => (e & 1 ? segments[e >> 1]!.l : segments[e >> 1]!.r)
  events.sort((e, f) => {
    const p = at(e)
    const q = at(f)
    return p[0] - q[0] || p[1] - q[1] || (e & 1) - (f & 1)
  })

  const head: Node = { seg: null, next: Array(LEVELS).fill(null), prev: [] }
  const nodes: (Node | undefined)[] = Array(segments.length)
  let seed = 0x2545f491
  const level = () => {
    let l = 1
    while (l < LEVELS) {
      seed ^= seed << 13
      seed ^= seed >>> 17
      seed ^= seed << 5
      if (seed & 3) break
      l++
    }
    return l
  }
  /** Whether segment s, entering at its lower end, lies above t where the sweep now is. */
  const above = (s: Segment, t: Segment) => {
    const o = orient(t.l, t.r, s.l)
    if (o !== 0) return o > 0
    const d = orient(t.l, t.r, s.r)
    return d !== 0 ? d > 0 : s.ring !== t.ring ? s.ring > t.ring : s.i > t.i
  }
  const check = (s: Segment | null | undefined, t: Segment | null | undefined) =>
    s && t && !neighbours(s, t) && segmentsMeet(s.l, s.r, t.l, t.r) ? contact(s, t) : null

  for (const e of events) {
    const k = e >> 1
    const s = segments[k]!
    if (e & 1) {
      const update: Node[] = Array(LEVELS)
      let x = head
      for (let lvl = LEVELS - 1; lvl >= 0; lvl--) {
        let next = x.next[lvl]
        while (next && above(s, next.seg!)) {
          x = next
          next = x.next[lvl]
        }
        update[lvl] = x
      }
      const height = level()
      const node: Node = { seg: s, next: Array(height), prev: Array(height) }
      for (let lvl = 0; lvl < height; lvl++) {
        const p = update[lvl]!
        node.next[lvl] = p.next[lvl]!
        node.prev[lvl] = p
        const n = p.next[lvl]
        if (n) n.prev[lvl] = node
        p.next[lvl] = node
      }
      nodes[k] = node
      const found = check(s, node.prev[0]?.seg) ?? check(s, node.next[0]?.seg)
      if (found) return found
    } else {
      const node = nodes[k]!
      for (let lvl = 0; lvl < node.next.length; lvl++) {
        const p = node.prev[lvl]!
        const n = node.next[lvl]
        p.next[lvl] = n ?? null
        if (n) n.prev[lvl] = p
      }
      const found = check(node.prev[0]!.seg, node.next[0]?.seg)
      if (found) return found
    }
  }
  return null
}
