import { ApiErrorBody } from '@shared/api/api-error'

export interface ApiFieldError {
  path: string
  message: string
}

/** The one error type every API call rejects with. `status` 0 means the request never got an answer. */
export class ApiError extends Error {
  override readonly name = 'ApiError'
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: ApiFieldError[] = [],
    readonly requestId?: string,
    /** What the server knew beyond the message; its shape per code is ERROR_DETAILS in shared/api/api-error.ts. */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message)
  }

  get isUnauthenticated(): boolean {
    return this.status === 401
  }

  /** Message for one form field, matched on its dotted path (e.g. "pump.peakPowerW"). */
  fieldMessage(path: string): string | undefined {
    return this.fields.find((f) => f.path === path)?.message
  }
}

// Fallback wording when a response carries no envelope (a proxy error page, an empty 502).
const STATUS_TEXT: Record<number, string> = {
  400: 'The request was not accepted.',
  401: 'Please sign in.',
  403: 'You do not have access to this.',
  404: 'Not found.',
  413: 'The upload is too large.',
  429: 'Too many requests; wait a moment and try again.',
  500: 'The server hit an unexpected error.',
  502: 'The server is not reachable.',
  503: 'The service is temporarily unavailable.',
}

/** Builds an ApiError from a non-2xx status and whatever body came with it (parsed JSON or null). */
export function apiErrorFrom(status: number, body: unknown): ApiError {
  const parsed = ApiErrorBody.safeParse(body)
  if (parsed.success) {
    const e = parsed.data.error
    return new ApiError(status, e.code, e.message, e.fields ?? [], e.requestId, e.details ?? {})
  }
  const message = STATUS_TEXT[status] ?? `The server answered with status ${status}.`
  return new ApiError(status, `http_${status}`, message)
}

export const networkError = (cause: unknown): ApiError =>
  new ApiError(0, 'network', `The server could not be reached (${cause instanceof Error ? cause.message : 'network error'}).`)
