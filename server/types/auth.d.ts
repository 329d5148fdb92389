import type { AuthContext } from '../modules/auth/auth-context'

declare global {
  namespace Express {
    interface Request {
      /** Who is calling: set by modules/auth/auth.middleware `authenticate`, undefined when anonymous. */
      auth?: AuthContext
    }
  }
}

export {}
