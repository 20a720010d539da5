import { assertFinite } from '../errors'

const G = 9.80665

export interface WaveGrowth {
  /** Spectral significant wave height Hm0, metres. */
  heightM: number
  /** Peak period, seconds. */
  periodS: number
  limitedBy: 'fetch' | 'duration' | 'fully-developed'
}

/**
 * Fetch-limited wind-wave growth: USACE Coastal Engineering Manual EM 1110-2-1100, Part II, Ch. 2,
 * eqs. II-2-36 (growth), II-2-37 (fully developed caps) and II-2-38 (duration limit).
 */
export function waveGrowth(windSpeedMs: number, fetchM: number, durationH?: number): WaveGrowth {
  assertFinite(windSpeedMs, 'windSpeedMs', { min: 0 })
  assertFinite(fetchM, 'fetchM', { min: 0 })
  if (durationH !== undefined) assertFinite(durationH, 'durationH', { min: 0 })
  if (windSpeedMs === 0 || fetchM === 0 || durationH === 0) {
    return { heightM: 0, periodS: 0, limitedBy: 'fetch' }
  }
  // CEM II-2-35: drag coefficient and friction velocity from the 10 m wind.
  const cd = 0.001 * (1.1 + 0.035 * windSpeedMs)
  const uStar2 = cd * windSpeedMs ** 2
  const uStar = Math.sqrt(uStar2)
  let xHat = (G * fetchM) / uStar2
  let limitedBy: WaveGrowth['limitedBy'] = 'fetch'
  if (durationH !== undefined) {
    // II-2-38: the fetch a wind of this duration can act over.
    const xDuration = 5.23e-3 * ((G * durationH * 3600) / uStar) ** 1.5
    if (xDuration < xHat) {
      xHat = xDuration
      limitedBy = 'duration'
    }
  }
  // Height and period reach their fully developed caps at different fetches.
  const hHat = Math.min(4.13e-2 * Math.sqrt(xHat), 211.5)
  const tHat = Math.min(0.651 * Math.cbrt(xHat), 239.8)
  if (hHat === 211.5) limitedBy = 'fully-developed'
  return { heightM: (hHat * uStar2) / G, periodS: (tHat * uStar) / G, limitedBy }
}
