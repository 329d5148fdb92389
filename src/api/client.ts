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

async function send(method: HttpMethod, url: string, init: { headers: Record<string, string>; body?: BodyInit; signal?: AbortSignal }): Promise<Response> {
  try {
    return await fetch(url, { method, headers: init.headers, body: init.body, credentials: 'include', signal: init.signal })
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause
    throw networkError(cause)
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

  const res = await send(method, urlFor(path, query), { headers, body: payload, signal })
  const data = await readBody(res)
  if (!res.ok && !acceptStatus.includes(res.status)) throw apiErrorFrom(res.status, data)
  if (!schema) return data as T
  const parsed = schema.safeParse(data)
  if (!parsed.success) {
    throw new ApiError(res.status, 'bad_response', `Unexpected response from ${method} ${path}.`)
  }
  return parsed.data
}

/** GET of raw bytes (large arrays), with the same cookies and errors as apiRequest; the headers describe the bytes. */
export async function apiBytes(path: string, opts: Pick<RequestOptions<unknown>, 'query' | 'signal'> = {}): Promise<{ bytes: ArrayBuffer; headers: Headers; status: number }> {
  const res = await send('GET', urlFor(path, opts.query), { headers: { Accept: 'application/octet-stream' }, signal: opts.signal })
  if (!res.ok) throw apiErrorFrom(res.status, await readBody(res))
  return { bytes: await res.arrayBuffer(), headers: res.headers, status: res.status }
}

/**
 * POST of a multipart form with upload progress (fetch reports none, so this one call uses XMLHttpRequest),
 * answering and failing exactly as apiRequest does. `onProgress` gets the sent fraction.
 */
export function apiUpload<T>(path: string, form: FormData, opts: { schema: ZodType<T>; onProgress?: (fraction: number) => void }): { done: Promise<T>; abort: () => void } {
  const xhr = new XMLHttpRequest()
  const done = new Promise<T>((resolve, reject) => {
    xhr.open('POST', urlFor(path))
    xhr.withCredentials = true
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.upload.onprogress = (e) => e.lengthComputable && opts.onProgress?.(e.loaded / e.total)
    xhr.onerror = () => reject(networkError(new Error('upload failed')))
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was cancelled.'))
    xhr.onload = () => {
      let body: unknown
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null
      } catch {
        body = xhr.responseText
      }
      if (xhr.status < 200 || xhr.status > 299) return reject(apiErrorFrom(xhr.status, body))
      const parsed = opts.schema.safeParse(body)
      if (parsed.success) resolve(parsed.data)
      else reject(new ApiError(xhr.status, 'bad_response', `Unexpected response from POST ${path}.`))
    }
    xhr.send(form)
  })
  return { done, abort: () => xhr.abort() }
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
