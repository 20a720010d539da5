import { jwtVerify, SignJWT } from 'jose'

export const SESSION_COOKIE = 'chopline_session'
export const SESSION_DAYS = 30

export interface SessionClaims {
  userId: string
  sessionId: string
}

export function tokenKey(secret: string): Uint8Array {
  return new TextEncoder().encode(secret)
}

export async function signSessionToken(key: Uint8Array, claims: SessionClaims, expiresAt: Date) {
  return new SignJWT({ sid: claims.sessionId })
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(claims.userId)
    .setIssuedAt()
    .setExpirationTime(expiresAt)
    .sign(key)
}

/** The claims of a valid token, or null for anything forged, expired or malformed. */
export async function verifySessionToken(
  key: Uint8Array,
  token: string,
): Promise<SessionClaims | null> {
  try {
    const { payload } = await jwtVerify(token, key, { algorithms: ['HS256'] })
    if (typeof payload.sub !== 'string' || typeof payload.sid !== 'string') return null
    return { userId: payload.sub, sessionId: payload.sid }
  } catch {
    return null
  }
}
