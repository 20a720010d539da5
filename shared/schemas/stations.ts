import { z } from 'zod'
import { PARAMETER_KEYS } from '../readings'

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
