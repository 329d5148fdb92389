import type { HealthStatus } from '@shared/api/health'
import type { Pool } from '../../db/client'

export type QueueCheck = () => Promise<boolean>

// A health probe must answer even when PostgreSQL hangs, so each check gets its own deadline.
const CHECK_TIMEOUT_MS = 2_000

function withTimeout<T>(p: Promise<T>, ms: number): Promise<T> {
  return new Promise((resolve, reject) => {
    const t = setTimeout(() => reject(new Error(`timed out after ${ms} ms`)), ms)
    p.then(resolve, reject).finally(() => clearTimeout(t))
  })
}

async function passes(check: () => Promise<unknown>): Promise<boolean> {
  try {
    return (await withTimeout(check(), CHECK_TIMEOUT_MS)) !== false
  } catch {
    return false
  }
}

export async function checkHealth(pool: Pool, queueCheck: QueueCheck | undefined, version: string): Promise<HealthStatus> {
  const [dbOk, queueOk] = await Promise.all([
    passes(() => pool.query('select 1')),
    queueCheck ? passes(queueCheck) : Promise.resolve(null),
  ])
  const queue = queueOk === null ? 'not-configured' : queueOk ? 'ok' : 'down'
  return { ok: dbOk && queue !== 'down', db: dbOk ? 'ok' : 'down', queue, version }
}
