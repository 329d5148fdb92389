import { TraceData, TraceDetail, TraceList, type TraceUploadSettings } from '@shared/traces'
import { api, ApiError } from './client'
import { apiErrorFrom, networkError } from './api-error'

const enc = encodeURIComponent

export const listTraces = (groupId: string, q?: string, signal?: AbortSignal) => api.get('/traces', { schema: TraceList, signal, query: { groupId, q, pageSize: 100 } })
export const fetchTrace = (id: string, signal?: AbortSignal) => api.get(`/traces/${enc(id)}`, { schema: TraceDetail, signal })
export const fetchTraceData = (id: string, maxPoints?: number, signal?: AbortSignal) => api.get(`/traces/${enc(id)}/data`, { schema: TraceData, signal, query: { maxPoints } })
export const deleteTrace = (id: string) => api.delete(`/traces/${enc(id)}`)
export const traceOriginalUrl = (id: string) => `/api/traces/${enc(id)}/original`

/**
 * Uploads with XMLHttpRequest, because fetch reports no upload progress. `onProgress` gets the sent fraction.
 * Rejects with ApiError like every other call.
 */
export function uploadTrace(file: File, settings: TraceUploadSettings, onProgress: (fraction: number) => void): { done: Promise<TraceDetail>; abort: () => void } {
  const xhr = new XMLHttpRequest()
  const done = new Promise<TraceDetail>((resolve, reject) => {
    const form = new FormData()
    form.append('settings', JSON.stringify(settings))
    form.append('file', file, file.name)
    xhr.open('POST', '/api/traces')
    xhr.withCredentials = true
    xhr.setRequestHeader('Accept', 'application/json')
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total)
    xhr.onerror = () => reject(networkError(new Error('upload failed')))
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was cancelled.'))
    xhr.onload = () => {
      let body: unknown = null
      try {
        body = JSON.parse(xhr.responseText)
      } catch {
        /* the status text will do */
      }
      if (xhr.status !== 201) return reject(apiErrorFrom(xhr.status, body))
      const parsed = TraceDetail.safeParse(body)
      if (parsed.success) resolve(parsed.data)
      else reject(new ApiError(xhr.status, 'bad_response', 'Unexpected response from POST /traces.'))
    }
    xhr.send(form)
  })
  return { done, abort: () => xhr.abort() }
}
