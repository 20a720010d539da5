import type { GeoProjection } from 'd3-geo'
import { computed, ref, type Ref } from 'vue'
import { shoreIndex } from '@shared/geo/fetch'
import { polygonsOf } from '@shared/geo/polygon'
import type { LakeGeometry, Position } from '@shared/geo/types'

/** A tap this many pixels from the shore still counts as on it. */
const TAP_PX = 18

/**
 * Picking points on a drawn outline: a tap is moved onto the nearest shore (within `TAP_PX`, or
 * `onMiss`); the keyboard walks a cursor along the shore's vertices (arrows, Shift for ten at a
 * time) and Enter or Space picks it. `size` is the SVG's viewBox side, `projection` draws it.
 */
export function useShorePicker(opts: {
  svg: Ref<SVGSVGElement | null>
  size: number
  shoreline: () => LakeGeometry
  projection: () => GeoProjection
  picking: () => boolean
  onPick: (point: Position) => void
  onMiss: () => void
}) {
  const index = computed(() => shoreIndex(opts.shoreline()))
  const vertices = computed(() =>
    polygonsOf(opts.shoreline()).flatMap((polygon) => polygon.flatMap((ring) => ring.slice(1))),
  )
  const cursor = ref(0)
  const metresPerPx = computed(() => {
    const projection = opts.projection()
    const a = projection.invert?.([opts.size / 2, opts.size / 2])
    const b = projection.invert?.([opts.size / 2 + 100, opts.size / 2])
    if (!a || !b) return 0
    const [ax, ay] = index.value.projection.project(a)
    const [bx, by] = index.value.projection.project(b)
    return Math.hypot(bx - ax, by - ay) / 100
  })

  function onTap(event: MouseEvent) {
    const svg = opts.svg.value
    if (!opts.picking() || !svg) return
    const box = svg.getBoundingClientRect()
    const scale = opts.size / box.width
    const at = opts
      .projection()
      .invert?.([(event.clientX - box.left) * scale, (event.clientY - box.top) * scale])
    const near = at && index.value.nearestShorePoint(at, TAP_PX * scale * metresPerPx.value)
    if (near) opts.onPick(near.point)
    else opts.onMiss()
  }

  function onKey(event: KeyboardEvent) {
    if (!opts.picking()) return
    const step = event.shiftKey ? 10 : 1
    const n = vertices.value.length
    if (['ArrowRight', 'ArrowUp'].includes(event.key)) cursor.value = (cursor.value + step) % n
    else if (['ArrowLeft', 'ArrowDown'].includes(event.key))
      cursor.value = (cursor.value - step + n) % n
    else if (event.key === 'Enter' || event.key === ' ') opts.onPick(vertices.value[cursor.value]!)
    else return
    event.preventDefault()
  }

  /** Where the keyboard's cursor is, in the SVG's coordinates. */
  const cursorXy = computed(() => opts.projection()(vertices.value[cursor.value]!))
  return { onTap, onKey, cursorXy }
}
