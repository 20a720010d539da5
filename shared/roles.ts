import type { Role } from './schemas/auth'

/** The roles, least first; zod-free, so the client's first page loads it without zod. */
export const ROLES = ['angler', 'guide', 'admin'] as const

/** Roles are nested: a guide can do all an angler can, an admin all a guide can. */
export function roleAllows(role: Role, needed: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(needed)
}
