import { FitDetail, FitList, type FitRequestInput } from '@shared/api/fits'
import { api } from './client'

export const createFit = (body: FitRequestInput) => api.post('/fits', body, { schema: FitDetail })
export const fetchFit = (id: string, signal?: AbortSignal) => api.get(`/fits/${encodeURIComponent(id)}`, { schema: FitDetail, signal })
export const listFits = (by: { traceId?: string; runId?: string }, signal?: AbortSignal) => api.get('/fits', { schema: FitList, signal, query: by })
export const deleteFit = (id: string) => api.delete(`/fits/${encodeURIComponent(id)}`)
