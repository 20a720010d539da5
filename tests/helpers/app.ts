import { pino } from 'pino'
import request from 'supertest'
import { expect, vi } from 'vitest'
import type { Role } from '../../shared/schemas/auth'
import { createApp, type AppDeps } from '../../server/app'
import { watchChanges } from '../../server/db/changes'
import type { Db } from '../../server/db/index'
import { hashPassword } from '../../server/features/auth/passwords'
import { smtpMailer } from '../../server/features/mail/mailer'
import { TEST_ORIGIN } from './mail'
import { users } from '../../server/db/schema/index'

export const TEST_SECRET = 'test-secret-that-is-long-enough-for-hs256-keys'
export const PASSWORD = 'correct horse battery'

export function testApp(db: Db, overrides: Partial<AppDeps> = {}) {
  return createApp({
    db,
    logger: pino({ level: 'silent' }),
    sessionSecret: TEST_SECRET,
    secureCookies: false,
    authRateLimit: { windowMs: 60_000, limit: 1000 },
    // Nothing listens on the discard port: tests that send mail pass a mailer for the stand-in.
    mail: {
      mailer: smtpMailer('smtp://127.0.0.1:9', 'Chopline <test@chopline.example>'),
      origin: TEST_ORIGIN,
    },
    ...overrides,
  })
}

/**
 * Change notices as `serve()` listens for them, live before it returns: an app given them keeps
 * sessions, Lake reads and Day plans in memory, as in production. Close it after the tests.
 */
export async function liveChanges(db: Db) {
  const changes = watchChanges(db.$client.options, pino({ level: 'silent' }), 50)
  await vi.waitFor(() => expect(changes.live).toBe(true))
  return changes
}

type App = ReturnType<typeof testApp>

let passwordHash: Promise<string> | undefined

/** An account with `PASSWORD` whose address is not confirmed for the brief yet (sign-up only mails a link). */
export async function createUser(db: Db, email: string, role: Role = 'angler') {
  passwordHash ??= hashPassword(PASSWORD)
  // Addresses are kept as the API takes them: lower case.
  await db
    .insert(users)
    .values({ email: email.toLowerCase(), passwordHash: await passwordHash, role })
}

/** A new account, signed in through the API: the agent keeps the session cookie. */
export async function signedInAgent(app: App, db: Db, email: string, role: Role = 'angler') {
  await createUser(db, email, role)
  const agent = request.agent(app)
  await agent.post('/api/auth/signin').send({ email, password: PASSWORD }).expect(200)
  return agent
}
