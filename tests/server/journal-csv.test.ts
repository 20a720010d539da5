import { count, eq } from 'drizzle-orm'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { escapeCell, unescapeCell } from '../../shared/journal/csv'
import { CsvImportReport } from '../../shared/schemas/csv-import'
import { CatchList } from '../../shared/schemas/journal'
import { catches } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let app: ReturnType<typeof testApp>

const aCatch = (over: Record<string, unknown> = {}) => ({
  lakeSlug: 'quillmere',
  caughtAt: '2026-05-02T11:30:00.000Z',
  species: 'largemouth',
  lengthM: 0.42,
  weightKg: 1.3,
  released: true,
  lure: { family: 'spinnerbait', blade: 'colorado', color: 'white', size: '3/8 oz' },
  note: 'Off the rock point',
  ...over,
})
const HEADER = 'caught_at,lake,species,length_cm,weight_kg,released,lure,blade,bank,note'

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  app = testApp(ctx.db)
})
afterAll(() => ctx.drop())

const countOf = async (userEmailAgent: string) =>
  (await ctx.db.select({ n: count() }).from(catches).where(eq(catches.note, userEmailAgent)))[0]!.n

describe('the journal as CSV', () => {
  it('escapes every cell a spreadsheet would run as a formula, and reads it back', () => {
    for (const bad of ['=1+1', '+SUM(A1)', '-2+3', '@cmd', '\t=x', '\r=x'])
      expect(escapeCell(bad)).toBe(`'${bad}`)
    for (const fine of ['spinnerbait', '12.5', "it's", '', ' =not at start'])
      expect(escapeCell(fine)).toBe(fine)
    for (const x of ['=1+1', '@cmd', "'quoted", 'plain'])
      expect(unescapeCell(escapeCell(x))).toBe(x)
  })

  it('exports the journal with formulas escaped, private to its angler', async () => {
    const angler = await signedInAgent(app, ctx.db, 'export@csv.test')
    const other = await signedInAgent(app, ctx.db, 'other@csv.test')
    await angler
      .post('/api/journal/catches')
      .send(aCatch({ note: '=HYPERLINK("http://x.invalid","click")', lure: { family: '@worm' } }))
      .expect(201)
    await angler.post('/api/journal/catches').send(aCatch({ caughtAt: '2026-05-03T12:00:00Z' }))
    const res = await angler.get('/api/journal/export.csv').expect(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toMatch(
      /attachment; filename="chopline-journal.csv"/,
    )
    expect(res.headers['cache-control']).toContain('no-store')
    const text = res.text.replace(/^\uFEFF/, '')
    const rows = Papa.parse<Record<string, string>>(text.trim(), { header: true }).data
    expect(rows).toHaveLength(2)
    expect(rows[0]).toMatchObject({
      caught_at: '2026-05-02T11:30:00.000Z',
      lake: 'quillmere',
      species: 'largemouth',
      length_cm: '42',
      weight_kg: '1.3',
      released: 'yes',
      lure: "'@worm",
      note: `'=HYPERLINK("http://x.invalid","click")`,
    })
    // No cell starts with a formula character unescaped.
    for (const row of rows)
      for (const cell of Object.values(row)) expect(cell).not.toMatch(/^[=+\-@]/)
    const theirs = (await other.get('/api/journal/export.csv').expect(200)).text
    expect(
      theirs
        .replace(/^\uFEFF/, '')
        .trim()
        .split('\r\n'),
    ).toHaveLength(1)
  })

  it('previews row by row, writes nothing for a file with bad rows, then imports all at once', async () => {
    const angler = await signedInAgent(app, ctx.db, 'import@csv.test')
    const lines = [
      HEADER,
      `2026-05-04T11:00:00Z,quillmere,largemouth,40,1.2,yes,'=jig,,,import-note`,
      `2026-05-04T12:00:00Z,quillmere,smallmouth,,0.9,no,spinnerbait,colorado,,import-note`,
      `2026-05-04T12:00:00Z,quillmere,smallmouth,,0.9,no,spinnerbait,colorado,,import-note`,
      `yesterday,nowhere,trout,abc,,maybe,,purple,,import-note`,
      `2026-05-04T13:00:00Z,quillmere,largemouth,200,,yes,jig,,Not a bank,import-note`,
      `2099-05-04T13:00:00Z,quillmere,largemouth,40,,yes,jig,,,import-note`,
    ]
    const upload = (csv: string, commit = false) =>
      angler
        .post(`/api/journal/import${commit ? '?commit=true' : ''}`)
        .attach('file', Buffer.from(csv), 'journal.csv')
    const preview = CsvImportReport.parse((await upload(lines.join('\n')).expect(200)).body)
    expect(preview).toMatchObject({ valid: 2, invalid: 4, imported: 0 })
    const errors = Object.fromEntries(preview.rows.map((r) => [r.line, r.errors]))
    expect(errors[2]).toEqual({})
    expect(preview.rows[0]!.values.lure).toBe('=jig')
    expect(errors[4]).toEqual({ _: 'The same fish as line 3.' })
    expect(Object.keys(errors[5]!).sort()).toEqual(
      ['caught_at', 'lake', 'length_cm', 'lure', 'released', 'species', 'blade'].sort(),
    )
    expect(errors[6]).toMatchObject({ bank: 'Not one of your banks on this lake.' })
    expect(errors[7]).toMatchObject({ caught_at: expect.stringContaining('not come yet') })
    await upload(lines.join('\n'), true).expect(400)
    expect(await countOf('import-note')).toBe(0)

    const good = [HEADER, lines[1], lines[2]].join('\r\n')
    const done = CsvImportReport.parse((await upload(good, true).expect(201)).body)
    expect(done).toMatchObject({ valid: 2, invalid: 0, imported: 2 })
    const list = CatchList.parse((await angler.get('/api/journal/catches').expect(200)).body)
    expect(list.items.map((c) => [c.species, c.lure.family, c.lengthM, c.released])).toEqual([
      ['smallmouth', 'spinnerbait', null, false],
      ['largemouth', '=jig', 0.4, true],
    ])
    // The same file again: every row is already in the journal.
    const again = CsvImportReport.parse((await upload(good).expect(200)).body)
    expect(again.rows.map((r) => r.errors._)).toEqual([
      'Already in your journal.',
      'Already in your journal.',
    ])
  })

  it('round-trips an export through the import of another angler', async () => {
    const from = await signedInAgent(app, ctx.db, 'roundtrip-from@csv.test')
    const to = await signedInAgent(app, ctx.db, 'roundtrip-to@csv.test')
    await from
      .post('/api/journal/catches')
      .send(aCatch({ note: '-minus, "quoted"\nsecond line', caughtAt: '2026-05-05T10:00:00Z' }))
      .expect(201)
    const csv = (await from.get('/api/journal/export.csv').expect(200)).text
    const done = await to
      .post('/api/journal/import?commit=true')
      .attach('file', Buffer.from(csv), 'journal.csv')
      .expect(201)
    expect(done.body.imported).toBe(1)
    const [item] = CatchList.parse((await to.get('/api/journal/catches').expect(200)).body).items
    expect(item).toMatchObject({
      note: '-minus, "quoted"\nsecond line',
      lengthM: 0.42,
      weightKg: 1.3,
      lure: { family: 'spinnerbait', blade: 'colorado', color: 'white', size: '3/8 oz' },
    })
  })

  it('refuses a file without the columns it needs, and one that is not CSV', async () => {
    const angler = await signedInAgent(app, ctx.db, 'refused@csv.test')
    const res = await angler
      .post('/api/journal/import')
      .attach('file', Buffer.from('when,where\n1,2\n'), 'journal.csv')
      .expect(400)
    expect(res.body.error.message).toContain('caught_at')
    await angler
      .post('/api/journal/import')
      .attach('file', Buffer.from('x'), 'journal.xlsx')
      .expect(415)
  })
})
