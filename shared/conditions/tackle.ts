import { assertFinite } from '../errors'
import {
  FAMILY_DEFAULTS,
  NO_FISHING_WIND_MS,
  TACKLE_RULES,
  type LureFamily,
  type TackleDetails,
  type TackleInput,
  type TackleRule,
} from './tackle-rules'

export interface TackleCall extends TackleDetails {
  family: LureFamily
  /** Sum of the fit rows that matched; calls are ordered by it. */
  fit: number
  why: string[]
  /** The rule ids behind the call, for tracing a call back to the table. */
  ruleIds: string[]
}

/**
 * Tackle calls for the conditions, best fit first. Every call carries at least one reason. None at
 * all in wind at or above `NO_FISHING_WIND_MS`: no bait is worth the risk then.
 */
export function tackleCalls(input: TackleInput, rules: TackleRule[] = TACKLE_RULES): TackleCall[] {
  assertFinite(input.waterC, 'waterC', { min: -2, max: 40 })
  assertFinite(input.windMs, 'windMs', { min: 0 })
  if (input.depthM !== undefined) assertFinite(input.depthM, 'depthM', { min: 0 })
  if (input.windMs >= NO_FISHING_WIND_MS) return []

  const calls = new Map<LureFamily, TackleCall>()
  const matched = rules.filter((rule) => rule.when(input))
  // A family is called only when at least one of its fit rows matched and none ruled it out.
  const ruledOut = new Set(matched.filter((rule) => rule.rulesOut).map((rule) => rule.family))
  for (const rule of matched) {
    if (rule.fit === undefined || calls.has(rule.family) || ruledOut.has(rule.family)) continue
    calls.set(rule.family, {
      family: rule.family,
      ...FAMILY_DEFAULTS[rule.family],
      colors: [...FAMILY_DEFAULTS[rule.family].colors],
      fit: 0,
      why: [],
      ruleIds: [],
    })
  }
  for (const rule of matched) {
    const call = calls.get(rule.family)
    if (!call) continue
    if (rule.fit !== undefined) call.fit += rule.fit
    if (rule.set) Object.assign(call, rule.set)
    call.why.push(rule.why)
    call.ruleIds.push(rule.id)
  }
  return [...calls.values()].filter((c) => c.fit > 0).sort((a, b) => b.fit - a.fit)
}
