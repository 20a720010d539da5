import { z } from 'zod'

export const SeriesQuery = z.object({
  days: z.coerce
    .number()
    .int()
    .refine((d) => d === 7 || d === 30, { error: 'Choose 7 or 30 days.' })
    .default(7),
})
export type SeriesQuery = z.infer<typeof SeriesQuery>

const Values = z.array(z.number().nullable())

/** Hourly series for the Lake read charts, aligned on `hours` (UTC hour starts); null where no data. */
export const LakeSeries = z.object({
  days: z.number(),
  hours: z.array(z.iso.datetime()),
  waterC: Values,
  secchiM: Values,
  gaugeM: Values,
  windMs: Values,
  gustMs: Values,
  precipitationMm: Values,
})
export type LakeSeries = z.infer<typeof LakeSeries>
