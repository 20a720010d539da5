import type { User } from '../../shared/schemas/auth'

declare global {
  namespace Express {
    interface Request {
      /** Set by the session middleware when the request carries a live session. */
      auth?: { user: User; sessionId: string }
    }
  }
}
