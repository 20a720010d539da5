import { z } from 'zod'
import { COVERS } from '../conditions/tackle-rules'
import { LakeSlugParams } from './lake-read'
import { PlainText } from './text'

export const BANK_SLOPES = ['flat', 'gradual', 'steep', 'drop-off'] as const

const Position = z.tuple([
  z
    .number()
    .min(-180, 'Longitude runs from -180 to 180.')
    .max(180, 'Longitude runs from -180 to 180.'),
  z.number().min(-90, 'Latitude runs from -90 to 90.').max(90, 'Latitude runs from -90 to 90.'),
])

/** What an angler says about a bank; the server snaps the points to the shore and adds exposure. */
export const BankInput = z.object({
  name: PlainText()
    .min(1, 'Give the bank a name.')
    .max(60, 'Keep the name under 60 characters.')
    .regex(/^[^<>]*$/, 'Leave out < and >.'),
  points: z
    .array(Position)
    .min(2, 'Pick at least two points along the shore.')
    .max(40, 'Pick at most 40 points.'),
  cover: z
    .array(z.enum(COVERS))
    .min(1, 'Choose at least one kind of cover.')
    .transform((cover) => [...new Set(cover)]),
  depthM: z
    .number()
    .min(0, 'Depth cannot be negative.')
    .max(60, 'Depth a cast off the bank is at most 60 m.')
    .nullable()
    .default(null),
  slope: z.enum(BANK_SLOPES).nullable().default(null),
  notes: PlainText({ lines: true }).max(1000, 'Keep notes under 1,000 characters.').default(''),
})
export type BankInput = z.infer<typeof BankInput>

export const ExposureTableView = z.object({
  /** How the table was computed (`EXPOSURE_TABLE_VERSION`); absent on the oldest tables. */
  version: z.number().int().optional(),
  point: Position,
  facingDeg: z.number(),
  rows: z.array(
    z.object({ windFromDeg: z.number(), fetchM: z.number(), effectiveFetchM: z.number() }),
  ),
})

export const BankView = BankInput.extend({
  id: z.uuid(),
  exposure: ExposureTableView,
  /** True when a new lake outline left the bank's points off the shore: redraw it. */
  detached: z.boolean(),
  updatedAt: z.iso.datetime(),
})
export type BankView = z.infer<typeof BankView>

export const BankList = z.object({ items: z.array(BankView) })
export type BankList = z.infer<typeof BankList>

export const BankParams = LakeSlugParams.extend({ id: z.uuid('Not a bank.') })
