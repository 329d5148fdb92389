import type { Logger } from 'pino'

declare global {
  namespace Express {
    interface Request {
      /** Set by middleware/request-id; echoed in the X-Request-Id header and in error bodies. */
      id: string
      /** A child logger carrying the request id. */
      log: Logger
    }
  }
}

export {}
