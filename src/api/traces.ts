import { TraceData, TraceDetail, TraceList, type TraceUploadSettings } from '@shared/api/traces'
import { api, apiUpload } from './client'

const enc = encodeURIComponent

export const listTraces = (groupId: string, q?: string, signal?: AbortSignal) => api.get('/traces', { schema: TraceList, signal, query: { groupId, q, pageSize: 100 } })
export const fetchTrace = (id: string, signal?: AbortSignal) => api.get(`/traces/${enc(id)}`, { schema: TraceDetail, signal })
export const fetchTraceData = (id: string, maxPoints?: number, signal?: AbortSignal) => api.get(`/traces/${enc(id)}/data`, { schema: TraceData, signal, query: { maxPoints } })
export const deleteTrace = (id: string) => api.delete(`/traces/${enc(id)}`)
export const traceOriginalUrl = (id: string) => `/api/traces/${enc(id)}/original`

/** Uploads with progress (apiUpload); `onProgress` gets the sent fraction. Rejects with ApiError like every other call. */
export function uploadTrace(file: File, settings: TraceUploadSettings, onProgress: (fraction: number) => void): { done: Promise<TraceDetail>; abort: () => void } {
  const form = new FormData()
  form.append('settings', JSON.stringify(settings))
  form.append('file', file, file.name)
  return apiUpload('/traces', form, { schema: TraceDetail, onProgress })
}
