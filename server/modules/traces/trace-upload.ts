// Multipart intake for POST /api/traces: one `file` part held in memory up to the limit, one `settings`
// part. Oversized requests are refused with 413 before their body is read when they announce their
// length, and as soon as the limit is crossed when they do not; either way the connection is closed
// so the rest of the body is never taken in.
import type { NextFunction, Request, RequestHandler, Response } from 'express'
import multer from 'multer'
import { TRACE_UPLOAD_LIMIT_BYTES } from '@shared/api/traces'
import { AppError } from '../../errors'

/** Room for the multipart framing and the settings part on top of the file itself. */
const FORM_OVERHEAD_BYTES = 256 * 1024
const limitMb = (TRACE_UPLOAD_LIMIT_BYTES / 1024 / 1024).toFixed(0)

export function tooLarge(what: string): AppError {
  return new AppError('payload_too_large', 413, `${what} is larger than the ${limitMb} MB upload limit; decimate the trace or keep only the columns you need`)
}

const parser = multer({
  storage: multer.memoryStorage(),
  // Browsers send file names as UTF-8 without saying so.
  defParamCharset: 'utf8',
  limits: { fileSize: TRACE_UPLOAD_LIMIT_BYTES, files: 1, fields: 4, fieldSize: 64 * 1024, parts: 6 },
}).single('file')

/** Stops reading the request: answer first, then close the socket once the answer is out. */
function refuseAndClose(req: Request, res: Response, next: NextFunction, err: AppError): void {
  res.set('Connection', 'close')
  res.on('finish', () => {
    req.unpipe()
    req.socket.end()
    // A client that keeps sending after the answer is cut off shortly after.
    setTimeout(() => req.socket.destroy(), 1_000).unref()
  })
  next(err)
}

export const receiveTraceUpload: RequestHandler = (req, res, next) => {
  const declared = Number(req.get('content-length'))
  if (Number.isFinite(declared) && declared > TRACE_UPLOAD_LIMIT_BYTES + FORM_OVERHEAD_BYTES) {
    return refuseAndClose(req, res, next, tooLarge(`The upload (${(declared / 1024 / 1024).toFixed(1)} MB)`))
  }
  if (!req.is('multipart/form-data')) {
    return next(new AppError('invalid_input', 400, 'Send the trace as multipart/form-data with a "file" part and a "settings" part'))
  }
  // Count what arrives: a body of unknown length is cut off as soon as it passes the limit, instead of
  // being drained to its end as multer does before reporting LIMIT_FILE_SIZE.
  let received = 0
  let refused = false
  const count = (chunk: Buffer) => {
    received += chunk.length
    if (received > TRACE_UPLOAD_LIMIT_BYTES + FORM_OVERHEAD_BYTES && !refused) {
      refused = true
      req.off('data', count)
      req.unpipe()
      req.pause()
      refuseAndClose(req, res, next, tooLarge('The file'))
    }
  }
  req.on('data', count)
  parser(req, res, (err: unknown) => {
    req.off('data', count)
    if (refused) return
    if (!err) return next()
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return refuseAndClose(req, res, next, tooLarge('The file'))
      if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(new AppError('invalid_input', 400, `Unexpected file part "${err.field}"; send exactly one part named "file"`))
      return next(new AppError('invalid_input', 400, `The upload form is not valid: ${err.message}`))
    }
    // busboy's complaints about a malformed body are the client's mistake too.
    next(new AppError('invalid_input', 400, `The upload could not be read: ${(err as Error).message}`))
  })
}
