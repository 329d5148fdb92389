import { ApiTokenSummary, CreatedApiToken, type ApiTokenCreateBody } from '@shared/api/auth'
import { z } from 'zod'
import { api } from './client'

export const listTokens = () => api.get('/tokens', { schema: z.object({ tokens: z.array(ApiTokenSummary) }) })
export const createToken = (body: ApiTokenCreateBody) => api.post('/tokens', body, { schema: CreatedApiToken })
export const revokeToken = (id: string) => api.delete(`/tokens/${encodeURIComponent(id)}`)
