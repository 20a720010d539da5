import type { CsvImportReport } from '../../shared/schemas/csv-import'
import { badCsv } from '../http/errors'

/**
 * An import's report from its rows. A preview returns it as is; a commit goes on only when every
 * row is good (nothing is half-imported), and is otherwise a 400 that says how many need attention.
 */
export function importReport(rows: CsvImportReport['rows'], commit: boolean): CsvImportReport {
  const invalid = rows.filter((r) => Object.keys(r.errors).length).length
  if (commit && (invalid || !rows.length))
    throw badCsv(
      rows.length
        ? `${invalid} of ${rows.length} rows need attention; nothing was imported.`
        : 'The file has no rows.',
      'Fix the rows marked and upload the file again.',
    )
  return { rows, valid: rows.length - invalid, invalid, imported: 0 }
}
