import argon2 from 'argon2'

/** argon2id with the library's defaults (m = 64 MiB, t = 3, p = 4; RFC 9106's second recommended option). */
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id })
}

export function verifyPassword(hash: string, password: string): Promise<boolean> {
  return argon2.verify(hash, password)
}

// Verified against when the e-mail is unknown, so both failures cost the same time.
let decoyHash: Promise<string> | undefined
export function decoyPasswordHash(): Promise<string> {
  decoyHash ??= hashPassword('decoy password that never matches')
  return decoyHash
}
