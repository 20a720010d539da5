import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import {
  ClientList,
  ClientView,
  GuideProfileView,
  SharedTrip,
  TripList,
  TripView,
} from '../../shared/schemas/guides'
import { addDays, localDate } from '../../shared/time'
import { lakes, tripShares } from '../../server/db/schema/index'
import { signedInAgent, testApp } from '../helpers/app'
import { startWorld, type World } from '../helpers/world'
import { linkToken, startTestMail, type TestMail } from '../helpers/mail'
import { CsvImportReport } from '../../shared/schemas/csv-import'

let ctx: World
let mail: TestMail
let shore: [number, number][]
let today: string

const app = () => testApp(ctx.db, { mail: mail.mail })
type Agent = Awaited<ReturnType<typeof signedInAgent>>

beforeAll(async () => {
  ctx = await startWorld(20)
  mail = await startTestMail()
  const lake = ctx.quillmere
  shore = (lake.shoreline as { coordinates: [number, number][][] }).coordinates[0]!
  today = localDate(new Date(), lake.timeZone)
})
afterAll(async () => {
  await mail.close()
  await ctx.close()
})

const client = (over: Record<string, string> = {}) => ({
  name: 'Dana Reel',
  email: 'dana@client.test',
  phone: '+1 555 0100',
  notes: 'Left-handed',
  ...over,
})

async function bank(agent: Agent, name: string, at: number) {
  const res = await agent
    .post('/api/lakes/quillmere/banks')
    .send({ name, points: [shore[at], shore[at + 3]], cover: ['rock'], depthM: 3 })
    .expect(201)
  return res.body.id as string
}

const csv = (lines: string[]) => Buffer.from(lines.join('\n'))

describe('clients', () => {
  it('belong to their guide: CRUD, 409 for a repeated address, 404 for another guide, 403 for anglers', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'g1@guides.test', 'guide')
    const other = await signedInAgent(app(), ctx.db, 'g2@guides.test', 'guide')
    const angler = await signedInAgent(app(), ctx.db, 'a1@guides.test')
    const created = ClientView.parse(
      (
        await guide
          .post('/api/guide/clients')
          .send(client({ email: 'Dana@Client.test' }))
          .expect(201)
      ).body,
    )
    expect(created.email).toBe('dana@client.test')
    const again = await guide.post('/api/guide/clients').send(client()).expect(409)
    expect(again.body.error.fields.email).toBeDefined()
    await guide
      .put(`/api/guide/clients/${created.id}`)
      .send(client({ phone: '555-0199' }))
      .expect(200)
    await other.put(`/api/guide/clients/${created.id}`).send(client()).expect(404)
    await other.delete(`/api/guide/clients/${created.id}`).expect(404)
    expect(
      ClientList.parse((await other.get('/api/guide/clients').expect(200)).body).items,
    ).toEqual([])
    await angler.get('/api/guide/clients').expect(403)
    await request(app()).get('/api/guide/clients').expect(401)
    const bad = await guide
      .post('/api/guide/clients')
      .send({ name: '', email: 'nope', phone: 'call me' })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['email', 'name', 'phone'])
  })

  it('imports a CSV after a preview, with a message per bad row, and nothing from a file with a bad row', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'importer@guides.test', 'guide')
    await guide
      .post('/api/guide/clients')
      .send(client({ email: 'known@client.test' }))
      .expect(201)
    const file = csv([
      'Name,Email,Phone,Notes',
      'Ana Cast,ana@client.test,555 0101,"Prefers mornings, no wading"',
      'Bo Line,not-an-email,,',
      'Cy Hook,known@client.test,,',
      'Di Jig,ana@client.test,,',
    ])
    const preview = CsvImportReport.parse(
      (
        await guide
          .post('/api/guide/clients/import')
          .attach('file', file, 'clients.csv')
          .expect(200)
      ).body,
    )
    expect(preview).toMatchObject({ valid: 1, invalid: 3, imported: 0 })
    expect(preview.rows.map((r) => [r.line, Object.keys(r.errors)])).toEqual([
      [2, []],
      [3, ['email']],
      [4, ['email']],
      [5, ['email']],
    ])
    expect(preview.rows[0]!.values.notes).toBe('Prefers mornings, no wading')
    expect(preview.rows[3]!.errors.email).toBe('Also on line 2.')
    const refused = await guide
      .post('/api/guide/clients/import?commit=true')
      .attach('file', file, 'clients.csv')
      .expect(400)
    expect(refused.body.error.message).toMatch(/nothing was imported/)
    const before = ClientList.parse((await guide.get('/api/guide/clients')).body).items.length
    expect(before).toBe(1)

    const good = csv(['email,name', 'ana@client.test,Ana Cast', 'ed@client.test,Ed Spool'])
    const done = await guide
      .post('/api/guide/clients/import?commit=true')
      .attach('file', good, 'clients.csv')
      .expect(201)
    expect(done.body.imported).toBe(2)
    expect(ClientList.parse((await guide.get('/api/guide/clients')).body).items).toHaveLength(3)
  })

  it('refuses bad files with a clear 4xx and changes nothing', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'uploads@guides.test', 'guide')
    const ok = csv(['name,email', 'Ana,ana@client.test'])
    const cases: [string, Buffer, string, number][] = [
      ['wrong type', ok, 'clients.xlsx', 415],
      ['path traversal', ok, '../../etc/clients.csv', 400],
      ['too large', Buffer.alloc(300 * 1024, 'a'), 'big.csv', 413],
      ['no header', csv(['Ana,ana@client.test']), 'clients.csv', 400],
      ['empty', Buffer.from(''), 'clients.csv', 400],
    ]
    for (const [what, body, name, status] of cases) {
      const res = await guide
        .post('/api/guide/clients/import?commit=true')
        // form-data's filepath (untyped in superagent) keeps the name whole instead of its last part.
        .attach('file', body, { filepath: name } as unknown as { filename: string })
      expect(res.status, what).toBe(status)
      expect(res.body.error.message, what).toBeTruthy()
    }
    await guide.post('/api/guide/clients/import').expect(400)
    expect(ClientList.parse((await guide.get('/api/guide/clients')).body).items).toEqual([])
  })
})

describe('trips and share links', () => {
  it('plans the trip from the cached day with the guide’s banks, and keeps it to the guide', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'planner@guides.test', 'guide')
    const other = await signedInAgent(app(), ctx.db, 'rival@guides.test', 'guide')
    const mine = await bank(guide, 'Rock point', 10)
    const spare = await bank(guide, 'Not on this trip', 60)
    const theirs = await bank(other, 'Rival bank', 30)
    const trip = {
      lakeSlug: 'quillmere',
      date: today,
      meetingPoint: 'North ramp',
      meetingTime: '05:45',
      bankIds: [mine],
      tackle: 'Spinnerbaits, rain gear',
      notes: '',
    }
    const stolen = await guide
      .post('/api/guide/trips')
      .send({ ...trip, bankIds: [theirs] })
      .expect(400)
    expect(stolen.body.error.fields.bankIds).toBeDefined()
    const bad = await guide
      .post('/api/guide/trips')
      .send({ ...trip, date: '2026-02-30', meetingTime: '5am', meetingPoint: '' })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual([
      'date',
      'meetingPoint',
      'meetingTime',
    ])

    const created = TripView.parse(
      (await guide.post('/api/guide/trips').send(trip).expect(201)).body,
    )
    expect(created.banks.map((b) => b.name)).toEqual(['Rock point'])
    expect(created.plan!.windows.some((w) => w.banks[0]?.name === 'Rock point')).toBe(true)
    expect(created.cautions.at(-1)!.kind).toBe('authority')
    expect(TripList.parse((await guide.get('/api/guide/trips')).body).items).toMatchObject([
      { id: created.id, bankCount: 1, meetingTime: '05:45' },
    ])
    await other.get(`/api/guide/trips/${created.id}`).expect(404)
    await other
      .put(`/api/guide/trips/${created.id}`)
      .send({ ...trip, bankIds: [] })
      .expect(404)
    await other.post(`/api/guide/trips/${created.id}/shares`).send({ expiresOn: today }).expect(404)
    // A bank the guide did not put on the trip is not ranked in it.
    expect(JSON.stringify(created.plan)).not.toContain(spare)
  })

  it('shares a read-only page by signed link, e-mails it to chosen clients, and a revoked link is gone (410)', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'sharer@guides.test', 'guide')
    const other = await signedInAgent(app(), ctx.db, 'outsider@guides.test', 'guide')
    const first = await bank(guide, 'Windy rocks', 10)
    await bank(guide, 'Secret hole', 80)
    const trip = TripView.parse(
      (
        await guide
          .post('/api/guide/trips')
          .send({
            lakeSlug: 'quillmere',
            date: addDays(today, 1),
            meetingPoint: 'Marina fuel dock',
            meetingTime: '06:00',
            bankIds: [first],
          })
          .expect(201)
      ).body,
    )
    const dana = ClientView.parse(
      (await guide.post('/api/guide/clients').send(client()).expect(201)).body,
    )
    const stranger = ClientView.parse(
      (
        await other
          .post('/api/guide/clients')
          .send(client({ email: 'x@client.test' }))
          .expect(201)
      ).body,
    )
    await guide
      .post(`/api/guide/trips/${trip.id}/shares`)
      .send({ expiresOn: addDays(today, -2) })
      .expect(400)
    const [share] = (
      await guide
        .post(`/api/guide/trips/${trip.id}/shares`)
        .send({ expiresOn: addDays(today, 2) })
        .expect(201)
    ).body.items
    const token = new URL(share.url).pathname.split('/').pop()!

    const page = SharedTrip.parse(
      (await request(app()).get(`/api/shared/trips/${token}`).expect(200)).body,
    )
    expect(page).toMatchObject({
      meetingPoint: 'Marina fuel dock',
      banks: [{ name: 'Windy rocks' }],
    })
    const raw = JSON.stringify(page)
    expect(raw).not.toContain('Secret hole')
    expect(raw).not.toContain('sharer@guides.test')
    expect(page.cautions.at(-1)!.message).toMatch(/local authorities/)

    await guide
      .post(`/api/guide/trips/${trip.id}/shares/${share.id}/send`)
      .send({ clientIds: [stranger.id] })
      .expect(400)
    const sent = await guide
      .post(`/api/guide/trips/${trip.id}/shares/${share.id}/send`)
      .send({ clientIds: [dana.id] })
      .expect(200)
    expect(sent.body.items[0].sends).toMatchObject([{ email: 'dana@client.test', status: 'sent' }])
    const [message] = mail.smtp.messages().filter((m) => m.to.includes('dana@client.test'))
    expect(message!.subject).toMatch(/^Your fishing trip on Quillmere Reservoir/)
    expect(message!.text).toContain('Marina fuel dock')
    const mailed = linkToken(
      message!.text.replace('/trip/', '/trip?token='),
      'http://app.test/trip',
    )
    await request(app()).get(`/api/shared/trips/${mailed}`).expect(200)

    await guide.delete(`/api/guide/trips/${trip.id}/shares/${share.id}`).expect(200)
    const gone = await request(app()).get(`/api/shared/trips/${token}`).expect(410)
    expect(gone.body.error.code).toBe('link_revoked')
    await guide
      .post(`/api/guide/trips/${trip.id}/shares/${share.id}/send`)
      .send({ clientIds: [dana.id] })
      .expect(409)

    const [later] = (
      await guide
        .post(`/api/guide/trips/${trip.id}/shares`)
        .send({ expiresOn: addDays(today, 2) })
        .expect(201)
    ).body.items
    await ctx.db
      .update(tripShares)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(tripShares.id, later.id))
    const laterToken = new URL(later.url).pathname.split('/').pop()!
    expect(
      (await request(app()).get(`/api/shared/trips/${laterToken}`).expect(410)).body.error.code,
    ).toBe('link_expired')
    await request(app())
      .get(`/api/shared/trips/${laterToken.slice(0, -4)}abcd`)
      .expect(404)
  })

  it('shows the client the guide’s name and contact, and the day the link ends at the lake', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'named@guides.test', 'guide')
    expect(
      GuideProfileView.parse((await guide.get('/api/guide/profile').expect(200)).body),
    ).toEqual({ profile: null })
    const bad = await guide.put('/api/guide/profile').send({ name: ' ', email: 'nope' }).expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['email', 'name'])
    const trip = TripView.parse(
      (
        await guide
          .post('/api/guide/trips')
          .send({
            lakeSlug: 'quillmere',
            date: today,
            meetingPoint: 'Cove ramp',
            meetingTime: '06:30',
          })
          .expect(201)
      ).body,
    )
    // Before the guide saves a profile, the trip names nobody and shows no account address.
    expect(trip.guide).toBeNull()
    const saved = await guide
      .put('/api/guide/profile')
      .send({ name: 'Jory Wend', phone: '+1 555 0142', email: 'Trips@Wend.test' })
      .expect(200)
    expect(saved.body.profile).toEqual({
      name: 'Jory Wend',
      phone: '+1 555 0142',
      email: 'trips@wend.test',
    })

    // A lake ten hours east of UTC: the link chosen to end on a day ends at that day's midnight
    // there, which is the afternoon before in UTC, and still reads as the day chosen.
    await ctx.db.update(lakes).set({ timeZone: 'Etc/GMT-10' }).where(eq(lakes.slug, 'quillmere'))
    try {
      const endsOn = addDays(today, 3)
      const [share] = (
        await guide
          .post(`/api/guide/trips/${trip.id}/shares`)
          .send({ expiresOn: endsOn })
          .expect(201)
      ).body.items
      expect(share.expiresOn).toBe(endsOn)
      expect(share.expiresAt).toBe(`${endsOn}T14:00:00.000Z`)
      const token = new URL(share.url).pathname.split('/').pop()!
      const page = SharedTrip.parse(
        (await request(app()).get(`/api/shared/trips/${token}`).expect(200)).body,
      )
      expect(page.guide).toEqual({
        name: 'Jory Wend',
        phone: '+1 555 0142',
        email: 'trips@wend.test',
      })
      expect(page.linkEndsOn).toBe(endsOn)
      expect(JSON.stringify(page)).not.toContain('named@guides.test')

      const jo = ClientView.parse(
        (
          await guide
            .post('/api/guide/clients')
            .send(client({ email: 'jo@client.test' }))
            .expect(201)
        ).body,
      )
      await guide
        .post(`/api/guide/trips/${trip.id}/shares/${share.id}/send`)
        .send({ clientIds: [jo.id] })
        .expect(200)
      const [message] = mail.smtp.messages().filter((m) => m.to.includes('jo@client.test'))
      const [y, m, d] = endsOn.split('-').map(Number)
      const long = new Date(Date.UTC(y!, m! - 1, d!, 12)).toLocaleDateString('en-US', {
        weekday: 'long',
        month: 'long',
        day: 'numeric',
        timeZone: 'UTC',
      })
      expect(message!.text).toContain(`The link works until the end of ${long};`)
      expect(message!.text).toContain('Your guide, Jory Wend, has planned your day')
      expect(message!.text).toContain('Questions before the day: +1 555 0142 or trips@wend.test')
      expect(message!.html).toContain('Your guide, Jory Wend, has planned your day')
    } finally {
      await ctx.db
        .update(lakes)
        .set({ timeZone: 'America/Chicago' })
        .where(eq(lakes.slug, 'quillmere'))
    }
  })
})

describe('bounds on what a guide types', () => {
  it('keeps trip dates within two years and share links within a year, with field messages', async () => {
    const guide = await signedInAgent(app(), ctx.db, 'bounds@guides.test', 'guide')
    const trip = {
      lakeSlug: 'quillmere',
      meetingPoint: 'North ramp',
      meetingTime: '05:45',
    }
    for (const date of ['0001-01-01', '9999-12-31', addDays(today, 800), addDays(today, -800)]) {
      const res = await guide
        .post('/api/guide/trips')
        .send({ ...trip, date })
        .expect(400)
      expect(res.body.error.fields.date, date).toMatch(/within two years/)
    }
    const saved = TripView.parse(
      (
        await guide
          .post('/api/guide/trips')
          .send({ ...trip, date: addDays(today, 600) })
          .expect(201)
      ).body,
    )
    for (const expiresOn of ['9998-12-31', '9999-12-31', addDays(today, 400)]) {
      const res = await guide
        .post(`/api/guide/trips/${saved.id}/shares`)
        .send({ expiresOn })
        .expect(400)
      expect(res.body.error.fields.expiresOn, expiresOn).toMatch(/at most a year/)
    }
    const [share] = (
      await guide
        .post(`/api/guide/trips/${saved.id}/shares`)
        .send({ expiresOn: addDays(today, 300) })
        .expect(201)
    ).body.items
    // One send mails at most 50 clients.
    const many = Array.from(
      { length: 51 },
      (_, i) => `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`,
    )
    const res = await guide
      .post(`/api/guide/trips/${saved.id}/shares/${share.id}/send`)
      .send({ clientIds: many })
      .expect(400)
    expect(res.body.error.fields.clientIds).toMatch(/at most 50/)
  })
})
