import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { users } from '../../server/db/schema/index'
import { createTestDb } from '../helpers/db'
import { signedInAgent, testApp } from '../helpers/app'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let app: ReturnType<typeof testApp>

beforeAll(async () => {
  ctx = await createTestDb()
  app = testApp(ctx.db)
})
afterAll(() => ctx.drop())

describe('roles on the server', () => {
  it('sends 401 to anonymous requests and 403 to an angler on admin routes', async () => {
    const anon = await request(app).get('/api/admin/users').expect(401)
    expect(anon.body.error.code).toBe('unauthenticated')
    await request(app).get('/api/lakes').expect(401)
    const angler = await signedInAgent(app, ctx.db, 'angler@example.test')
    const res = await angler.get('/api/admin/users').expect(403)
    expect(res.body.error).toMatchObject({ code: 'forbidden' })
    await angler.get('/api/lakes').expect(200)
    const guide = await signedInAgent(app, ctx.db, 'guide@example.test', 'guide')
    await guide
      .patch('/api/admin/users/00000000-0000-4000-8000-000000000000')
      .send({ role: 'admin' })
      .expect(403)
  })

  it('lets an admin list, search and change roles, which ends the changed user sessions', async () => {
    const admin = await signedInAgent(app, ctx.db, 'boss@example.test', 'admin')
    const target = await signedInAgent(app, ctx.db, 'promote.me@example.test')
    const list = await admin
      .get('/api/admin/users')
      .query({ q: 'promote', pageSize: 5 })
      .expect(200)
    expect(list.body.total).toBe(1)
    const [user] = list.body.items
    expect(user).not.toHaveProperty('passwordHash')

    const res = await admin.patch(`/api/admin/users/${user.id}`).send({ role: 'guide' }).expect(200)
    expect(res.body.user.role).toBe('guide')
    await target.get('/api/me').expect(401)
    const [row] = await ctx.db.select().from(users).where(eq(users.id, user.id))
    expect(row!.role).toBe('guide')
  })

  it('validates role changes and keeps an admin from demoting themselves', async () => {
    const admin = await signedInAgent(app, ctx.db, 'chief@example.test', 'admin')
    const me = (await admin.get('/api/me').expect(200)).body.user
    const bad = await admin
      .patch('/api/admin/users/not-a-uuid')
      .send({ role: 'captain' })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['id', 'role'])
    const self = await admin.patch(`/api/admin/users/${me.id}`).send({ role: 'angler' }).expect(409)
    expect(self.body.error.code).toBe('own_admin_role')
    await admin
      .patch('/api/admin/users/00000000-0000-4000-8000-000000000000')
      .send({ role: 'guide' })
      .expect(404)
  })
})
