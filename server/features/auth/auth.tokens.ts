import { createSecretKey, hkdfSync, type KeyObject } from 'node:crypto'
import { EncryptJWT, jwtDecrypt, jwtVerify, SignJWT } from 'jose'

export const SESSION_COOKIE = 'chopline_session'
export const SESSION_DAYS = 30

export interface SessionClaims {
  userId: string
  sessionId: string
}

/** The app's signing key. A KeyObject, not raw bytes: jose imports it once and reuses it. */
export type TokenKey = KeyObject

export function tokenKey(secret: string): TokenKey {
  return createSecretKey(Buffer.from(secret, 'utf8'))
}

export async function signSessionToken(key: TokenKey, claims: SessionClaims, expiresAt: Date) {
  return new SignJWT({ sid: claims.sessionId })
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(claims.userId)
    .setIssuedAt()
    .setExpirationTime(expiresAt)
    .sign(key)
}

/** The claims of a valid token, with its expiry, or null for anything forged, expired or malformed. */
export async function verifySessionToken(
  key: TokenKey,
  token: string,
): Promise<(SessionClaims & { expiresAt: number }) | null> {
  try {
    const { payload } = await jwtVerify(token, key, { algorithms: ['HS256'] })
    if (typeof payload.sub !== 'string' || typeof payload.sid !== 'string' || !payload.exp)
      return null
    return { userId: payload.sub, sessionId: payload.sid, expiresAt: payload.exp * 1000 }
  } catch {
    return null
  }
}

/** What a signed link may do; a token made for one purpose is refused for every other. */
export type LinkPurpose = 'verify-email' | 'brief-unsubscribe' | 'trip-share' | 'watch-unsubscribe'

/**
 * A token for a link in an e-mail: signed with the app's key, bound to one purpose (the JWT
 * audience) and one subject, with claims the link needs and an expiry.
 */
export async function signLinkToken(
  key: TokenKey,
  link: {
    purpose: LinkPurpose
    subject: string
    claims?: Record<string, string>
    /** Absent when a database row says how long the link lasts (and can end it at once). */
    expiresAt?: Date
  },
): Promise<string> {
  const jwt = new SignJWT(link.claims ?? {})
    .setProtectedHeader({ alg: 'HS256' })
    .setAudience(link.purpose)
    .setSubject(link.subject)
    .setIssuedAt()
  if (link.expiresAt) jwt.setExpirationTime(link.expiresAt)
  return jwt.sign(key)
}

/** The subject and claims of a valid link token for `purpose`; null if forged, expired or another kind. */
export async function verifyLinkToken(
  key: TokenKey,
  purpose: LinkPurpose,
  token: string,
): Promise<{ subject: string; claims: Record<string, unknown> } | null> {
  try {
    const { payload } = await jwtVerify(token, key, { algorithms: ['HS256'], audience: purpose })
    if (typeof payload.sub !== 'string') return null
    return { subject: payload.sub, claims: payload }
  } catch {
    return null
  }
}

/** A sign-up waiting for its address to be confirmed: what the account will be made of. */
export interface PendingSignUp {
  email: string
  passwordHash: string
}

// A key of its own for sealed sign-ups, derived from the signing key (RFC 5869 HKDF).
const sealKeys = new WeakMap<TokenKey, KeyObject>()
function sealKey(key: TokenKey): KeyObject {
  let sealed = sealKeys.get(key)
  if (!sealed) {
    const bytes = hkdfSync('sha256', key.export(), new Uint8Array(0), 'chopline sign-up', 32)
    sealed = createSecretKey(Buffer.from(bytes))
    sealKeys.set(key, sealed)
  }
  return sealed
}

/**
 * The token of a sign-up link: the address and the password's hash, encrypted (JWE, A256GCM), so
 * no account exists until the link is opened and the hash is readable by no one on the way.
 */
export async function sealSignUp(key: TokenKey, pending: PendingSignUp, expiresAt: Date) {
  return new EncryptJWT({ h: pending.passwordHash })
    .setProtectedHeader({ alg: 'dir', enc: 'A256GCM' })
    .setAudience('sign-up')
    .setSubject(pending.email)
    .setIssuedAt()
    .setExpirationTime(expiresAt)
    .encrypt(sealKey(key))
}

/** The sign-up a link's token seals; null if forged, expired or not a sign-up. */
export async function openSignUp(key: TokenKey, token: string): Promise<PendingSignUp | null> {
  try {
    const { payload } = await jwtDecrypt(token, sealKey(key), { audience: 'sign-up' })
    if (typeof payload.sub !== 'string' || typeof payload.h !== 'string') return null
    return { email: payload.sub, passwordHash: payload.h }
  } catch {
    return null
  }
}
