export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const mid = s.length >> 1
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

/**
 * Theil-Sen line (Sen 1968, JASA 63:1379): the median of pairwise slopes and the median intercept,
 * which shrug off outliers and use real times, so gaps do no harm. Null with fewer than two times.
 */
export function theilSen(
  points: { t: number; y: number }[],
): { slope: number; intercept: number } | null {
  const slopes: number[] = []
  for (let i = 0; i < points.length; i++) {
    for (let j = i + 1; j < points.length; j++) {
      const dt = points[j]!.t - points[i]!.t
      if (Math.abs(dt) > 1e-9) slopes.push((points[j]!.y - points[i]!.y) / dt)
    }
  }
  if (!slopes.length) return null
  const slope = median(slopes) || 0 // never -0
  return { slope, intercept: median(points.map((p) => p.y - slope * p.t)) }
}
