import { Writable } from 'node:stream'
import { count, eq } from 'drizzle-orm'
import { pino } from 'pino'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { users } from '../../server/db/schema/index'
import { allowedOrigins, loadEnv } from '../../server/env'
import { SESSION_COOKIE } from '../../server/features/auth/auth.tokens'
import { createTestDb } from '../helpers/db'
import { createUser, PASSWORD, signedInAgent, testApp } from '../helpers/app'
import { linkToken, startTestMail, TEST_ORIGIN, type TestMail } from '../helpers/mail'

let ctx: Awaited<ReturnType<typeof createTestDb>>
let app: ReturnType<typeof testApp>
let mail: TestMail
const logLines: string[] = []

beforeAll(async () => {
  ctx = await createTestDb()
  mail = await startTestMail()
  const sink = new Writable({
    write(chunk, _enc, done) {
      logLines.push(String(chunk))
      done()
    },
  })
  app = testApp(ctx.db, { logger: pino({ level: 'info' }, sink), mail: mail.mail })
})
afterAll(async () => {
  await mail.close()
  await ctx.drop()
})

/** The message the stand-in caught for `to` with a subject matching `subject`, once it comes. */
async function mailTo(to: string, subject: RegExp) {
  return vi.waitFor(() => {
    const found = mail.smtp.messages().find((m) => m.to.includes(to) && subject.test(m.subject))
    if (!found) throw new Error(`no mail to ${to} yet`)
    return found
  })
}

/** Signs up through the API and the mailed link; the confirm answer carries the session. */
async function signUpByMail(email: string, password = PASSWORD) {
  await request(app).post('/api/auth/signup').send({ email, password }).expect(202)
  const message = await mailTo(email.trim().toLowerCase(), /finish your Chopline account/)
  const token = linkToken(message.text, `${TEST_ORIGIN}/welcome`)
  return request(app).post('/api/auth/signup/confirm').send({ token })
}

function sessionCookie(res: request.Response): string {
  const raw = ([] as string[]).concat(res.headers['set-cookie'] ?? [])
  const cookie = raw.find((c) => c.startsWith(`${SESSION_COOKIE}=`))
  if (!cookie) throw new Error('no session cookie')
  return cookie
}

describe('sign-up, sign-in, sign-out', () => {
  it('round-trips a session through an httpOnly, SameSite=Lax cookie', async () => {
    const signup = await signUpByMail('  Casey@Example.TEST ')
    expect(signup.status).toBe(201)
    expect(signup.body.user).toMatchObject({ email: 'casey@example.test', role: 'angler' })
    expect(Object.keys(signup.body.user).sort()).toEqual(['createdAt', 'email', 'id', 'role'])
    const cookie = sessionCookie(signup)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)

    const signin = await request(app)
      .post('/api/auth/signin')
      .send({ email: 'casey@example.test', password: PASSWORD })
      .expect(200)
    const session = sessionCookie(signin).split(';')[0]!
    // The token travels only in the cookie, never in a body.
    expect(JSON.stringify(signin.body)).not.toContain(session.split('=')[1])

    const me = await request(app).get('/api/me').set('Cookie', session).expect(200)
    expect(me.body.user.email).toBe('casey@example.test')

    await request(app).post('/api/auth/signout').set('Cookie', session).expect(204)
    // The same token after sign-out is a revoked session.
    const after = await request(app).get('/api/me').set('Cookie', session).expect(401)
    expect(after.body.error.code).toBe('unauthenticated')
  })

  it('answers an unknown e-mail and a wrong password the same way', async () => {
    await createUser(ctx.db, 'jo@example.test')
    const wrong = await request(app)
      .post('/api/auth/signin')
      .send({ email: 'jo@example.test', password: 'not the password' })
      .expect(401)
    const unknown = await request(app)
      .post('/api/auth/signin')
      .send({ email: 'nobody@example.test', password: 'not the password' })
      .expect(401)
    expect(wrong.body).toEqual(unknown.body)
    expect(wrong.body.error.code).toBe('invalid_credentials')
  })

  it('answers sign-up the same whether the address has an account, and tells only its mailbox', async () => {
    await createUser(ctx.db, 'dup@example.test')
    const taken = await request(app)
      .post('/api/auth/signup')
      .send({ email: 'DUP@example.test', password: 'a different password' })
      .expect(202)
    const fresh = await request(app)
      .post('/api/auth/signup')
      .send({ email: 'new@example.test', password: 'a different password' })
      .expect(202)
    expect(Object.keys(taken.body)).toEqual(Object.keys(fresh.body))
    expect(taken.headers['set-cookie']).toBeUndefined()
    expect(fresh.headers['set-cookie']).toBeUndefined()
    // No account exists until the link is opened; the owner of the taken address is told.
    expect(await ctx.db.$count(users, eq(users.email, 'new@example.test'))).toBe(0)
    const notice = await mailTo('dup@example.test', /already have a Chopline account/)
    expect(notice.text).toContain(`${TEST_ORIGIN}/signin`)
    expect(notice.text).not.toContain('/welcome')
    // The existing password still works; the one typed at sign-up does not.
    await request(app)
      .post('/api/auth/signin')
      .send({ email: 'dup@example.test', password: 'a different password' })
      .expect(401)
    await request(app)
      .post('/api/auth/signin')
      .send({ email: 'dup@example.test', password: PASSWORD })
      .expect(200)
  })

  it('makes the account from the mailed link once, with the address confirmed', async () => {
    const first = await signUpByMail('once@example.test')
    expect(first.status).toBe(201)
    const [row] = await ctx.db.select().from(users).where(eq(users.email, 'once@example.test'))
    expect(row!.emailVerifiedAt).not.toBeNull()
    const message = await mailTo('once@example.test', /finish your Chopline account/)
    const token = linkToken(message.text, `${TEST_ORIGIN}/welcome`)
    // The hash travels sealed: the link holds no readable trace of it.
    expect(token).not.toContain(row!.passwordHash)
    expect(Buffer.from(token.split('.')[0]!, 'base64url').toString()).toContain('A256GCM')
    const again = await request(app).post('/api/auth/signup/confirm').send({ token }).expect(409)
    expect(again.body.error.code).toBe('already_confirmed')
    const forged = await request(app)
      .post('/api/auth/signup/confirm')
      .send({ token: `${token.slice(0, -6)}AAAAAA` })
      .expect(400)
    expect(forged.body.error.code).toBe('invalid_link')
  })

  it('rejects a forged token', async () => {
    const res = await request(app)
      .get('/api/me')
      .set('Cookie', `${SESSION_COOKIE}=eyJhbGciOiJIUzI1NiJ9.eyJzdWIiOiJ4Iiwic2lkIjoieSJ9.bad`)
      .expect(401)
    expect(res.body.error.code).toBe('unauthenticated')
  })

  it('ends every session when the password changes', async () => {
    const agent = await signedInAgent(app, ctx.db, 'pat@example.test')
    const other = request.agent(app)
    await other
      .post('/api/auth/signin')
      .send({ email: 'pat@example.test', password: PASSWORD })
      .expect(200)
    await agent
      .post('/api/me/password')
      .send({ currentPassword: PASSWORD, newPassword: 'a brand new password' })
      .expect(200)
    await other.get('/api/me').expect(401)
    // The agent that changed it holds the fresh session.
    await agent.get('/api/me').expect(200)
    const wrong = await agent
      .post('/api/me/password')
      .send({ currentPassword: 'nope', newPassword: 'another new password' })
      .expect(400)
    expect(wrong.body.error.fields.currentPassword).toBeTruthy()
  })
})

describe('bad input', () => {
  it.each([
    [{}, ['email', 'password']],
    [{ email: 'not-an-email', password: PASSWORD }, ['email']],
    [{ email: 'ok@example.test', password: 'short' }, ['password']],
    [{ email: 42, password: ['x'] }, ['email', 'password']],
  ])('sign-up with %j gets 400 naming %j and writes nothing', async (body, fields) => {
    const [before] = await ctx.db.select({ n: count() }).from(users)
    const res = await request(app).post('/api/auth/signup').send(body).expect(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(Object.keys(res.body.error.fields).sort()).toEqual(fields)
    const [after] = await ctx.db.select({ n: count() }).from(users)
    expect(after!.n).toBe(before!.n)
  })

  it('gets 400 for malformed JSON, 413 for a huge body, JSON 404 for an unknown route', async () => {
    const malformed = await request(app)
      .post('/api/auth/signin')
      .set('content-type', 'application/json')
      .send('{"email":')
      .expect(400)
    expect(malformed.body.error.code).toBe('invalid_json')
    const huge = await request(app)
      .post('/api/auth/signin')
      .send({ email: 'a@example.test', password: 'x'.repeat(200_000) })
      .expect(413)
    expect(huge.body.error.code).toBe('payload_too_large')
    const missing = await request(app).get('/api/no-such-thing').expect(404)
    expect(missing.body.error).toMatchObject({ code: 'not_found' })
  })
})

describe('defences', () => {
  it('refuses a state-changing request from another origin', async () => {
    const res = await request(app)
      .post('/api/auth/signin')
      .set('Origin', 'https://evil.example')
      .send({ email: 'jo@example.test', password: PASSWORD })
      .expect(403)
    expect(res.body.error.code).toBe('cross_origin')
  })

  it('without APP_ORIGIN, takes where the server listens as ours, never the Host a request brings', async () => {
    const dev = testApp(ctx.db, {
      appOrigin: allowedOrigins(loadEnv({ HOST: '127.0.0.1', PORT: '3000' })),
    })
    const signIn = (origin: string, host = '127.0.0.1:3000') =>
      request(dev)
        .post('/api/auth/signin')
        .set('Host', host)
        .set('Origin', origin)
        .send({ email: 'jo@example.test', password: 'wrong' })
    // A rebinding page: its own name, resolved to this machine.
    expect((await signIn('http://rebound.example:3000', 'rebound.example:3000')).status).toBe(403)
    expect((await signIn('http://localhost:3000')).status).toBe(401)
    expect((await signIn('http://127.0.0.1:3000')).status).toBe(401)
    expect(allowedOrigins(loadEnv({ APP_ORIGIN: 'https://chopline.example/' }))).toEqual([
      'https://chopline.example',
    ])
  })

  it('rate-limits sign-in with 429', async () => {
    const limited = testApp(ctx.db, { authRateLimit: { windowMs: 60_000, limit: 3 } })
    for (let i = 0; i < 3; i++) {
      await request(limited)
        .post('/api/auth/signin')
        .send({ email: 'x@example.test', password: 'wrong' })
        .expect(401)
    }
    const res = await request(limited)
      .post('/api/auth/signin')
      .send({ email: 'x@example.test', password: 'wrong' })
      .expect(429)
    expect(res.body.error.code).toBe('rate_limited')
  })

  it('counts only failed sign-ins, per account and per address, each route apart', async () => {
    const limited = testApp(ctx.db, {
      authRateLimit: { windowMs: 60_000, limit: 3 },
      authRateLimitPerAddress: { windowMs: 60_000, limit: 6 },
    })
    await createUser(ctx.db, 'busy@example.test')
    await createUser(ctx.db, 'target@example.test')
    const signIn = (email: string, password: string) =>
      request(limited).post('/api/auth/signin').send({ email, password })
    // A busy office: good sign-ins from one address never lock anyone out.
    for (let i = 0; i < 10; i++)
      expect((await signIn('busy@example.test', PASSWORD)).status).toBe(200)
    // Three wrong passwords lock that account, not the next one at the same address.
    for (let i = 0; i < 3; i++)
      expect((await signIn('target@example.test', 'wrong')).status).toBe(401)
    expect((await signIn('target@example.test', PASSWORD)).status).toBe(429)
    expect((await signIn('busy@example.test', PASSWORD)).status).toBe(200)
    // Sign-up keeps its own count.
    await request(limited)
      .post('/api/auth/signup')
      .send({ email: 'target@example.test', password: PASSWORD })
      .expect(202)
    // Guessing across accounts from one address meets the address's limit.
    for (let i = 0; i < 3; i++)
      expect((await signIn(`spray${i}@example.test`, 'wrong')).status).toBe(401)
    expect((await signIn('spray9@example.test', 'wrong')).status).toBe(429)
  }, 30_000)

  it('keys the address on X-Forwarded-For only behind a trusted proxy (TRUST_PROXY)', async () => {
    const limits = {
      authRateLimit: { windowMs: 60_000, limit: 1 },
      authRateLimitPerAddress: { windowMs: 60_000, limit: 1 },
    }
    const wrong = (app: ReturnType<typeof testApp>, i: number, from: string) =>
      request(app)
        .post('/api/auth/signin')
        .set('X-Forwarded-For', from)
        .send({ email: `proxy${i}@example.test`, password: 'wrong' })
    const direct = testApp(ctx.db, limits)
    expect((await wrong(direct, 1, '203.0.113.1')).status).toBe(401)
    // Not behind a proxy: the header is anyone's to write, so it changes nothing.
    expect((await wrong(direct, 2, '203.0.113.2')).status).toBe(429)
    const proxied = testApp(ctx.db, { ...limits, trustProxy: 1 })
    expect((await wrong(proxied, 3, '203.0.113.3')).status).toBe(401)
    expect((await wrong(proxied, 4, '203.0.113.4')).status).toBe(401)
    expect((await wrong(proxied, 5, '203.0.113.4')).status).toBe(429)
  })

  it('limits wrong current passwords on a password change, per account', async () => {
    const limited = testApp(ctx.db, { authRateLimit: { windowMs: 60_000, limit: 3 } })
    const agent = await signedInAgent(limited, ctx.db, 'guess@example.test')
    const other = await signedInAgent(limited, ctx.db, 'bystander@example.test')
    const change = (a: typeof agent, currentPassword: string) =>
      a.post('/api/me/password').send({ currentPassword, newPassword: 'a brand new password' })
    for (let i = 0; i < 3; i++) expect((await change(agent, `guess ${i}`)).status).toBe(400)
    const blocked = await change(agent, PASSWORD)
    expect(blocked.status).toBe(429)
    expect(blocked.body.error.code).toBe('rate_limited')
    expect((await change(other, 'wrong')).status).toBe(400)
  }, 20_000)

  it('never writes a password, hash or session token to the log', async () => {
    const res = await signUpByMail('log@example.test')
    const token = sessionCookie(res).split(';')[0]!.split('=')[1]!
    await request(app).get('/api/me').set('Cookie', `${SESSION_COOKIE}=${token}`).expect(200)
    const [row] = await ctx.db.select().from(users).where(eq(users.email, 'log@example.test'))
    const log = logLines.join('')
    expect(log).toContain('request completed')
    expect(log).not.toContain(PASSWORD)
    expect(log).not.toContain(token)
    expect(log).not.toContain(row!.passwordHash)
  })

  it('logs each request once by its id, path and status, never its query string', async () => {
    const res = await request(app).get('/api/nowhere?token=secret-in-a-link').expect(404)
    const id = res.headers['x-request-id']
    const line = logLines.map((l) => JSON.parse(l)).find((l) => l.req?.id === id)
    expect(line).toMatchObject({
      msg: 'request completed',
      req: { method: 'GET', path: '/api/nowhere' },
      res: { statusCode: 404 },
    })
    expect(logLines.join('')).not.toContain('secret-in-a-link')
  })
})
