import { pino, type DestinationStream, type Logger } from 'pino'
import { REDACTED, scrubError, scrubUrl } from './log-scrub'

export type { Logger }

// Secrets that may sit in a logged object under a known key; URLs and errors are scrubbed by the
// serializers (log-scrub.ts), which also cover the request line and the error handler's `url`.
const REDACT_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'res.headers["set-cookie"]',
  'headers.cookie',
  'headers.authorization',
  '*.password',
  '*.passwordHash',
  '*.token',
  '*.tokenHash',
  'err.params',
]

/** JSON lines on stdout (or `destination`); one logger per process, children per request (see middleware/request-id). */
export function createLogger(level = 'info', base: Record<string, unknown> = {}, destination?: DestinationStream): Logger {
  const options = {
    level,
    base: { service: 'sonoweave', ...base },
    timestamp: pino.stdTimeFunctions.isoTime,
    redact: { paths: REDACT_PATHS, censor: REDACTED },
    serializers: { err: scrubError, error: scrubError, url: scrubUrl },
  }
  return destination ? pino(options, destination) : pino(options)
}
