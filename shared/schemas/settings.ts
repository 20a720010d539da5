import { z } from 'zod'

/** The speed units a person may read and type wind in. */
export const SPEED_UNITS = ['mph', 'kmh', 'knots'] as const

/** Display settings per user; everything is stored in SI and converted only when shown. */
export const Settings = z.object({
  temperature: z.enum(['F', 'C'], { error: 'Choose °F or °C.' }),
  length: z.enum(['ft', 'm'], { error: 'Choose feet or metres.' }),
  speed: z.enum(SPEED_UNITS, { error: 'Choose mph, km/h or knots.' }),
  clock: z.enum(['12h', '24h'], { error: 'Choose a 12- or 24-hour clock.' }),
  homeLakeSlug: z
    .string()
    .regex(/^[a-z0-9-]{1,60}$/, 'Not a lake.')
    .nullable(),
})
export type Settings = z.infer<typeof Settings>
