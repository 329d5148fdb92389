import type { ErrorRequestHandler, RequestHandler } from 'express'
import { ZodError } from 'zod'
import type { ApiErrorBody } from '@shared/api/api-error'
import { describeIssuePath } from '@shared/api/issue-path-labels'
// Words every validation issue of the process in plain language with units ("must be more than 0 ns").
import '@shared/api/issue-messages'
import { AppError, type FieldError } from '../errors'
import { pathParamName } from './path-param-name'

type ErrorBody = ApiErrorBody['error']

/** Unknown /api paths answer in JSON, not with the SPA page. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', 404, `No API route for ${req.method} ${req.originalUrl.split('?')[0]}`))
}

export function zodFields(err: ZodError): FieldError[] {
  return err.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }))
}

// body-parser marks its own failures with `type`; these are the client's mistakes, not ours.
const BODY_ERRORS: Record<string, { status: number; code: string; message: string }> = {
  'entity.parse.failed': { status: 400, code: 'malformed_json', message: 'The request body is not valid JSON' },
  'entity.too.large': { status: 413, code: 'payload_too_large', message: 'The request body is too large' },
  'encoding.unsupported': { status: 415, code: 'unsupported_encoding', message: 'The request body encoding is not supported' },
  'charset.unsupported': { status: 415, code: 'unsupported_charset', message: 'The request body charset is not supported' },
  'request.aborted': { status: 400, code: 'request_aborted', message: 'The request was aborted' },
}

/**
 * Express decodes route parameters while matching and throws a URIError (marked 400) for a malformed
 * percent-encoding such as /api/runs/%E0%A4%A; that is the client's mistake, named by its parameter.
 */
function badPathEncoding(err: unknown, req: Parameters<ErrorRequestHandler>[1]): ErrorBody | null {
  // Only the router's own decoding failure: a URIError from our code is a bug and stays a 500.
  const raw = err instanceof URIError ? /^Failed to decode param '(.*)'$/s.exec(err.message)?.[1] : undefined
  if (raw === undefined) return null
  const name = pathParamName(req.app, req.originalUrl.split('?')[0], raw)
  const message = 'is not valid percent-encoding (a % must be followed by two hexadecimal digits forming UTF-8)'
  return {
    code: 'invalid_path',
    message: `The address has a malformed ${name ? `"${name}" ` : ''}segment`,
    fields: [{ path: name ?? 'path', message }],
  }
}

/** Fields named in words in the message (the first three), so a person reading it needs no JSON path. */
const WORDED_FIELDS = 3

function invalidInputMessage(err: ZodError, body: unknown): string {
  // A run names its config `config`, a sweep `baseConfig`: channel numbers are named only when there are several.
  const b = body as { config?: { channels?: unknown }; baseConfig?: { channels?: unknown } } | null
  const channels = (b?.config ?? b?.baseConfig)?.channels
  const channelCount = Array.isArray(channels) ? channels.length : 1
  const named = err.issues.slice(0, WORDED_FIELDS).map((i) => {
    const where = describeIssuePath(i.path, channelCount)
    return where ? `${where}: ${i.message}` : i.message
  })
  const more = err.issues.length > WORDED_FIELDS ? `; and ${err.issues.length - WORDED_FIELDS} more` : ''
  return `Some fields are not valid. ${named.join('; ')}${more}`
}

/** Details as the client will read them: dates as ISO strings, nothing that does not survive JSON. */
function jsonSafe(details: Record<string, unknown>): Record<string, unknown> {
  return JSON.parse(JSON.stringify(details)) as Record<string, unknown>
}

/** The one place errors become responses. Only AppError and validation messages reach the client. */
export const errorHandler: ErrorRequestHandler = (err, req, res, next) => {
  if (res.headersSent) return next(err)
  const requestId = req.id
  let status: number
  let body: ErrorBody
  let pathError: ErrorBody | null

  if (err instanceof ZodError) {
    status = 400
    body = { code: 'invalid_input', message: invalidInputMessage(err, req.body), fields: zodFields(err) }
  } else if (err instanceof AppError) {
    status = err.httpStatus
    const { fields, ...details } = err.details ?? {}
    body = { code: err.code, message: err.message, ...(fields ? { fields } : {}), ...(Object.keys(details).length ? { details: jsonSafe(details) } : {}) }
  } else if ((pathError = badPathEncoding(err, req))) {
    status = 400
    body = pathError
  } else if (typeof err?.type === 'string' && BODY_ERRORS[err.type]) {
    const known = BODY_ERRORS[err.type]
    status = known.status
    body = { code: known.code, message: known.message }
  } else {
    status = 500
    body = { code: 'internal', message: `Something went wrong on our side; quote request id ${requestId} when reporting it` }
    ;(req.log ?? console).error({ err, method: req.method, url: req.originalUrl }, 'unhandled error')
  }
  res.status(status).json({ error: { ...body, requestId } } satisfies ApiErrorBody)
}
