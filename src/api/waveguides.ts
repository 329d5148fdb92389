import {
  SavedWaveguide,
  SavedWaveguideList,
  type SavedWaveguideCreateInput,
  type SavedWaveguideDuplicate,
  type SavedWaveguideUpdateInput,
} from '@shared/api/waveguides-api'
import { api } from './client'

const one = (id: string) => `/waveguides/${encodeURIComponent(id)}`

export const listGroupWaveguides = (groupId: string, signal?: AbortSignal) =>
  api.get('/waveguides', { query: { groupId }, schema: SavedWaveguideList, signal }).then((r) => r.waveguides)
export const getWaveguide = (id: string) => api.get(one(id), { schema: SavedWaveguide })
export const createWaveguide = (body: SavedWaveguideCreateInput) => api.post('/waveguides', body, { schema: SavedWaveguide })
export const updateWaveguide = (id: string, body: SavedWaveguideUpdateInput) => api.put(one(id), body, { schema: SavedWaveguide })
export const duplicateWaveguide = (id: string, body: SavedWaveguideDuplicate = {}) => api.post(`${one(id)}/duplicate`, body, { schema: SavedWaveguide })
export const deleteWaveguide = (id: string) => api.delete(one(id))
