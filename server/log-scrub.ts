import { pino } from 'pino'

// Log lines outlive the secrets they could carry: a share link or a reset link in a request line, or
// the values of a failed INSERT (a bcrypt hash, an API token's digest) in an error, would hand them
// to anyone who reads the logs. These serializers keep the shape of a line and drop the secrets.

export const REDACTED = '[redacted]'

// Query parameters whose value is a credential wherever they appear.
const SECRET_PARAMS = /^(token|share|access_token|api_token|api_key|apikey|key|code|password|secret)$/i
// Our secrets are 32 random bytes in base64url (43 characters), API tokens with a prefix: no
// identifier the app logs (UUIDs have 36 characters with dashes) is a run this long.
const SECRET_LOOKING = /[A-Za-z0-9_-]{40,}/g

function decodedName(name: string): string {
  try {
    return decodeURIComponent(name.replace(/\+/g, ' '))
  } catch {
    return name
  }
}

/** A request URL with credential parameters and token-like path segments replaced. */
export function scrubUrl(url: unknown): unknown {
  if (typeof url !== 'string') return url
  const q = url.indexOf('?')
  const path = (q < 0 ? url : url.slice(0, q)).replace(SECRET_LOOKING, REDACTED)
  if (q < 0) return path
  const query = url
    .slice(q + 1)
    .split('&')
    .map((pair) => {
      const eq = pair.indexOf('=')
      if (eq >= 0 && SECRET_PARAMS.test(decodedName(pair.slice(0, eq)))) return `${pair.slice(0, eq)}=${REDACTED}`
      return pair.replace(SECRET_LOOKING, REDACTED)
    })
    .join('&')
  return `${path}?${query}`
}

interface ErrorLike {
  message: string
  stack?: string
  name?: string
  cause?: unknown
  [key: string]: unknown
}

const isErrorLike = (e: unknown): e is ErrorLike => typeof e === 'object' && e !== null && typeof (e as ErrorLike).message === 'string'

// PostgreSQL repeats the offending values in `detail`: "Key (token_hash)=(9f2c…) already exists."
const scrubDetail = (detail: unknown) => (typeof detail === 'string' ? detail.replace(/=\(.*\)/gs, `=(${REDACTED})`) : detail)

/**
 * A copy of the error (and its causes) without bound query values. Drizzle's failed-query error
 * carries them in `params` and spells them out in its message ("Failed query: …\nparams: …").
 */
function withoutQueryValues(err: ErrorLike, depth = 0): ErrorLike {
  const copy = Object.create(Object.getPrototypeOf(err)) as ErrorLike
  for (const key of Object.keys(err)) copy[key] = err[key]
  let message = err.message
  if (typeof err.query === 'string' && 'params' in err) {
    message = `Failed query: ${err.query}\nparams: ${REDACTED}`
    delete copy.params
  }
  if ('detail' in copy) copy.detail = scrubDetail(copy.detail)
  const frames = err.stack?.indexOf('\n    at ') ?? -1
  Object.defineProperty(copy, 'message', { value: message, enumerable: false, writable: true })
  Object.defineProperty(copy, 'stack', { value: `${err.name ?? 'Error'}: ${message}${frames >= 0 ? err.stack!.slice(frames) : ''}`, enumerable: false, writable: true })
  if (isErrorLike(err.cause) && depth < 5) copy.cause = withoutQueryValues(err.cause, depth + 1)
  return copy
}

/** pino's error serializer, after the query values are taken out. */
export function scrubError(err: unknown): unknown {
  return pino.stdSerializers.err(isErrorLike(err) ? (withoutQueryValues(err) as Error) : (err as Error))
}
