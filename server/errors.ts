export interface FieldError {
  path: string
  message: string
}

/**
 * An error the client is meant to see: a stable machine-readable code, the HTTP status and a
 * message safe to show. Anything thrown that is not an AppError becomes a 500 with no detail.
 * `details.fields` becomes the envelope's `fields`; everything else in `details` is sent as the envelope's
 * `details`, whose shape per code is declared in shared/api/api-error.ts (ERROR_DETAILS): add a code there
 * when a new error carries details.
 */
export class AppError extends Error {
  constructor(
    readonly code: string,
    readonly httpStatus: number,
    message: string,
    readonly details?: { fields?: FieldError[] } & Record<string, unknown>,
  ) {
    super(message)
    this.name = 'AppError'
  }
}

export const notFound = (what = 'Resource'): AppError => new AppError('not_found', 404, `${what} not found`)
export const forbidden = (message = 'You do not have access to this'): AppError => new AppError('forbidden', 403, message)
export const unauthorized = (message = 'Sign in first'): AppError => new AppError('unauthorized', 401, message)
export const conflict = (message: string): AppError => new AppError('conflict', 409, message)
