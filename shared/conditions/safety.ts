import { assertFinite } from '../errors'
import { cToF, msToKmh, msToKnots, mToFt } from '../units'
import { heatIndexC, windChillC } from './weather'

export type CautionLevel = 'info' | 'caution' | 'warning' | 'danger'

export interface Caution {
  kind: 'wind' | 'waves' | 'lightning' | 'cold-water' | 'heat' | 'wind-chill' | 'authority'
  level: CautionLevel
  message: string
  /** A published source, or "common practice" / "from memory". */
  source: string
}

export interface CautionInput {
  windMs: number
  gustMs?: number
  /** The highest significant wave height expected where the boat will run. */
  waveHeightM?: number
  thunderstormProbabilityPct?: number
  waterC?: number
  airC?: number
  relativeHumidityPct?: number
}

interface CautionRule {
  applies: (c: Required<Pick<CautionInput, 'windMs'>> & CautionInput) => CautionLevel | null
  kind: Caution['kind']
  message: (c: CautionInput) => string
  source: string
}

// Cautions are worked out once per lake for every angler, so they name both unit systems.
const windText = (ms: number) => `${Math.round(msToKnots(ms))} kt (${Math.round(msToKmh(ms))} km/h)`
const waveText = (m: number) => `${mToFt(m).toFixed(1)} ft (${m.toFixed(1)} m)`
const tempText = (c: number) => `${Math.round(cToF(c))} °F (${Math.round(c)} °C)`

/** Each caution is a row: when it applies, at what level, what it says and where that comes from. */
export const CAUTION_RULES: CautionRule[] = [
  {
    kind: 'wind',
    applies: (c) => {
      const gust = Math.max(c.gustMs ?? 0, c.windMs)
      if (gust >= 34 * 0.5144) return 'danger'
      if (gust >= 22 * 0.5144) return 'warning'
      return c.windMs >= 7 ? 'caution' : null
    },
    message: (c) =>
      `Wind ${windText(c.windMs)}, gusts ${windText(Math.max(c.gustMs ?? 0, c.windMs))}. Small craft advisories on the Great Lakes start at 22 kt and gales at 34 kt; small bass boats are at risk well below that. Stay near sheltered water.`,
    source: 'NWS marine hazard criteria (upper Great Lakes); 7 m/s caution is common practice',
  },
  {
    kind: 'waves',
    applies: (c) => {
      const h = c.waveHeightM ?? 0
      if (h >= 1.2) return 'danger'
      if (h >= 0.6) return 'warning'
      return h >= 0.3 ? 'caution' : null
    },
    message: (c) =>
      `Waves to ${waveText(c.waveHeightM ?? 0)} on exposed water. Quarter into the chop, slow down, and keep to the lee shore on long runs.`,
    source: 'NWS small craft advisory at 4 ft waves; 1 and 2 ft cautions are common practice',
  },
  {
    kind: 'lightning',
    applies: (c) => {
      const p = c.thunderstormProbabilityPct ?? 0
      if (p >= 50) return 'danger'
      return p >= 20 ? 'warning' : null
    },
    message: (c) =>
      `Thunderstorms possible (${Math.round(c.thunderstormProbabilityPct ?? 0)} %). When thunder roars, go indoors: get off the water and to shelter, and wait 30 minutes after the last thunder.`,
    source: 'NWS lightning safety',
  },
  {
    kind: 'cold-water',
    applies: (c) => {
      if (c.waterC === undefined) return null
      if (c.waterC < 10) return 'warning'
      return cToF(c.waterC) < 70 ? 'caution' : null
    },
    message: (c) =>
      `Water ${tempText(c.waterC ?? 0)}: a fall brings cold shock (1-10-1: about 1 minute to control breathing, 10 of useful movement, an hour before unconsciousness). Wear the life jacket and clip on the kill-switch lanyard.`,
    source: '1-10-1 principle; 70 °F threshold from memory',
  },
  {
    kind: 'heat',
    applies: (c) => {
      if (c.airC === undefined || c.relativeHumidityPct === undefined) return null
      const hi = cToF(heatIndexC(c.airC, c.relativeHumidityPct))
      if (hi >= 103) return 'danger'
      if (hi >= 90) return 'warning'
      return hi >= 80 ? 'caution' : null
    },
    message: (c) =>
      `Heat index ${tempText(heatIndexC(c.airC ?? 0, c.relativeHumidityPct ?? 0))}. Drink water before you are thirsty, cover up, and rest in shade.`,
    source: 'NWS heat index risk bands',
  },
  {
    kind: 'wind-chill',
    applies: (c) => {
      if (c.airC === undefined) return null
      const wc = windChillC(c.airC, c.windMs)
      if (wc === null) return null
      if (wc <= -28) return 'danger'
      return wc <= -10 ? 'warning' : wc <= 0 ? 'caution' : null
    },
    message: (c) =>
      `Wind chill ${tempText(windChillC(c.airC ?? 0, c.windMs) ?? 0)}, colder still at running speed. Cover skin; frostbite comes fast below -28 °C wind chill.`,
    source: 'NWS wind chill (2001); -28 °C frostbite threshold from memory',
  },
]

export const AUTHORITY_CAUTION: Caution = {
  kind: 'authority',
  level: 'info',
  message:
    'These cautions are a guide only. Follow local authorities, marine and weather warnings, and boating law; wear a life jacket and use the kill-switch lanyard.',
  source: 'common practice',
}

const RANK: Record<CautionLevel, number> = { danger: 0, warning: 1, caution: 2, info: 3 }

/** Cautions for the conditions, most serious first, always ending with the deferral to local authority. */
export function cautions(conditions: CautionInput): Caution[] {
  assertFinite(conditions.windMs, 'windMs', { min: 0 })
  for (const key of [
    'gustMs',
    'waveHeightM',
    'thunderstormProbabilityPct',
    'waterC',
    'airC',
    'relativeHumidityPct',
  ] as const) {
    const v = conditions[key]
    if (v !== undefined) assertFinite(v, key)
  }
  const found: Caution[] = []
  for (const rule of CAUTION_RULES) {
    const level = rule.applies(conditions)
    if (level)
      found.push({ kind: rule.kind, level, message: rule.message(conditions), source: rule.source })
  }
  found.sort((a, b) => RANK[a.level] - RANK[b.level])
  return [...found, AUTHORITY_CAUTION]
}

/**
 * The cautions of several windows as one list for the day: each message once, most serious first,
 * ending with the deferral to local authority.
 */
export function mergeCautions(lists: Caution[][]): Caution[] {
  const byMessage = new Map<string, Caution>()
  for (const list of lists)
    for (const c of list) if (c.kind !== 'authority') byMessage.set(c.message, c)
  return [
    ...[...byMessage.values()].sort((a, b) => RANK[a.level] - RANK[b.level]),
    AUTHORITY_CAUTION,
  ]
}
