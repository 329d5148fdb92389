import { z } from 'zod'
import { RunDetail, RunList, type RunClone, type RunListQuery } from '@shared/api/runs'
import { CreatedShareLink } from '@shared/api/shares'
import { SpeedCalibration } from '@shared/api/estimates'
import { api, apiBytes, ApiError } from './client'

/** Query of GET /api/runs as the list view builds it (page and pageSize always set). */
export type RunListParams = Partial<RunListQuery> & { page: number; pageSize: number }

/** A share token from the page's ?share=, handed on so people outside the group can read a shared run. */
export type ShareToken = string | undefined

const withShare = (url: string, share: ShareToken) => (share ? `${url}${url.includes('?') ? '&' : '?'}share=${encodeURIComponent(share)}` : url)

export const fetchRun = (id: string, share?: ShareToken, signal?: AbortSignal) =>
  api.get(`/runs/${encodeURIComponent(id)}`, { schema: RunDetail, signal, query: { share } })

export const listRuns = (q: RunListParams, signal?: AbortSignal) =>
  api.get('/runs', { schema: RunList, signal, query: { ...q } as Record<string, string | number | undefined> })

/** The solver speeds this server measured on its recent runs (the forms' estimates take them). */
export const fetchSpeedCalibration = (signal?: AbortSignal) => api.get('/runs/speed', { schema: SpeedCalibration, signal })

export const cancelRun = (id: string) => api.post(`/runs/${encodeURIComponent(id)}/cancel`, {}, { schema: RunDetail })

export const cloneRun = (id: string, body: RunClone = {}) => api.post(`/runs/${encodeURIComponent(id)}/clone`, body, { schema: RunDetail })

export const shareRun = (id: string, isPublic = false) => api.post('/shares', { resourceType: 'run', resourceId: id, public: isPublic }, { schema: CreatedShareLink })

export const runEventsUrl = (id: string, share?: ShareToken) => withShare(`/api/runs/${encodeURIComponent(id)}/events`, share)
export const runDownloadUrl = (id: string, share?: ShareToken) => withShare(`/api/runs/${encodeURIComponent(id)}/download`, share)

/** One result array as it arrives from GET /api/runs/:id/arrays/:name (binary, little-endian). */
export interface RunArray {
  name: string
  dtype: 'c16' | 'f8' | 'f4'
  shape: number[]
  units: string
  /** Flat values; c16 arrays are interleaved re, im pairs. */
  data: Float32Array | Float64Array
}

const DTYPES: Record<string, RunArray['dtype']> = { '<c16': 'c16', '<f8': 'f8', '<f4': 'f4' }
const Shape = z.string().regex(/^\d+(,\d+)*$/)

/** Fetches an array as raw bytes: maps and traces are too large for JSON to be pleasant. */
export async function fetchRunArray(id: string, name: string, share?: ShareToken, signal?: AbortSignal): Promise<RunArray> {
  const res = await apiBytes(`/runs/${encodeURIComponent(id)}/arrays/${encodeURIComponent(name)}`, { query: { format: 'binary', share }, signal })
  const dtype = DTYPES[res.headers.get('X-Dtype') ?? '']
  const shapeHeader = res.headers.get('X-Shape') ?? ''
  if (!dtype || !Shape.safeParse(shapeHeader).success) throw new ApiError(res.status, 'bad_response', `Array ${name} came without a readable dtype or shape.`)
  const data = dtype === 'f4' ? new Float32Array(res.bytes) : new Float64Array(res.bytes)
  return { name, dtype, shape: shapeHeader.split(',').map(Number), units: decodeURIComponent(res.headers.get('X-Units') ?? ''), data }
}
