import { DEFAULT_SETTINGS } from '../../shared/format'
import type { Settings } from '../../shared/schemas/settings'

/** Metric units and a 24-hour clock: the other way round from the defaults (°F, ft, mph, 12 h). */
export const METRIC: Settings = {
  temperature: 'C',
  length: 'm',
  speed: 'kmh',
  clock: '24h',
  homeLakeSlug: null,
}
export const IMPERIAL: Settings = DEFAULT_SETTINGS
