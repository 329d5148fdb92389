import type { ZodType } from 'zod'
import { ApiError, apiErrorFrom, networkError } from './api-error'

export { ApiError } from './api-error'

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'

export interface RequestOptions<T> {
  method?: HttpMethod
  /** Sent as JSON. FormData is sent as-is (multipart uploads). */
  body?: unknown
  query?: Record<string, string | number | boolean | undefined>
  /** Validates the response; a mismatch rejects with code 'bad_response' instead of leaking bad data into views. */
  schema?: ZodType<T>
  /** Non-2xx statuses whose body is still a normal answer (e.g. 503 from a health check). */
  acceptStatus?: number[]
  signal?: AbortSignal
}

const API_BASE = '/api'

function urlFor(path: string, query?: RequestOptions<unknown>['query']): string {
  const url = `${API_BASE}${path.startsWith('/') ? path : `/${path}`}`
  if (!query) return url
  const params = new URLSearchParams()
  for (const [k, v] of Object.entries(query)) if (v !== undefined) params.set(k, String(v))
  const qs = params.toString()
  return qs ? `${url}?${qs}` : url
}

async function readBody(res: Response): Promise<unknown> {
  if (res.status === 204) return null
  const text = await res.text()
  if (!text) return null
  try {
    return JSON.parse(text)
  } catch {
    return text
  }
}

/** The one fetch wrapper: same origin, cookies included, JSON in and out, errors as ApiError. */
export async function apiRequest<T = unknown>(path: string, opts: RequestOptions<T> = {}): Promise<T> {
  const { method = 'GET', body, query, schema, acceptStatus = [], signal } = opts
  const headers: Record<string, string> = { Accept: 'application/json' }
  let payload: BodyInit | undefined
  if (body instanceof FormData) payload = body
  else if (body !== undefined) {
    headers['Content-Type'] = 'application/json'
    payload = JSON.stringify(body)
  }

  let res: Response
  try {
    res = await fetch(urlFor(path, query), { method, headers, body: payload, credentials: 'include', signal })
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause
    throw networkError(cause)
  }

  const data = await readBody(res)
  if (!res.ok && !acceptStatus.includes(res.status)) throw apiErrorFrom(res.status, data)
  if (!schema) return data as T
  const parsed = schema.safeParse(data)
  if (!parsed.success) {
    throw new ApiError(res.status, 'bad_response', `Unexpected response from ${method} ${path}.`)
  }
  return parsed.data
}

export const api = {
  get: <T>(path: string, opts?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...opts, method: 'GET' }),
  post: <T>(path: string, body?: unknown, opts?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...opts, method: 'POST', body }),
  put: <T>(path: string, body?: unknown, opts?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...opts, method: 'PUT', body }),
  patch: <T>(path: string, body?: unknown, opts?: Omit<RequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...opts, method: 'PATCH', body }),
  delete: <T>(path: string, opts?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...opts, method: 'DELETE' }),
}
