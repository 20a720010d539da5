import {
  FAMILY_DEFAULTS,
  TACKLE_RULES,
  type Blade,
  type LureFamily,
  type TackleDetails,
} from './tackle-rules'

/** Every lure family the tackle table calls, in the table's order. */
export const LURE_FAMILIES = Object.keys(FAMILY_DEFAULTS) as LureFamily[]

export const BLADES: Blade[] = ['colorado', 'willow', 'indiana', 'willow-colorado', 'double-willow']

export const BLADE_LABELS: Record<Blade, string> = {
  colorado: 'Colorado blade',
  willow: 'willow blade',
  indiana: 'Indiana blade',
  'willow-colorado': 'willow and Colorado blades',
  'double-willow': 'double willow blades',
}

export interface TackleLists {
  colors: string[]
  sizes: string[]
  trailers: string[]
  retrieves: string[]
  bladeFinishes: string[]
}

/**
 * The words the tackle calls use for each family (defaults and every detail row), so the journal
 * offers the same names to pick from; an angler may still type their own.
 */
export function tackleLists(family: LureFamily): TackleLists {
  const details: Partial<TackleDetails>[] = [
    FAMILY_DEFAULTS[family],
    ...TACKLE_RULES.filter((r) => r.family === family && r.set).map((r) => r.set!),
  ]
  const collect = (pick: (d: Partial<TackleDetails>) => (string | undefined)[]) => [
    ...new Set(details.flatMap(pick).filter((v): v is string => !!v)),
  ]
  return {
    colors: collect((d) => d.colors ?? []),
    sizes: collect((d) => [d.size]),
    trailers: collect((d) => [d.trailer]),
    retrieves: collect((d) => [d.retrieve]),
    bladeFinishes: collect((d) => [d.bladeFinish]),
  }
}
