import { LRUCache } from 'lru-cache'
import type {
  PasswordChangeInput,
  SignInInput,
  SignUpInput,
  User,
} from '../../../shared/schemas/auth'
import { NoticedCache, type Changes } from '../../db/changes'
import { conflict, HttpError, invalid, invalidLink, loggableError } from '../../http/errors'
import type { Logger } from '../../logger'
import type { MailContext } from '../mail/mailer'
import { mailTemplate } from '../mail/render'
import type { users } from '../../db/schema/index'
import type { AuthRepo } from './auth.repo'
import { decoyPasswordHash, hashPassword, verifyPassword } from './passwords'
import {
  openSignUp,
  sealSignUp,
  SESSION_DAYS,
  signSessionToken,
  type SessionClaims,
  type TokenKey,
  verifySessionToken,
} from './auth.tokens'

type UserRow = Pick<typeof users.$inferSelect, 'id' | 'email' | 'role' | 'createdAt'>

export function toUser(row: UserRow): User {
  return { id: row.id, email: row.email, role: row.role, createdAt: row.createdAt.toISOString() }
}

export interface SignUpAnswer {
  sentTo: string
}

export interface IssuedSession {
  user: User
  token: string
  expiresAt: Date
}

const INVALID_CREDENTIALS = new HttpError(
  401,
  'invalid_credentials',
  'E-mail or password is incorrect.',
)

/** How long a sign-up link works. */
export const SIGN_UP_HOURS = 24

const renderSignUp = mailTemplate<{ subject: string; email: string; url: string; hours: number }>(
  'signup',
)
const renderExisting = mailTemplate<{ subject: string; email: string; url: string }>(
  'signup-existing',
)

export function authService(
  repo: AuthRepo,
  key: TokenKey,
  opts: { mail: MailContext; log: Logger; changes?: Changes },
) {
  const { changes, mail } = opts
  // A token's signature is checked once per process and remembered until the token expires.
  const verified = new LRUCache<string, SessionClaims & { expiresAt: number }>({ max: 10_000 })
  // So is the session's user, until a change notice about the session or any user: signing out
  // or a revocation, anywhere, ends the session at once. (The token expires with the session.)
  const live = new NoticedCache<{ user: User | null }>(changes, { max: 10_000 }, (change, kept) => {
    if (change.table === 'sessions') kept.delete(change.key)
    else if (change.table === 'users') kept.clear()
  })

  async function issue(user: User): Promise<IssuedSession> {
    const expiresAt = new Date(Date.now() + SESSION_DAYS * 86_400_000)
    const sessionId = await repo.createSession(user.id, expiresAt)
    const token = await signSessionToken(key, { userId: user.id, sessionId }, expiresAt)
    return { user, token, expiresAt }
  }

  return {
    /**
     * Answers the same whether the address has an account or not, and tells only its mailbox:
     * a link that creates the account and signs in, or word that it has one already. The hash is
     * made either way and the mail goes out after the answer, so timing tells no more than words.
     */
    async signUp(input: SignUpInput): Promise<SignUpAnswer> {
      const [existing, passwordHash] = await Promise.all([
        repo.findByEmail(input.email),
        hashPassword(input.password),
      ])
      const email = input.email
      const send = async () => {
        if (existing) {
          await mail.mailer.send({
            to: email,
            ...renderExisting({
              subject: 'You already have a Chopline account',
              email,
              url: `${mail.origin}/signin`,
            }),
          })
          return
        }
        const expiresAt = new Date(Date.now() + SIGN_UP_HOURS * 3_600_000)
        const token = await sealSignUp(key, { email, passwordHash }, expiresAt)
        await mail.mailer.send({
          to: email,
          ...renderSignUp({
            subject: 'Confirm your address to finish your Chopline account',
            email,
            url: `${mail.origin}/welcome?token=${token}`,
            hours: SIGN_UP_HOURS,
          }),
        })
      }
      void send().catch((err: unknown) =>
        opts.log.warn({ err: loggableError(err) }, 'sign-up mail not sent'),
      )
      return { sentTo: email }
    },

    /** Opens a sign-up link: the account is made, its address confirmed, and a session begins. */
    async confirmSignUp(token: string): Promise<IssuedSession> {
      const pending = await openSignUp(key, token)
      if (!pending) throw invalidLink('Sign up again for a new one.')
      const row = await repo.insertUser(pending.email, pending.passwordHash, new Date())
      if (!row)
        throw conflict(
          'already_confirmed',
          'This address already has an account: sign in with its password.',
        )
      return issue(toUser(row))
    },

    async signIn(input: SignInInput): Promise<IssuedSession> {
      const row = await repo.findByEmail(input.email)
      const ok = await verifyPassword(
        row?.passwordHash ?? (await decoyPasswordHash()),
        input.password,
      )
      if (!row || !ok) throw INVALID_CREDENTIALS
      return issue(toUser(row))
    },

    async authenticate(token: string): Promise<{ user: User; sessionId: string } | null> {
      let claims = verified.get(token)
      if (!claims || claims.expiresAt <= Date.now()) {
        claims = (await verifySessionToken(key, token)) ?? undefined
        if (!claims) return null
        verified.set(token, claims)
      }
      const { sessionId, userId } = claims
      const { user } = await live.get(sessionId, async () => {
        const row = await repo.liveSessionUser(sessionId, userId)
        return { user: row ? toUser(row) : null }
      })
      return user && { user, sessionId }
    },

    signOut: (sessionId: string) => repo.revokeSession(sessionId),

    /** A new password ends every session, this one included, and opens a fresh one here. */
    async changePassword(user: User, input: PasswordChangeInput): Promise<IssuedSession> {
      const row = await repo.findById(user.id)
      if (!row || !(await verifyPassword(row.passwordHash, input.currentPassword))) {
        throw invalid('currentPassword', 'That is not your current password.')
      }
      await repo.setPasswordHash(user.id, await hashPassword(input.newPassword))
      await repo.revokeAllSessions(user.id)
      return issue(user)
    },
  }
}
export type AuthService = ReturnType<typeof authService>
