import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { addDays } from '../../shared/time'
import { seedDemo } from '../../server/db/seed/index'
import { lakes } from '../../server/db/schema/index'
import { signedInAgent, testApp } from '../helpers/app'
import { createTestDb } from '../helpers/db'

/**
 * Every API route × who asks, generated from the app's own route table: a route with no row here
 * fails the test, so a new route cannot ship without saying who may call it.
 *
 * `ok` means the request got past authorization (any status but 401 and 403; with the empty bodies
 * used here that is often a 400). 404 for another user's row shows ownership, not just role.
 */
type Who = 'anonymous' | 'angler' | 'guide' | 'otherGuide' | 'admin'
type Expect = 401 | 403 | 404 | 'ok'
const WHO: Who[] = ['anonymous', 'angler', 'otherGuide', 'admin', 'guide']

const anyone = {
  anonymous: 'ok',
  angler: 'ok',
  guide: 'ok',
  otherGuide: 'ok',
  admin: 'ok',
} as const
const signedIn = { ...anyone, anonymous: 401 } as const
const admins = { anonymous: 401, angler: 403, guide: 403, otherGuide: 403, admin: 'ok' } as const
const guides = { ...signedIn, angler: 403 } as const
/** A row the guide owns: nobody else finds it, admins included. */
const guideOwns = { anonymous: 401, angler: 403, guide: 'ok', otherGuide: 404, admin: 404 } as const
/** A bank the guide saved (banks are every angler's, each their own). */
const bankOwner = { ...guideOwns, angler: 404 } as const

const MATRIX: Record<string, Record<Who, Expect>> = {
  'GET /health': anyone,
  'POST /auth/signup': anyone,
  'POST /auth/signup/confirm': anyone,
  'POST /auth/signin': anyone,
  'POST /auth/signout': anyone,
  'GET /me': signedIn,
  'POST /me/password': signedIn,
  'GET /admin/users': admins,
  'PATCH /admin/users/:id': admins,
  'GET /lakes': signedIn,
  'GET /lakes/names': signedIn,
  'GET /lakes/:slug/shoreline': signedIn,
  'GET /lakes/:slug/series': signedIn,
  'PUT /lakes/:slug/subscription': signedIn,
  'DELETE /lakes/:slug/subscription': signedIn,
  'GET /lakes/:slug/read': signedIn,
  'GET /lakes/:slug/plan/:date': signedIn,
  'GET /lakes/:slug/banks': signedIn,
  'POST /lakes/:slug/banks': signedIn,
  'PUT /lakes/:slug/banks/:id': bankOwner,
  'DELETE /lakes/:slug/banks/:id': bankOwner,
  'GET /admin/stations': admins,
  'POST /admin/stations': admins,
  'PUT /admin/stations/:id': admins,
  'POST /admin/stations/:id/run': admins,
  'POST /admin/stations/:id/readings': admins,
  'GET /admin/stations/history': admins,
  'GET /me/settings': signedIn,
  'PUT /me/settings': signedIn,
  'GET /me/brief': signedIn,
  'PUT /me/brief': signedIn,
  'POST /me/brief/verification': signedIn,
  'POST /brief/verify': anyone,
  'POST /brief/unsubscribe': anyone,
  'GET /brief/unsubscribe': anyone,
  'GET /admin/brief-deliveries': admins,
  'GET /admin/mailbox': admins,
  'GET /admin/mailbox/:id': admins,
  'GET /guide/profile': guides,
  'PUT /guide/profile': guides,
  'GET /guide/clients': guides,
  'POST /guide/clients': guides,
  'POST /guide/clients/import': guides,
  'PUT /guide/clients/:id': guideOwns,
  'DELETE /guide/clients/:id': guideOwns,
  'GET /guide/trips': guides,
  'POST /guide/trips': guides,
  'GET /guide/trips/:id': guideOwns,
  'PUT /guide/trips/:id': guideOwns,
  'DELETE /guide/trips/:id': guideOwns,
  'POST /guide/trips/:id/shares': guideOwns,
  'DELETE /guide/trips/:id/shares/:shareId': guideOwns,
  'POST /guide/trips/:id/shares/:shareId/send': guideOwns,
  'GET /shared/trips/:token': anyone,
  'GET /admin/audit': admins,
  'GET /admin/quarantine': admins,
  'POST /admin/quarantine/:id/release': admins,
  'POST /admin/quarantine/:id/discard': admins,
  'POST /admin/lakes/shoreline-preview': admins,
  'POST /admin/lakes': admins,
  'GET /admin/lakes/:slug': admins,
  'PUT /admin/lakes/:slug': admins,
  'POST /admin/lakes/:slug/shoreline': admins,
  'GET /admin/lakes/:slug/recompute': admins,
  'GET /journal/catches': signedIn,
  'POST /journal/catches': signedIn,
  'GET /journal/catches/:id': bankOwner,
  'PUT /journal/catches/:id': bankOwner,
  'DELETE /journal/catches/:id': bankOwner,
  'GET /guide/trips/:id/catches': guideOwns,
  'GET /shared/trips/:token/catches': anyone,
  'POST /journal/photos': signedIn,
  'GET /journal/insights': signedIn,
  'GET /journal/export.csv': signedIn,
  'POST /journal/import': signedIn,
  'GET /journal/photos/:id/:size': signedIn,
  'GET /shared/trips/:token/photos/:id/:size': anyone,
  'GET /watches': signedIn,
  'POST /watches': signedIn,
  'PUT /watches/:id': bankOwner,
  'PATCH /watches/:id': bankOwner,
  'DELETE /watches/:id': bankOwner,
  'POST /watch/unsubscribe': anyone,
  'GET /watch/unsubscribe': anyone,
  'GET /admin/alerts': admins,
  'GET /push/key': signedIn,
  'PUT /me/push': signedIn,
  'DELETE /me/push': signedIn,
  'GET /admin/pushbox': admins,
}

type Layer = {
  route?: { path: string; methods: Record<string, boolean> }
  handle: { stack?: Layer[] }
}

/** METHOD path of every route mounted under /api, read from the Express app. */
function apiRoutes(app: unknown): { method: string; path: string }[] {
  const stack = (app as { router: { stack: Layer[] } }).router.stack
  const api = stack.find((l) => l.handle.stack?.some((r) => r.handle.stack))!
  return api.handle.stack!.flatMap((router) =>
    (router.handle.stack ?? []).flatMap((l) =>
      l.route
        ? Object.keys(l.route.methods)
            .filter((m) => m !== '_all')
            .map((m) => ({ method: m.toUpperCase(), path: l.route!.path }))
        : [],
    ),
  )
}

let ctx: Awaited<ReturnType<typeof createTestDb>>
beforeAll(async () => {
  ctx = await createTestDb()
  await seedDemo(ctx.db)
})
afterAll(() => ctx.drop())

describe('the authorization matrix', () => {
  it(
    'has a row for every API route, and every route answers each caller as its row says',
    { timeout: 60_000 },
    async () => {
      const app = testApp(ctx.db)
      const routes = apiRoutes(app)
      const missing = routes.map((r) => `${r.method} ${r.path}`).filter((key) => !MATRIX[key])
      expect(missing, 'routes without a row in the matrix').toEqual([])
      expect(routes.length).toBe(Object.keys(MATRIX).length)

      const agents = {
        anonymous: request.agent(app),
        angler: await signedInAgent(app, ctx.db, 'm-angler@matrix.test'),
        guide: await signedInAgent(app, ctx.db, 'm-guide@matrix.test', 'guide'),
        otherGuide: await signedInAgent(app, ctx.db, 'm-other@matrix.test', 'guide'),
        admin: await signedInAgent(app, ctx.db, 'm-admin@matrix.test', 'admin'),
      }
      const target = await signedInAgent(app, ctx.db, 'm-target@matrix.test')
      const targetId = (await target.get('/api/me')).body.user.id as string

      // The guide's own rows, for the routes that name one.
      const [lake] = await ctx.db.select().from(lakes)
      const shore = (lake!.shoreline as { coordinates: [number, number][][] }).coordinates[0]!
      const bankBody = { name: 'Matrix point', points: [shore[5], shore[8]], cover: ['rock'] }
      const bank = (
        await agents.guide.post(`/api/lakes/${lake!.slug}/banks`).send(bankBody).expect(201)
      ).body.id as string
      const clientBody = { name: 'Matrix Client', email: 'client@matrix.test' }
      const client = (await agents.guide.post('/api/guide/clients').send(clientBody).expect(201))
        .body.id as string
      const watchBody = {
        name: 'Matrix watch',
        lakeSlug: lake!.slug,
        bankId: bank,
        conditions: {},
        channels: ['push'],
      }
      const watch = (await agents.guide.post('/api/watches').send(watchBody).expect(201)).body
        .id as string
      const today = new Date().toISOString().slice(0, 10)
      // A link lasts at most a year.
      const expiresOn = addDays(today, 30)
      const tripBody = {
        lakeSlug: lake!.slug,
        date: today,
        meetingPoint: 'Ramp',
        meetingTime: '06:00',
        bankIds: [bank],
      }
      const trip = (await agents.guide.post('/api/guide/trips').send(tripBody).expect(201)).body
        .id as string
      const share = (
        await agents.guide.post(`/api/guide/trips/${trip}/shares`).send({ expiresOn }).expect(201)
      ).body.items[0]
      const token = new URL(share.url).pathname.split('/').pop()!
      const catchBody = {
        lakeSlug: lake!.slug,
        caughtAt: new Date().toISOString(),
        species: 'largemouth',
        lengthM: 0.4,
        released: true,
        lure: { family: 'spinnerbait' },
      }
      const caught = (await agents.guide.post('/api/journal/catches').send(catchBody).expect(201))
        .body.id as string

      const concrete = (path: string) =>
        `/api${path}`
          .replace(':slug', lake!.slug)
          .replace(':date', today)
          .replace(':token', token)
          .replace(':shareId', share.id)
          .replace(':size', 'thumb')
          .replace(
            ':id',
            path.startsWith('/lakes/')
              ? bank
              : path.startsWith('/journal/catches')
                ? caught
                : path.startsWith('/guide/clients')
                  ? client
                  : path.startsWith('/guide/trips')
                    ? trip
                    : path.startsWith('/watches')
                      ? watch
                      : path.startsWith('/admin/mailbox') || path.startsWith('/admin/quarantine')
                        ? '1'
                        : targetId,
          )
      /** Valid bodies where a route checks ownership after the body: otherwise validation answers first. */
      const bodies: Record<string, object> = {
        'PUT /lakes/:slug/banks/:id': bankBody,
        'PUT /guide/profile': { name: 'Matrix Guide', phone: '', email: '' },
        'PUT /guide/clients/:id': clientBody,
        'PUT /guide/trips/:id': tripBody,
        'POST /guide/trips/:id/shares': { expiresOn },
        'POST /guide/trips/:id/shares/:shareId/send': { clientIds: [client] },
        'PATCH /admin/users/:id': { role: 'angler' },
        'PUT /journal/catches/:id': catchBody,
        'PUT /watches/:id': watchBody,
        'PATCH /watches/:id': { active: true },
      }
      const body = (method: string, path: string) => bodies[`${method} ${path}`] ?? {}

      // Deletions late, the most nested first, so each route still finds the rows it names; signing
      // out ends the sessions, so it goes last of all.
      const rank = (r: { method: string; path: string }) =>
        r.path === '/auth/signout' ? 2 : r.method === 'DELETE' ? 1 : 0
      const order = [...routes].sort(
        (a, b) => rank(a) - rank(b) || (rank(a) === 1 ? b.path.length - a.path.length : 0),
      )
      const wrong: string[] = []
      for (const { method, path } of order) {
        const key = `${method} ${path}`
        for (const who of WHO) {
          const res = await agents[who][method.toLowerCase() as 'get'](concrete(path)).send(
            body(method, path),
          )
          const expected = MATRIX[key]![who]
          const fine =
            expected === 'ok' ? res.status !== 401 && res.status !== 403 : res.status === expected
          if (!fine) wrong.push(`${key} as ${who}: expected ${expected}, got ${res.status}`)
        }
      }
      expect(wrong).toEqual([])
    },
  )
})
