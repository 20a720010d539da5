import type { CatchView } from '../schemas/journal'

/**
 * The journal's CSV: one row per catch. The columns up to `note` are what an import reads back
 * (lengths in centimetres and weights in kilograms whatever the angler's units, times as ISO
 * instants with their offset); the conditions after them are written for reading only, since the
 * server works them out again for every imported catch.
 */
export const CATCH_CSV_COLUMNS = [
  'caught_at',
  'lake',
  'species',
  'length_cm',
  'weight_kg',
  'released',
  'lure',
  'blade',
  'color',
  'size',
  'trailer',
  'trailer_hook',
  'retrieve',
  'bank',
  'note',
] as const
export const CATCH_CSV_CONDITIONS = [
  'water_c',
  'clarity',
  'phase',
  'wind_ms',
  'wind_from_deg',
  'bank_exposure',
  'sky',
  'time_of_day',
  'verdict',
] as const
/** Columns an import needs in its header row. */
export const CATCH_CSV_REQUIRED = ['caught_at', 'lake', 'species', 'released', 'lure'] as const

/** Characters a spreadsheet takes as the start of a formula (and tab and CR, which smuggle one). */
const FORMULA_START = /^[=+\-@\t\r]/

/** A cell a spreadsheet shows as text: a formula's first character gets a leading apostrophe. */
export function escapeCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value
}

/** The cell as it was before `escapeCell`, for an import of an exported file. */
export function unescapeCell(value: string): string {
  return value.startsWith("'") && FORMULA_START.test(value.slice(1)) ? value.slice(1) : value
}

const num = (x: number | null | undefined, digits: number) =>
  x === null || x === undefined ? '' : String(Number(x.toFixed(digits)))
const yesNo = (b: boolean | null) => (b === null ? '' : b ? 'yes' : 'no')

/** A catch as a CSV row, every cell escaped. */
export function catchCsvRow(c: CatchView): string[] {
  const k = c.conditions
  const cells = [
    c.caughtAt,
    c.lake.slug,
    c.species,
    num(c.lengthM === null ? null : c.lengthM * 100, 1),
    num(c.weightKg, 3),
    yesNo(c.released),
    c.lure.family,
    c.lure.blade ?? '',
    c.lure.color,
    c.lure.size,
    c.lure.trailer,
    yesNo(c.lure.trailerHook),
    c.lure.retrieve,
    c.bank?.name ?? '',
    c.note,
    num(k?.waterC, 1),
    k?.clarity?.class ?? '',
    k?.phase ?? '',
    num(k?.wind?.ms, 1),
    num(k?.wind?.fromDeg, 0),
    k?.bankExposure ?? '',
    k?.sky ?? '',
    k?.timeOfDay ?? '',
    k?.verdict ?? '',
  ]
  return cells.map(escapeCell)
}

/** "yes"/"no" (and true/false, y/n, kept/released for `released`) as a boolean; null when empty. */
export function csvBoolean(value: string): boolean | null | undefined {
  const v = value.trim().toLowerCase()
  if (!v) return null
  if (['yes', 'y', 'true', '1'].includes(v)) return true
  if (['no', 'n', 'false', '0'].includes(v)) return false
  return undefined
}

/** A number cell (a comma as the decimal mark allowed); null when empty, NaN when not a number. */
export function csvNumber(value: string): number | null {
  const v = value.trim().replace(',', '.')
  return v ? Number(v) : null
}
