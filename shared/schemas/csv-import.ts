import { z } from 'zod'

/** A CSV row as an import reads it: its line in the file, its values, and what is wrong with it. */
export const CsvImportRow = z.object({
  line: z.number().int(),
  values: z.record(z.string(), z.string()),
  /** By CSV column; `_` for the row as a whole. */
  errors: z.record(z.string(), z.string()),
})

/** A CSV import's preview or result: every row, then all rows in or none. */
export const CsvImportReport = z.object({
  rows: z.array(CsvImportRow),
  valid: z.number().int(),
  invalid: z.number().int(),
  /** Rows added; 0 for a preview, and for a file with any bad row (nothing is half-imported). */
  imported: z.number().int(),
})
export type CsvImportReport = z.infer<typeof CsvImportReport>
