import type { Settings } from '../schemas/settings'
import { KG_PER_LB, MM_PER_IN } from '../units'

const M_PER_IN = MM_PER_IN / 1000

/**
 * A fish's length and weight in a person's units: inches and pounds for those who read feet,
 * centimetres and kilograms for those who read metres. Stored in metres and kilograms.
 */
export function fishUnits(s: Pick<Settings, 'length'>) {
  const imperial = s.length === 'ft'
  return {
    lengthUnit: imperial ? 'in' : 'cm',
    weightUnit: imperial ? 'lb' : 'kg',
    toLength: (m: number) => (imperial ? m / M_PER_IN : m * 100),
    fromLength: (x: number) => (imperial ? x * M_PER_IN : x / 100),
    toWeight: (kg: number) => (imperial ? kg / KG_PER_LB : kg),
    fromWeight: (x: number) => (imperial ? x * KG_PER_LB : x),
    length: (m: number) =>
      imperial ? `${(m / M_PER_IN).toFixed(1)} in` : `${Math.round(m * 100)} cm`,
    weight: (kg: number) =>
      imperial ? `${(kg / KG_PER_LB).toFixed(2)} lb` : `${kg.toFixed(2)} kg`,
  }
}
export type FishUnits = ReturnType<typeof fishUnits>
