import { and, eq, gt, isNull, sql } from 'drizzle-orm'
import type { Db } from '../../db/index'
import { sessions, users } from '../../db/schema/index'

export const publicUserColumns = {
  id: users.id,
  email: users.email,
  role: users.role,
  createdAt: users.createdAt,
}

export function authRepo(db: Db) {
  // Asked on every signed-in request: built once, and planned once per pool connection.
  const liveSession = db
    .select(publicUserColumns)
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(
      and(
        eq(sessions.id, sql.placeholder('sessionId')),
        eq(sessions.userId, sql.placeholder('userId')),
        isNull(sessions.revokedAt),
        gt(sessions.expiresAt, sql`now()`),
      ),
    )
    .prepare('auth_live_session_user')

  return {
    async findByEmail(email: string) {
      const [row] = await db.select().from(users).where(eq(users.email, email))
      return row
    },
    async findById(id: string) {
      const [row] = await db.select().from(users).where(eq(users.id, id))
      return row
    },
    /** Inserts unless the e-mail is taken; returns undefined when it is. */
    async insertUser(email: string, passwordHash: string, emailVerifiedAt: Date | null = null) {
      const [row] = await db
        .insert(users)
        .values({ email, passwordHash, emailVerifiedAt })
        .onConflictDoNothing({ target: users.email })
        .returning(publicUserColumns)
      return row
    },
    async setPasswordHash(userId: string, passwordHash: string) {
      await db.update(users).set({ passwordHash }).where(eq(users.id, userId))
    },
    async createSession(userId: string, expiresAt: Date) {
      const [row] = await db
        .insert(sessions)
        .values({ userId, expiresAt })
        .returning({ id: sessions.id })
      return row!.id
    },
    /** The user behind a live (unrevoked, unexpired) session. */
    async liveSessionUser(sessionId: string, userId: string) {
      const [row] = await liveSession.execute({ sessionId, userId })
      return row
    },
    async revokeSession(sessionId: string) {
      await db.update(sessions).set({ revokedAt: new Date() }).where(eq(sessions.id, sessionId))
    },
    async revokeAllSessions(userId: string) {
      await db
        .update(sessions)
        .set({ revokedAt: new Date() })
        .where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)))
    },
  }
}
export type AuthRepo = ReturnType<typeof authRepo>
