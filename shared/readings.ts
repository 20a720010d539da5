import { M_PER_FT } from './units'

export const PARAMETER_KEYS = [
  'water_temp',
  'gauge_height',
  'turbidity',
  'dissolved_oxygen',
  'secchi',
] as const
export type Parameter = (typeof PARAMETER_KEYS)[number]

/** What a lake gauge measures, with the agency parameter code used as its observed property. */
export const PARAMETERS: Record<
  Parameter,
  { code: string; name: string; siUnit: string; cadenceMin: number }
> = {
  water_temp: { code: '00010', name: 'Water temperature', siUnit: '°C', cadenceMin: 15 },
  gauge_height: { code: '00065', name: 'Gauge height', siUnit: 'm', cadenceMin: 15 },
  turbidity: { code: '63680', name: 'Turbidity', siUnit: 'FNU', cadenceMin: 15 },
  dissolved_oxygen: { code: '00300', name: 'Dissolved oxygen', siUnit: 'mg/L', cadenceMin: 15 },
  secchi: { code: 'secchi', name: 'Secchi depth', siUnit: 'm', cadenceMin: 1440 },
}

/** Our key (as stored in text columns) back to the parameter; undefined for anything else. */
export function parameterForKey(key: string): Parameter | undefined {
  return PARAMETER_KEYS.find((p) => p === key)
}

export function parameterForCode(code: string): Parameter | undefined {
  return PARAMETER_KEYS.find((p) => PARAMETERS[p].code === code)
}

/**
 * Plausibility, per parameter in SI units (our rules, documented here):
 * a range no real lake reading leaves, and the fastest believable change per hour.
 * Water: 0 to 40 °C, at most 3 °C an hour (surface sensors in summer storms move about 1 °C).
 * Gauge height: -10 to 100 m on the gauge's own datum, at most 0.5 m an hour (a 30 ft jump in
 * 15 minutes is a datum or sensor fault, not a flood). Turbidity: 0 to 4,000 FNU (sensor range),
 * at most 400 FNU an hour. Dissolved oxygen: 0 to 25 mg/L, at most 3 mg/L an hour.
 * Secchi: 0.05 to 40 m, at most 5 m a day.
 */
export const PLAUSIBLE: Record<Parameter, { min: number; max: number; maxChangePerHour: number }> =
  {
    water_temp: { min: 0, max: 40, maxChangePerHour: 3 },
    gauge_height: { min: -10, max: 100, maxChangePerHour: 0.5 },
    turbidity: { min: 0, max: 4000, maxChangePerHour: 400 },
    dissolved_oxygen: { min: 0, max: 25, maxChangePerHour: 3 },
    secchi: { min: 0.05, max: 40, maxChangePerHour: 5 / 24 },
  }

/** A gauge with no good reading for this long is stale: its numbers are shown as old, not as now. */
export const STALE_AFTER_MS = 2 * 3_600_000

/** How long a reading of one parameter stays fresh: two hours, or one and a half of its intervals if longer. */
export function staleAfterMs(parameter: Parameter): number {
  return Math.max(STALE_AFTER_MS, 1.5 * PARAMETERS[parameter].cadenceMin * 60_000)
}

export function isStale(parameter: Parameter, at: Date, now: Date): boolean {
  return now.getTime() - at.getTime() > staleAfterMs(parameter)
}

/** Why the ingest jobs refuse a row: the quarantine's vocabulary, and its review filter's. */
export const QUARANTINE_REASONS = [
  'malformed',
  'unknown_unit',
  'out_of_range',
  'rate_of_change',
  'conflicting_duplicate',
  'invalid_weather',
] as const
export type QuarantineReason = (typeof QUARANTINE_REASONS)[number]

/** Changes over very short spans are judged as if a quarter hour had passed. */
const MIN_SPAN_H = 0.25

export type Rejection = {
  reason: Extract<QuarantineReason, 'out_of_range' | 'rate_of_change' | 'unknown_unit'>
  detail: string
}

/** Converts a reading to SI as published (°C or °F, ft or m, FNU or NTU); null for a unit we do not know. */
export function toSi(parameter: Parameter, value: number, unit: string): number | null {
  const u = unit.trim().toLowerCase()
  switch (parameter) {
    case 'water_temp':
      if (u === '°c' || u === 'degc' || u === 'c') return value
      if (u === '°f' || u === 'degf' || u === 'f') return ((value - 32) * 5) / 9
      return null
    case 'gauge_height':
    case 'secchi':
      if (u === 'm') return value
      if (u === 'ft') return value * M_PER_FT
      return null
    case 'turbidity':
      // FNU (ISO 7027) and NTU read alike for lake water; both are stored as FNU.
      return u === 'fnu' || u === 'ntu' ? value : null
    case 'dissolved_oxygen':
      return u === 'mg/l' ? value : null
  }
}

/** The reason an SI reading is implausible, given the last good reading before it; null when it is fine. */
export function plausibility(
  parameter: Parameter,
  value: number,
  at: Date,
  previous?: { value: number; at: Date },
): Rejection | null {
  const rule = PLAUSIBLE[parameter]
  if (value < rule.min || value > rule.max) {
    return {
      reason: 'out_of_range',
      detail: `${value} ${PARAMETERS[parameter].siUnit} is outside ${rule.min} to ${rule.max}`,
    }
  }
  if (previous) {
    const hours = Math.max(Math.abs(at.getTime() - previous.at.getTime()) / 3_600_000, MIN_SPAN_H)
    const change = Math.abs(value - previous.value)
    if (change > rule.maxChangePerHour * hours) {
      return {
        reason: 'rate_of_change',
        detail: `changed ${change.toFixed(2)} ${PARAMETERS[parameter].siUnit} in ${hours.toFixed(2)} h (limit ${rule.maxChangePerHour}/h)`,
      }
    }
  }
  return null
}

/**
 * Dissolved oxygen at saturation in fresh water at 1 atm, mg/L: Benson and Krause (1984), in the
 * form Standard Methods (APHA 4500-O) gives, T in kelvin.
 */
export function oxygenSaturationMgL(waterC: number): number {
  const t = waterC + 273.15
  return Math.exp(
    -139.34411 + 1.575701e5 / t - 6.642308e7 / t ** 2 + 1.2438e10 / t ** 3 - 8.621949e11 / t ** 4,
  )
}
