import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEFAULT_SETTINGS } from '../../shared/format'
import { seedDemo } from '../../server/db/seed/index'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

let ctx: Awaited<ReturnType<typeof createTestDb>>

beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
})
afterAll(() => ctx.drop())

describe('GET and PUT /api/me/settings', () => {
  it('starts from the defaults, saves a full set and keeps it per user', async () => {
    const app = testApp(ctx.db)
    const me = await signedInAgent(app, ctx.db, 'units@example.test')
    expect((await me.get('/api/me/settings').expect(200)).body).toEqual(DEFAULT_SETTINGS)
    const metric = {
      temperature: 'C',
      length: 'm',
      speed: 'knots',
      clock: '24h',
      homeLakeSlug: 'quillmere',
    }
    expect((await me.put('/api/me/settings').send(metric).expect(200)).body).toEqual(metric)
    expect((await me.get('/api/me/settings').expect(200)).body).toEqual(metric)
    const other = await signedInAgent(app, ctx.db, 'someone@example.test')
    expect((await other.get('/api/me/settings').expect(200)).body).toEqual(DEFAULT_SETTINGS)
  })

  it('answers bad values with a message per field and saves nothing', async () => {
    const app = testApp(ctx.db)
    const me = await signedInAgent(app, ctx.db, 'typo@example.test')
    const bad = await me
      .put('/api/me/settings')
      .send({ temperature: 'K', length: 'yd', speed: 'mph', clock: '12h', homeLakeSlug: null })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['length', 'temperature'])
    const unknown = await me
      .put('/api/me/settings')
      .send({ ...DEFAULT_SETTINGS, homeLakeSlug: 'atlantis' })
      .expect(400)
    expect(unknown.body.error.fields.homeLakeSlug).toBe('No such lake.')
    expect((await me.get('/api/me/settings').expect(200)).body).toEqual(DEFAULT_SETTINGS)
    await request(app).get('/api/me/settings').expect(401)
  })
})
