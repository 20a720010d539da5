import Papa from 'papaparse'
import {
  CLIENT_CSV_COLUMNS,
  ClientInput,
  type ClientList,
  type ClientView,
} from '../../../shared/schemas/guides'
import { badCsv, conflict, fieldMessages, missingColumns, notFound } from '../../http/errors'
import type { ClientsRepo } from './clients.repo'
import type { CsvImportReport } from '../../../shared/schemas/csv-import'
import { importReport } from '../../lib/csv-import'

type ClientRow = Awaited<ReturnType<ClientsRepo['list']>>[number]

const view = (row: ClientRow): ClientView => ({
  id: row.id,
  name: row.name,
  email: row.email,
  phone: row.phone,
  notes: row.notes,
  updatedAt: row.updatedAt.toISOString(),
})

const noClient = () => notFound('client')
const taken = (email: string) =>
  conflict('email_taken', `${email} is already one of your clients.`, 'email')

/** A client list is small: a CSV of more than this many rows is refused rather than read. */
export const MAX_IMPORT_ROWS = 2000

export function clientsService(repo: ClientsRepo) {
  return {
    async list(guideId: string): Promise<ClientList> {
      return { items: (await repo.list(guideId)).map(view) }
    },
    async create(guideId: string, input: ClientInput): Promise<ClientView> {
      const row = await repo.insert(guideId, input)
      if (!row) throw taken(input.email)
      return view(row)
    },
    async update(guideId: string, id: string, input: ClientInput): Promise<ClientView> {
      if (await repo.emailTaken(guideId, input.email, id)) throw taken(input.email)
      const row = await repo.update(guideId, id, input)
      if (!row) throw noClient()
      return view(row)
    },
    async remove(guideId: string, id: string) {
      if (!(await repo.remove(guideId, id))) throw noClient()
    },

    /**
     * A CSV of clients (a header row naming name, email, phone, notes), checked row by row against
     * the same rules as the form and against the guide's list. A preview changes nothing; an import
     * adds every row or, if any row is bad, none.
     */
    async importCsv(guideId: string, csv: string, commit: boolean): Promise<CsvImportReport> {
      const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
        header: true,
        skipEmptyLines: 'greedy',
        transformHeader: (h) => h.trim().toLowerCase(),
      })
      const columns = parsed.meta.fields ?? []
      const missing = ['name', 'email'].filter((c) => !columns.includes(c))
      if (missing.length) throw missingColumns(missing, CLIENT_CSV_COLUMNS)
      if (parsed.data.length > MAX_IMPORT_ROWS)
        throw badCsv(
          `Import at most ${MAX_IMPORT_ROWS} clients at a time.`,
          `Split the file: at most ${MAX_IMPORT_ROWS} rows.`,
        )
      const known = new Set((await repo.list(guideId)).map((c) => c.email))
      const seen = new Map<string, number>()
      const good: ClientInput[] = []
      const rows = parsed.data.map((raw, i) => {
        // Line 1 is the header.
        const line = i + 2
        const values = Object.fromEntries(
          CLIENT_CSV_COLUMNS.map((c) => [c, (raw[c] ?? '').toString()]),
        )
        const result = ClientInput.safeParse(values)
        const errors: Record<string, string> = result.success ? {} : fieldMessages(result.error)
        if (result.success) {
          const { email } = result.data
          if (known.has(email)) errors.email = 'Already one of your clients.'
          else if (seen.has(email)) errors.email = `Also on line ${seen.get(email)}.`
          else good.push(result.data)
          seen.set(email, seen.get(email) ?? line)
        }
        for (const e of parsed.errors.filter((e) => e.row === i)) errors._ = e.message
        return { line, values, errors }
      })
      const report = importReport(rows, commit)
      if (!commit) return report
      await repo.insertAll(guideId, good)
      return { ...report, imported: good.length }
    },
  }
}
export type ClientsService = ReturnType<typeof clientsService>
