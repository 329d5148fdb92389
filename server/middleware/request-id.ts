import { randomUUID } from 'node:crypto'
import type { RequestHandler } from 'express'
import type { Logger } from '../logger'

// A proxy's id is kept when it is harmless to log and echo; anything else is replaced.
const ACCEPTABLE_ID = /^[A-Za-z0-9._-]{1,100}$/

/** Gives each request an id and a child logger, and logs one line when the response is done. */
export function requestContext(log: Logger): RequestHandler {
  return (req, res, next) => {
    const incoming = req.get('x-request-id')
    req.id = incoming && ACCEPTABLE_ID.test(incoming) ? incoming : randomUUID()
    req.log = log.child({ requestId: req.id })
    res.setHeader('X-Request-Id', req.id)
    const startedAt = process.hrtime.bigint()
    // `url` goes through the logger's scrubUrl serializer: share, reset and API tokens never reach the log.
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - startedAt) / 1e6
      const level = res.statusCode >= 500 ? 'error' : 'info'
      req.log[level]({ method: req.method, url: req.originalUrl, status: res.statusCode, ms: Math.round(ms * 10) / 10 }, 'request')
    })
    next()
  }
}
