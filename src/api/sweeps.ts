import { CreatedShareLink } from '@shared/api/shares'
import { SweepCreate, SweepDetail, SweepList, type SweepCreateInput, type SweepListQuery } from '@shared/api/sweeps'
import { api } from './client'

export type ShareToken = string | undefined

const withShare = (url: string, share: ShareToken, extra: Record<string, string> = {}) => {
  const q = new URLSearchParams({ ...extra, ...(share ? { share } : {}) }).toString()
  return q ? `${url}?${q}` : url
}
const path = (id: string) => `/sweeps/${encodeURIComponent(id)}`

export const listSweeps = (q: Partial<SweepListQuery> & { page: number; pageSize: number }, signal?: AbortSignal) =>
  api.get('/sweeps', { query: q, schema: SweepList, signal })

export const fetchSweep = (id: string, share?: ShareToken, signal?: AbortSignal) =>
  api.get(path(id), { query: { share }, schema: SweepDetail, signal })

/** POST /api/sweeps answers 202 with the sweep; the request is checked with the API's own schema first. */
export const createSweep = (request: SweepCreateInput) => api.post(`/sweeps`, SweepCreate.parse(request), { schema: SweepDetail })

export const cancelSweep = (id: string) => api.post(`${path(id)}/cancel`, {}, { schema: SweepDetail })
export const rerunFailedPoints = (id: string) => api.post(`${path(id)}/rerun-failed`, {}, { schema: SweepDetail })
export const shareSweep = (id: string, isPublic = false) =>
  api.post('/shares', { resourceType: 'sweep', resourceId: id, public: isPublic }, { schema: CreatedShareLink })

export const sweepDownloadUrl = (id: string, share: ShareToken, withArrays: boolean) =>
  withShare(`/api${path(id)}/download`, share, withArrays ? { arrays: '1' } : {})
