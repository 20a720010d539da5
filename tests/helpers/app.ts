import { eq } from 'drizzle-orm'
import { pino } from 'pino'
import request from 'supertest'
import type { Role } from '../../shared/schemas/auth'
import { createApp, type AppDeps } from '../../server/app'
import type { Db } from '../../server/db/index'
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

type App = ReturnType<typeof testApp>

/** Signs up through the API (the agent keeps the session cookie), then sets the role directly. */
export async function signedInAgent(app: App, db: Db, email: string, role: Role = 'angler') {
  const agent = request.agent(app)
  await agent.post('/api/auth/signup').send({ email, password: PASSWORD }).expect(201)
  if (role !== 'angler') {
    await db.update(users).set({ role }).where(eq(users.email, email))
  }
  return agent
}
