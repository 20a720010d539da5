import { randomUUID } from 'node:crypto'
import { count, eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Position } from '../../shared/geo/types'
import { addDays, localDate } from '../../shared/time'
import { CatchList, CatchView } from '../../shared/schemas/journal'
import { catches, lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let app: ReturnType<typeof testApp>
let shore: Position[]

const aCatch = (over: Record<string, unknown> = {}) => ({
  lakeSlug: 'quillmere',
  caughtAt: new Date(Date.now() - 3_600_000).toISOString(),
  species: 'largemouth',
  lengthM: 0.42,
  weightKg: 1.3,
  released: true,
  lure: { family: 'spinnerbait', blade: 'colorado', color: 'white', size: '3/8 oz' },
  note: 'Off the rock point',
  ...over,
})

const catchCount = async () => (await ctx.db.select({ n: count() }).from(catches))[0]!.n

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  app = testApp(ctx.db)
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  shore = (lake!.shoreline as { coordinates: Position[][] }).coordinates[0]!
})
afterAll(() => ctx.drop())

describe('the catch journal', () => {
  it('logs a catch in SI units and lists, reads, edits and deletes it', async () => {
    const angler = await signedInAgent(app, ctx.db, 'logger@journal.test')
    const made = CatchView.parse(
      (await angler.post('/api/journal/catches').send(aCatch()).expect(201)).body,
    )
    expect(made).toMatchObject({
      species: 'largemouth',
      lengthM: 0.42,
      weightKg: 1.3,
      released: true,
    })
    expect(made.lure).toMatchObject({ family: 'spinnerbait', blade: 'colorado', trailerHook: null })
    expect(made.lake.slug).toBe('quillmere')

    const list = CatchList.parse((await angler.get('/api/journal/catches').expect(200)).body)
    expect(list.items.map((c) => c.id)).toEqual([made.id])
    expect(list.total).toBe(1)

    const edited = await angler
      .put(`/api/journal/catches/${made.id}`)
      .send(aCatch({ released: false, weightKg: null }))
      .expect(200)
    expect(edited.body).toMatchObject({ released: false, weightKg: null, lengthM: 0.42 })

    await angler.delete(`/api/journal/catches/${made.id}`).expect(204)
    await angler.get(`/api/journal/catches/${made.id}`).expect(404)
  })

  it('keeps a journal private: another angler and an admin find nothing', async () => {
    const owner = await signedInAgent(app, ctx.db, 'owner@journal.test')
    const other = await signedInAgent(app, ctx.db, 'other@journal.test')
    const admin = await signedInAgent(app, ctx.db, 'admin@journal.test', 'admin')
    const { id } = (await owner.post('/api/journal/catches').send(aCatch()).expect(201)).body
    for (const who of [other, admin]) {
      await who.get(`/api/journal/catches/${id}`).expect(404)
      await who.put(`/api/journal/catches/${id}`).send(aCatch()).expect(404)
      await who.delete(`/api/journal/catches/${id}`).expect(404)
      expect((await who.get('/api/journal/catches').expect(200)).body.items).toEqual([])
    }
    await owner.get(`/api/journal/catches/${id}`).expect(200)
  })

  it.each([
    ['no length or weight', { lengthM: null, weightKg: null }, 'lengthM'],
    ['a length in inches sent as metres', { lengthM: 18 }, 'lengthM'],
    ['a weight of nothing', { weightKg: 0 }, 'weightKg'],
    ['a weight in pounds past any bass', { weightKg: 22 }, 'weightKg'],
    ['an unknown species', { species: 'pike' }, 'species'],
    ['no lure', { lure: { family: '' } }, 'lure.family'],
    [
      'a blade the tackle does not know',
      { lure: { family: 'spinnerbait', blade: 'spoon' } },
      'lure.blade',
    ],
    ['a NUL in the note', { note: 'rock\u0000point' }, 'note'],
    ['a control character in the lure', { lure: { family: 'jig\u001b[31m' } }, 'lure.family'],
    [
      'a line break in the colour',
      { lure: { family: 'jig', color: 'green\npumpkin' } },
      'lure.color',
    ],
    ['a note past 1,000 characters', { note: 'x'.repeat(1001) }, 'note'],
    ['no time', { caughtAt: 'yesterday' }, 'caughtAt'],
    ['a time tomorrow', { caughtAt: new Date(Date.now() + 86_400_000).toISOString() }, 'caughtAt'],
    ['a lake that does not exist', { lakeSlug: 'nowhere' }, 'lakeSlug'],
    ['a bank that is not theirs', { bankId: '00000000-0000-4000-8000-000000000000' }, 'bankId'],
    ['a trip from an angler', { tripId: '00000000-0000-4000-8000-000000000000' }, 'tripId'],
    ['a photo never uploaded', { photoId: '00000000-0000-4000-8000-000000000000' }, 'photoId'],
    ['a position off the globe', { position: [200, 10] }, 'position.0'],
    ['released as a word', { released: 'yes' }, 'released'],
    ['a catch id that is not a UUID', { clientId: 'phone-1' }, 'clientId'],
  ])('refuses %s with a 400 on its field and writes nothing', async (_what, over, field) => {
    const angler = await signedInAgent(app, ctx.db, `bad-${field}-${Math.random()}@journal.test`)
    const before = await catchCount()
    const res = await angler.post('/api/journal/catches').send(aCatch(over)).expect(400)
    expect(res.body.error.fields[field], JSON.stringify(res.body)).toBeTruthy()
    expect(await catchCount()).toBe(before)
  })

  it('logs a catch sent again with the same clientId once, answering the first one', async () => {
    const angler = await signedInAgent(app, ctx.db, 'replay@journal.test')
    const other = await signedInAgent(app, ctx.db, 'replay-other@journal.test')
    const clientId = randomUUID()
    const mine = (n: number) =>
      ctx.db
        .select({ n: count() })
        .from(catches)
        .where(eq(catches.clientId, clientId))
        .then(([r]) => expect(r!.n).toBe(n))

    const first = CatchView.parse(
      (await angler.post('/api/journal/catches').send(aCatch({ clientId })).expect(201)).body,
    )
    expect(first.clientId).toBe(clientId)
    // The phone did not hear the answer and sends it again, twice at once: the same catch, 200.
    const again = await Promise.all(
      [1, 2].map(() => angler.post('/api/journal/catches').send(aCatch({ clientId }))),
    )
    for (const res of again) {
      expect(res.status).toBe(200)
      expect(res.body.id).toBe(first.id)
    }
    await mine(1)
    // An edit keeps the id: a late resend still finds the catch.
    await angler
      .put(`/api/journal/catches/${first.id}`)
      .send(aCatch({ released: false }))
      .expect(200)
    const late = await angler.post('/api/journal/catches').send(aCatch({ clientId })).expect(200)
    expect(late.body).toMatchObject({ id: first.id, released: false })
    await mine(1)

    // Another angler's catch is never found by its id: theirs is a catch of their own.
    const theirs = await other.post('/api/journal/catches').send(aCatch({ clientId })).expect(201)
    expect(theirs.body.id).not.toBe(first.id)
    await mine(2)
  })

  it("takes a catch on one of the angler's banks, and a position", async () => {
    const angler = await signedInAgent(app, ctx.db, 'banked@journal.test')
    const bank = (
      await angler
        .post('/api/lakes/quillmere/banks')
        .send({ name: 'Journal point', points: [shore[5], shore[8]], cover: ['rock'] })
        .expect(201)
    ).body
    const made = await angler
      .post('/api/journal/catches')
      .send(aCatch({ bankId: bank.id, position: shore[6] }))
      .expect(201)
    expect(made.body.bank).toEqual({ id: bank.id, name: 'Journal point' })
    expect(made.body.position).toEqual(shore[6])
  })
})

describe("catches on a guide's trip", () => {
  it("are the guide's, shown on the trip, and to its clients through the share link only", async () => {
    const guide = await signedInAgent(app, ctx.db, 'guide@trips.journal.test', 'guide')
    const other = await signedInAgent(app, ctx.db, 'other@trips.journal.test', 'guide')
    const admin = await signedInAgent(app, ctx.db, 'admin@trips.journal.test', 'admin')
    const bank = (
      await guide
        .post('/api/lakes/quillmere/banks')
        .send({ name: 'Trip point', points: [shore[5], shore[8]], cover: ['rock'] })
        .expect(201)
    ).body
    const today = new Date().toISOString().slice(0, 10)
    const trip = (
      await guide
        .post('/api/guide/trips')
        .send({
          lakeSlug: 'quillmere',
          date: today,
          meetingPoint: 'Ramp',
          meetingTime: '06:00',
          bankIds: [bank.id],
        })
        .expect(201)
    ).body
    const logged = (
      await guide
        .post('/api/journal/catches')
        .send(aCatch({ tripId: trip.id, position: shore[6] }))
        .expect(201)
    ).body
    expect(logged.tripId).toBe(trip.id)

    // Another guide cannot log on it, nor log one on another lake.
    await other
      .post('/api/journal/catches')
      .send(aCatch({ tripId: trip.id }))
      .expect(400)
    const wrongLake = await guide
      .post('/api/journal/catches')
      .send(aCatch({ tripId: trip.id, lakeSlug: 'vessandra' }))
      .expect(400)
    expect(wrongLake.body.error.fields.tripId).toMatch(/another lake/)

    const onTrip = await guide.get(`/api/guide/trips/${trip.id}/catches`).expect(200)
    expect(onTrip.body.items.map((c: { id: string }) => c.id)).toEqual([logged.id])
    await other.get(`/api/guide/trips/${trip.id}/catches`).expect(404)
    await admin.get(`/api/guide/trips/${trip.id}/catches`).expect(404)

    const share = (
      await guide
        .post(`/api/guide/trips/${trip.id}/shares`)
        .send({ expiresOn: addDays(localDate(new Date(), 'UTC'), 30) })
        .expect(201)
    ).body.items[0]
    const token = new URL(share.url).pathname.split('/').pop()!
    const client = await request(app).get(`/api/shared/trips/${token}/catches`).expect(200)
    expect(client.body.items).toHaveLength(1)
    expect(client.body.items[0]).toMatchObject({ id: logged.id, position: null })

    await guide.delete(`/api/guide/trips/${trip.id}/shares/${share.id}`).expect(200)
    await request(app).get(`/api/shared/trips/${token}/catches`).expect(410)
    await request(app).get('/api/shared/trips/not-a-real-token-at-all/catches').expect(404)
  })
})
