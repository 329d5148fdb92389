// The last hour of queue depth and busy solver threads, kept in the API process: one sample every
// SAMPLE_INTERVAL_S in a ring of WINDOW_S / SAMPLE_INTERVAL_S entries, one ring per database pool (so each
// test database has its own). Nothing is stored: after a restart the chart starts again, and says from when.
import type { Pool } from 'pg'
import type { QueueSample } from '@shared/api/queue'
import type { Logger } from '../../logger'
import { queueStatus } from './queue.service'

/** Workers report every 10 s; a sample every 30 s draws an hour in 120 points. */
export const SAMPLE_INTERVAL_S = 30
export const WINDOW_S = 3600
const CAPACITY = WINDOW_S / SAMPLE_INTERVAL_S

const rings = new WeakMap<Pool, QueueSample[]>()

function ringOf(pool: Pool): QueueSample[] {
  let ring = rings.get(pool)
  if (!ring) rings.set(pool, (ring = []))
  return ring
}

/** Reads the queue and the workers once and keeps the reading. */
export async function recordQueueSample(pool: Pool, at = new Date()): Promise<QueueSample> {
  const s = await queueStatus(pool)
  const sample: QueueSample = {
    at: at.toISOString(),
    queued: s.queued,
    running: s.running,
    busyThreads: s.workers.reduce((n, w) => n + w.busy, 0),
    threads: s.workers.reduce((n, w) => n + w.threads, 0),
  }
  const ring = ringOf(pool)
  ring.push(sample)
  if (ring.length > CAPACITY) ring.splice(0, ring.length - CAPACITY)
  return sample
}

/** Samples of the last WINDOW_S, oldest first; a fresh one is taken first when the newest is a full interval old. */
export async function recentQueueSamples(pool: Pool, now = new Date()): Promise<QueueSample[]> {
  const ring = ringOf(pool)
  const newest = ring.at(-1)
  if (!newest || now.getTime() - Date.parse(newest.at) >= SAMPLE_INTERVAL_S * 1000) await recordQueueSample(pool, now)
  return ring.filter((s) => now.getTime() - Date.parse(s.at) <= WINDOW_S * 1000)
}

/** Samples every SAMPLE_INTERVAL_S until stopped (server/index.ts); a failed reading is logged and skipped. */
export function startQueueSampler(pool: Pool, log: Logger): () => Promise<void> {
  const take = () => void recordQueueSample(pool).catch((err) => log.warn({ err }, 'queue sample failed'))
  take()
  const timer = setInterval(take, SAMPLE_INTERVAL_S * 1000)
  timer.unref()
  return async () => clearInterval(timer)
}
