import type { User } from '../../shared/schemas/auth'

declare global {
  namespace Express {
    interface Request {
      /** Set by the request log: also sent as x-request-id, and quoted in a 500's message. */
      id: string
      /** Set by the session middleware when the request carries a live session. */
      auth?: { user: User; sessionId: string }
    }
  }
}
