import { SensingMapResponse } from '@shared/api/sensing-map'
import { api } from './client'

const path = (id: string) => `/sweeps/${encodeURIComponent(id)}/sensing-map`

export const fetchSensingMap = (id: string, noiseRms: number, share?: string, signal?: AbortSignal) =>
  api.get(path(id), { query: { noiseRms: String(noiseRms), share }, schema: SensingMapResponse, signal })

/** Address of the CSV table or the NPY gain map (a plain link: the browser downloads it). */
export const sensingMapFileUrl = (id: string, format: 'csv' | 'npy', noiseRms: number, share?: string) => {
  const q = new URLSearchParams({ format, noiseRms: String(noiseRms), ...(share ? { share } : {}) })
  return `/api${path(id)}?${q.toString()}`
}
