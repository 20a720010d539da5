import { z } from 'zod'
import { PARAMETER_KEYS } from '../readings'
import { PlainText } from './text'

export const StationState = z.enum(['ok', 'stale', 'failing'])
export type StationState = z.infer<typeof StationState>

export const StationHealth = z.object({
  id: z.uuid(),
  name: z.string(),
  feedThingId: z.string(),
  active: z.boolean(),
  lake: z.object({ slug: z.string(), name: z.string() }),
  parameters: z.array(
    z.object({
      parameter: z.enum(PARAMETER_KEYS),
      unit: z.string(),
      highWaterMark: z.iso.datetime().nullable(),
    }),
  ),
  health: z.object({
    state: StationState,
    lastGoodAt: z.iso.datetime().nullable(),
    lastRunAt: z.iso.datetime().nullable(),
    lastError: z.string().nullable(),
    gapCount: z.number().int(),
    rejected24h: z.number().int(),
    circuitOpenUntil: z.iso.datetime().nullable(),
  }),
})
export type StationHealth = z.infer<typeof StationHealth>

export const StationList = z.object({ items: z.array(StationHealth) })
export type StationList = z.infer<typeof StationList>

/** A station as an admin creates or edits it; setting `active` false deactivates it. */
export const StationInput = z.object({
  name: PlainText()
    .min(1, 'Give the station a name.')
    .max(80, 'Keep the name under 80 characters.'),
  lakeSlug: z.string().regex(/^[a-z0-9-]{1,60}$/, 'Choose a lake.'),
  feedThingId: z
    .string()
    .trim()
    .regex(
      /^[A-Za-z0-9._:-]{1,40}$/,
      'The feed identifier is letters, digits and . _ : - (up to 40).',
    ),
  active: z.boolean().default(true),
})
export type StationInput = z.infer<typeof StationInput>
export const StationParams = z.object({ id: z.uuid('Not a station.') })

/** What one run of ingestion for a station did. */
export const StationRunResult = z.object({
  good: z.number().int(),
  quarantined: z.number().int(),
  failed: z.boolean(),
  health: StationHealth.shape.health,
})
export type StationRunResult = z.infer<typeof StationRunResult>

/** The columns of a readings CSV, in its header row, in any order; unit may be left out. */
export const READINGS_CSV_COLUMNS = ['parameter', 'observed_at', 'value', 'unit'] as const

/** Each row of an imported readings CSV and what became of it. */
export const ReadingsImportReport = z.object({
  rows: z.array(
    z.object({
      line: z.number().int(),
      parameter: z.string(),
      observedAt: z.string(),
      value: z.string(),
      /** stored: good (or already there); quarantined: refused by the ingest rules; invalid: unusable. */
      status: z.enum(['stored', 'quarantined', 'invalid']),
      reason: z.string().nullable(),
    }),
  ),
  stored: z.number().int(),
  quarantined: z.number().int(),
  invalid: z.number().int(),
  /** False for a preview, which saves nothing. */
  committed: z.boolean(),
})
export type ReadingsImportReport = z.infer<typeof ReadingsImportReport>

/** A station's last days, for the desk's small chart: readings stored against those expected, and refusals. */
/** Every station's last days, for the desk's small charts: one answer for the whole list. */
export const StationHistories = z.object({
  items: z.array(
    z.object({
      stationId: z.uuid(),
      days: z.array(
        z.object({
          date: z.iso.date(),
          stored: z.number().int(),
          expected: z.number().int(),
          rejected: z.number().int(),
        }),
      ),
    }),
  ),
})
export type StationHistories = z.infer<typeof StationHistories>
export type StationDay = StationHistories['items'][number]['days'][number]
export const StationHistoryQuery = z.object({
  days: z.coerce.number().int().min(1).max(30).default(7),
})
