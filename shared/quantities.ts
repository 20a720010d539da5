import { cToF, ftToM, fToC, mToFt } from './units'

/** The units a sentence's quantities are shown in. */
export interface TextUnits {
  temperature: 'F' | 'C'
  length: 'ft' | 'm'
}

/** A converted number as a person reads it: whole from 3 up, else to a tenth ("0.6", "3"). */
function shown(x: number): string {
  return x >= 3 ? String(Math.round(x)) : String(Math.round(x * 10) / 10)
}

const NUMBER = String.raw`(\d+(?:\.\d+)?)`
const LENGTH = new RegExp(String.raw`${NUMBER}(?:-${NUMBER})? (ft|m)\b`, 'g')
const TEMPERATURE = new RegExp(String.raw`${NUMBER}(?:-${NUMBER})? °(F|C)\b`, 'g')
/** "the mid 40s °F", "mid-40s °F": a rule of thumb's rough temperature. */
const DECADE = /(?:the )?mid[- ](\d)0s °F/g

/**
 * The quantities in a rule's fixed wording ("about 2 ft of visibility", "from about 50 °F",
 * "runs 1-1.5 m deep") in a person's units. Rules of thumb are written in the units anglers trade
 * them in; this rewrites them at the edge, as every other number is.
 */
export function quantitiesIn(text: string, units: TextUnits): string {
  return text
    .replace(DECADE, (whole, tens: string) =>
      units.temperature === 'F' ? whole : `about ${Math.round(fToC(Number(tens) * 10 + 5))} °C`,
    )
    .replace(TEMPERATURE, (whole, a: string, b: string | undefined, unit: 'F' | 'C') => {
      if (unit === units.temperature) return whole
      const to = unit === 'F' ? fToC : cToF
      const range = [a, b].filter((x) => x !== undefined).map((x) => Math.round(to(Number(x))))
      return `${range.join('-')} °${units.temperature}`
    })
    .replace(LENGTH, (whole, a: string, b: string | undefined, unit: 'ft' | 'm') => {
      if (unit === units.length) return whole
      const to = unit === 'ft' ? ftToM : mToFt
      const range = [a, b].filter((x) => x !== undefined).map((x) => shown(to(Number(x))))
      return `${range.join('-')} ${units.length}`
    })
}
