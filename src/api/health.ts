import { HealthStatus } from '@shared/api/health'
import { api } from './client'

export interface HealthReading extends HealthStatus {
  /** Browser-measured round trip of the health request. */
  roundTripMs: number
  checkedAt: Date
}

/** GET /api/health. A 503 carries the same body (something is down) and is a reading, not an error. */
export async function fetchHealth(): Promise<HealthReading> {
  const started = performance.now()
  const body = await api.get('/health', { schema: HealthStatus, acceptStatus: [503] })
  return { ...body, roundTripMs: performance.now() - started, checkedAt: new Date() }
}
