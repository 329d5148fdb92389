import { QueueStatus } from '@shared/api/runs'
import { api, ApiError } from './client'

/**
 * GET /api/queue. The API serves it to site admins only; for everyone else this resolves to null, and the
 * views fall back to what the runs list itself tells (queued and running runs of the group).
 */
export async function fetchQueue(signal?: AbortSignal): Promise<QueueStatus | null> {
  try {
    return await api.get('/queue', { schema: QueueStatus, signal })
  } catch (e) {
    if (e instanceof ApiError && (e.status === 403 || e.status === 404)) return null
    throw e
  }
}
