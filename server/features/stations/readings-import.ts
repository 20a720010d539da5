import Papa from 'papaparse'
import { PARAMETER_KEYS, type Parameter } from '../../../shared/readings'
import { READINGS_CSV_COLUMNS, type ReadingsImportReport } from '../../../shared/schemas/stations'
import type { Db } from '../../db/index'
import { missingColumns } from '../../http/errors'
import { ingestRepo, type DatastreamRow, type PageCommit } from '../ingest/ingest.repo'
import { validatePage } from '../ingest/validate-page'
import { isPlainText } from '../../../shared/schemas/text'

type Row = ReadingsImportReport['rows'][number]

/** A CSV row as the feed would have sent it; its id is stable, so importing again changes nothing. */
const observation = (parameter: string, at: string, value: string) => ({
  '@iot.id': `csv:${parameter}:${at}:${value}`,
  phenomenonTime: at,
  result: value.trim() === '' ? null : Number(value),
})

/**
 * Historical readings for one station from a CSV (parameter, observed_at, value, unit), checked by
 * the ingest job's own rules (`validatePage`: shape, unit, range, rate of change, repeats), per
 * parameter in time order after the last stored reading before them. A preview saves nothing; an
 * import stores the good rows and quarantines the rest exactly as ingestion does, so importing
 * the same file twice changes nothing.
 */
export async function importReadingsCsv(
  db: Db,
  stationId: string,
  csv: string,
  commit: boolean,
): Promise<ReadingsImportReport> {
  const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim().toLowerCase(),
  })
  const missing = ['parameter', 'observed_at', 'value'].filter(
    (c) => !(parsed.meta.fields ?? []).includes(c),
  )
  if (missing.length) throw missingColumns(missing, READINGS_CSV_COLUMNS)
  const repo = ingestRepo(db)
  const streams = new Map(
    (await repo.datastreamsOf(stationId)).map((d) => [d.parameter as string, d]),
  )

  const rows: Row[] = []
  /** Rows of one parameter and unit: the page validatePage judges, and where each came from. */
  interface Group {
    ds: DatastreamRow
    unit: string
    obs: unknown[]
    /** Observation id to CSV line, and observation time to line, for the verdict's rows. */
    lines: Map<string, number>
    atLine: Map<number, number>
  }
  const groups = new Map<string, Group>()
  /** A repeated row's line, and the line of its first occurrence. */
  const twins = new Map<number, number>()
  parsed.data.forEach((raw, i) => {
    const line = i + 2
    const row: Row = {
      line,
      parameter: (raw.parameter ?? '').trim(),
      observedAt: (raw.observed_at ?? '').trim(),
      value: (raw.value ?? '').trim(),
      status: 'invalid',
      reason: null,
    }
    rows.push(row)
    if (!Object.values(raw).every((cell) => isPlainText(String(cell ?? ''))))
      return (row.reason = 'Leave out control characters and direction marks.')
    const ds = streams.get(row.parameter)
    if (!PARAMETER_KEYS.includes(row.parameter as Parameter))
      return (row.reason = `Unknown parameter; use one of ${PARAMETER_KEYS.join(', ')}.`)
    if (!ds) return (row.reason = 'This station has no such parameter in the feed.')
    const unit = (raw.unit ?? '').trim() || ds.unit
    const key = `${row.parameter} ${unit}`
    const group: Group = groups.get(key) ?? {
      ds,
      unit,
      obs: [],
      lines: new Map(),
      atLine: new Map(),
    }
    const o = observation(row.parameter, row.observedAt, row.value)
    group.obs.push(o)
    // An exact repeat keeps the first line; the repeat is reported as that line was.
    if (group.lines.has(o['@iot.id'])) twins.set(line, group.lines.get(o['@iot.id'])!)
    else group.lines.set(o['@iot.id'], line)
    const t = Date.parse(row.observedAt)
    if (Number.isFinite(t) && !group.atLine.has(t)) group.atLine.set(t, line)
    groups.set(key, group)
  })

  const byLine = new Map(rows.map((r) => [r.line, r]))
  const pages: PageCommit[] = []
  // The last stored reading before each group's earliest row, for all groups in one query.
  const previous = await repo.lastGoodBefore(
    [...groups.values()].map((g) => ({
      ds: g.ds,
      from: new Date(g.atLine.size ? Math.min(...g.atLine.keys()) : 0),
    })),
  )
  for (const g of groups.values()) {
    const verdict = validatePage(g.ds.parameter, g.unit, g.obs, previous.get(g.ds.id))
    for (const good of verdict.good)
      byLine.get(g.atLine.get(good.observedAt.getTime())!)!.status = 'stored'
    for (const bad of verdict.bad) {
      const row = byLine.get(g.lines.get(bad.feedId) ?? -1)
      if (row) Object.assign(row, { status: 'quarantined', reason: `${bad.reason}: ${bad.detail}` })
    }
    pages.push({ ds: g.ds, good: verdict.good, bad: verdict.bad, mark: {} })
  }
  for (const [line, first] of twins) {
    const { status, reason } = byLine.get(first)!
    Object.assign(byLine.get(line)!, { status, reason })
  }
  if (commit && pages.length) await repo.commitPages(pages)
  const count = (s: Row['status']) => rows.filter((r) => r.status === s).length
  return {
    rows,
    stored: count('stored'),
    quarantined: count('quarantined'),
    invalid: count('invalid'),
    committed: commit,
  }
}
