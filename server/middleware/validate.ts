import type { RequestHandler } from 'express'
import type { z } from 'zod'

export interface Schemas {
  body?: z.ZodType
  query?: z.ZodType
  params?: z.ZodType
}

/**
 * Parses the request with the shared zod schemas before the handler runs; a failure reaches the
 * error handler as a ZodError (400 with field paths). Parsed values replace the raw ones, so
 * handlers see coerced, stripped data.
 */
export function validate(schemas: Schemas): RequestHandler & { schemas: Schemas } {
  const handler: RequestHandler = (req, _res, next) => {
    if (schemas.body) req.body = schemas.body.parse(req.body ?? {})
    if (schemas.params) req.params = schemas.params.parse(req.params) as typeof req.params
    // Express 5 exposes req.query through a getter; shadow it with the parsed value.
    if (schemas.query) Object.defineProperty(req, 'query', { value: schemas.query.parse(req.query), writable: true, configurable: true })
    next()
  }
  // Kept on the handler so a route's input schemas can be found from the mounted routers (the API fuzz test
  // walks them to check that every validated route is exercised).
  return Object.assign(handler, { schemas })
}

/** The same check inside a handler, for values that are not a whole body/query/params. */
export function parseInput<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  return schema.parse(value)
}
