import type { RequestHandler } from 'express'
import { AppError } from '../errors'

/**
 * Request bodies are JSON (or multipart/form-data for file uploads). Anything else is refused with
 * 415 instead of being read as "no body": a text/plain or form-encoded post is what a page on another
 * site can send without a CORS preflight, and a silently empty body would only confuse a script.
 */
export const jsonBodies: RequestHandler = (req, _res, next) => {
  const hasBody = req.get('transfer-encoding') !== undefined || Number(req.get('content-length') ?? 0) > 0
  if (!hasBody || req.is(['application/json', '+json', 'multipart/form-data'])) return next()
  next(new AppError('unsupported_media_type', 415, 'Send the request body as JSON (Content-Type: application/json)'))
}
