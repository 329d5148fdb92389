import { pino, type Logger } from 'pino'

export type { Logger }

/** JSON lines on stdout; one logger per process, children per request (see middleware/request-id). */
export function createLogger(level = 'info', base: Record<string, unknown> = {}): Logger {
  return pino({
    level,
    base: { service: 'sonoweave', ...base },
    timestamp: pino.stdTimeFunctions.isoTime,
    redact: { paths: ['req.headers.cookie', 'req.headers.authorization', '*.password', '*.passwordHash'], censor: '[redacted]' },
  })
}
