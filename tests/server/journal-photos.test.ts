import { count, eq } from 'drizzle-orm'
import exifr from 'exifr'
import sharp from 'sharp'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Position } from '../../shared/geo/types'
import { CatchView, PhotoUpload } from '../../shared/schemas/journal'
import { catchPhotos, lakes } from '../../server/db/schema/index'
import { seedDemo } from '../../server/db/seed/index'
import { takenInstant } from '../../server/features/journal/photo-process'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'
import { cameraPhoto } from '../helpers/camera-photo'
import { startTestS3, type TestS3 } from '../helpers/s3'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let s3: TestS3
let app: ReturnType<typeof testApp>
let shore: Position[]
let timeZone: string

const photoRows = async () => (await ctx.db.select({ n: count() }).from(catchPhotos))[0]!.n

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
  s3 = await startTestS3()
  app = testApp(ctx.db, { photos: s3.photos })
  const [lake] = await ctx.db.select().from(lakes).where(eq(lakes.slug, 'quillmere'))
  shore = (lake!.shoreline as { coordinates: Position[][] }).coordinates[0]!
  timeZone = lake!.timeZone
})
afterAll(async () => {
  await s3.close()
  await ctx.drop()
})

describe('catch photos', () => {
  it('read the time and place from EXIF, then store copies that carry no location', async () => {
    const angler = await signedInAgent(app, ctx.db, 'photo@journal.test')
    const bank = (
      await angler
        .post('/api/lakes/quillmere/banks')
        .send({ name: 'Photo point', points: [shore[20], shore[23]], cover: ['wood'] })
        .expect(201)
    ).body
    const jpeg = await cameraPhoto({ at: '2026:05:06 07:30:00', gps: shore[21] })
    expect(await exifr.gps(jpeg)).toBeTruthy()

    const res = await angler
      .post('/api/journal/photos')
      .attach('file', jpeg, { filename: 'IMG_0001.JPG', contentType: 'image/jpeg' })
      .expect(201)
    const up = PhotoUpload.parse(res.body)
    expect(up.nearestBank).toEqual({ id: bank.id, name: 'Photo point', lakeSlug: 'quillmere' })
    expect(up.position![0]).toBeCloseTo(shore[21]![0], 4)
    expect(up.position![1]).toBeCloseTo(shore[21]![1], 4)
    // The camera's 07:30 is wall-clock time at the lake, in its own time zone.
    expect(up.takenAt).toBe(
      takenInstant({ local: '2026-05-06T07:30:00', offset: null }, timeZone)!.toISOString(),
    )
    expect(up.takenAt).not.toBe('2026-05-06T07:30:00.000Z')
    expect(Math.max(up.width, up.height)).toBe(1600)

    // Every stored copy: resized, and with no GPS (no EXIF at all).
    const keys = (await s3.keys()).filter((k) => k.includes(up.id))
    expect(keys.sort()).toEqual([
      expect.stringMatching(/display\.jpg$/),
      expect.stringMatching(/thumb\.jpg$/),
    ])
    for (const key of keys) {
      const stored = await s3.photos.get(key)
      expect(await exifr.gps(stored)).toBeUndefined()
      expect((await sharp(stored).metadata()).exif).toBeUndefined()
    }
    const thumb = await angler.get(up.thumbUrl).expect(200)
    expect(thumb.headers['content-type']).toBe('image/jpeg')
    const meta = await sharp(thumb.body as Buffer).metadata()
    expect(Math.max(meta.width, meta.height)).toBe(320)
    expect(await exifr.gps(thumb.body as Buffer)).toBeUndefined()

    // Logged with its catch, the photo shows on the entry; nobody else can open it.
    const made = CatchView.parse(
      (
        await angler
          .post('/api/journal/catches')
          .send({
            lakeSlug: 'quillmere',
            caughtAt: new Date(Date.now() - 60_000).toISOString(),
            species: 'spotted',
            lengthM: 0.33,
            released: true,
            lure: { family: 'jig' },
            bankId: up.nearestBank!.id,
            photoId: up.id,
          })
          .expect(201)
      ).body,
    )
    expect(made.photo?.id).toBe(up.id)
    const other = await signedInAgent(app, ctx.db, 'peeker@journal.test')
    await other.get(up.displayUrl).expect(404)
    await request(app).get(up.displayUrl).expect(401)

    // A photo goes with one catch only.
    const again = await angler
      .post('/api/journal/catches')
      .send({
        lakeSlug: 'quillmere',
        caughtAt: new Date().toISOString(),
        species: 'spotted',
        lengthM: 0.3,
        released: true,
        lure: { family: 'jig' },
        photoId: up.id,
      })
      .expect(400)
    expect(again.body.error.fields.photoId).toBeTruthy()

    // Deleting the catch deletes the stored copies.
    await angler.delete(`/api/journal/catches/${made.id}`).expect(204)
    expect((await s3.keys()).filter((k) => k.includes(up.id))).toEqual([])
  })

  it.each([
    ['a text file named like a photo', Buffer.from('not a photo at all'), 'notes.jpg', 415],
    ['a GIF', Buffer.from('GIF89a'), 'fish.gif', 415],
    ['a file over 12 MB', Buffer.alloc(13 * 1024 * 1024, 1), 'huge.jpg', 413],
  ])('refuse %s with a message, and store nothing', async (_what, data, filename, status) => {
    const angler = await signedInAgent(
      app,
      ctx.db,
      `refused-${status}-${filename.length}@journal.test`,
    )
    const [rows, keys] = [await photoRows(), (await s3.keys()).length]
    const res = await angler
      .post('/api/journal/photos')
      .attach('file', data, { filename })
      .expect(status)
    expect(res.body.error.fields.file).toBeTruthy()
    expect(await photoRows()).toBe(rows)
    expect((await s3.keys()).length).toBe(keys)
  })

  it('without EXIF leave the time and bank to the angler', async () => {
    const angler = await signedInAgent(app, ctx.db, 'plain@journal.test')
    const bare = await sharp({
      create: { width: 300, height: 200, channels: 3, background: '#777' },
    })
      .png()
      .toBuffer()
    const res = await angler
      .post('/api/journal/photos')
      .attach('file', bare, 'fish.png')
      .expect(201)
    expect(res.body).toMatchObject({ takenAt: null, position: null, nearestBank: null, width: 300 })
  })

  it('are not offered where no store is set up', async () => {
    const bare = testApp(ctx.db)
    const angler = await signedInAgent(bare, ctx.db, 'nostore@journal.test')
    const res = await angler
      .post('/api/journal/photos')
      .attach('file', await cameraPhoto({ width: 400 }), 'fish.jpg')
      .expect(503)
    expect(res.body.error.message).toMatch(/Photos/)
  })
})
