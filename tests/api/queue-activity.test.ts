// GET /api/queue/activity: the admin page's hour of queue depth and busy solver threads, and one entry per
// worker with the runs it has finished. Site administrators only.
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { QueueActivity } from '@shared/api/queue'
import { createApp } from '../../server/app'
import { recentQueueSamples, recordQueueSample, SAMPLE_INTERVAL_S, WINDOW_S } from '../../server/modules/queue/queue-history'
import { queueRoutes } from '../../server/modules/queue/queue.routes'
import { silentLog, useTestDb } from './helpers'
import { newMember, newUser } from './runs-fixtures'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, routes: [['/queue', queueRoutes({ pool })]] })

async function insertRun(groupId: string, authorId: string, status: string, workerId: string | null) {
  await pool.query(
    `insert into runs (group_id, author_id, title, config, config_hash, solver_version, status, worker_id) values ($1, $2, 'activity', '{}', 'x', '0.0.1', $3, $4)`,
    [groupId, authorId, status, workerId],
  )
}

describe('GET /api/queue/activity', () => {
  it('gives an admin the queue depth, the busy threads and each worker with the runs it has finished', async () => {
    const admin = await newUser(db, 'Ingrid Solvang', { isAdmin: true })
    const editor = await newMember(db)
    await pool.query(`insert into workers (id, host, pid, threads, busy) values ('lab-a:41:aa', 'lab-a', 41, 4, 2), ('lab-b:7:bb', 'lab-b', 7, 2, 0)`)
    // Worker a: two succeeded and one failed (finished), one running (not yet); worker b: one cancelled (not finished).
    for (const status of ['succeeded', 'succeeded', 'failed', 'running']) await insertRun(editor.groupId, editor.userId, status, 'lab-a:41:aa')
    await insertRun(editor.groupId, editor.userId, 'cancelled', 'lab-b:7:bb')
    for (let i = 0; i < 3; i++) await insertRun(editor.groupId, editor.userId, 'queued', null)

    const res = await request(app).get('/api/queue/activity').set('Authorization', admin.auth)

    expect(res.status).toBe(200)
    expect(res.headers['cache-control']).toBe('no-store')
    const body = QueueActivity.parse(res.body)
    expect(body).toMatchObject({ sampleIntervalS: 30, windowS: 3600 })
    expect(body.samples.at(-1)).toMatchObject({ queued: 3, running: 1, busyThreads: 2, threads: 6 })
    expect(body.workers.map((w) => [w.host, w.threads, w.busy, w.runsFinished])).toEqual([
      ['lab-a', 4, 2, 3],
      ['lab-b', 2, 0, 0],
    ])
  })

  it('refuses a signed-in member who is not a site admin with 403, and anyone signed out with 401', async () => {
    const editor = await newMember(db)

    const member = await request(app).get('/api/queue/activity').set('Authorization', editor.auth)
    const anonymous = await request(app).get('/api/queue/activity')

    expect(member.status).toBe(403)
    expect(member.body.error.message).toBe('Only site administrators can do this')
    expect(anonymous.status).toBe(401)
  })
})

describe('queue history ring', () => {
  // A pool of its own: the ring is kept per pool, so these instants do not mix with the route's samples.
  const { pool: own } = useTestDb()

  it('keeps an hour of 30 s samples, oldest first, and samples afresh only once the newest is an interval old', async () => {
    const t0 = Date.parse('2026-12-03T10:00:00Z')
    // Two and a half hours of samples: only the last hour (121 instants from 0 to 3600 s back) is returned.
    for (let k = 0; k < 300; k++) await recordQueueSample(own, new Date(t0 + k * SAMPLE_INTERVAL_S * 1000))
    const last = t0 + 299 * SAMPLE_INTERVAL_S * 1000

    const within = await recentQueueSamples(own, new Date(last + 10_000))
    const later = await recentQueueSamples(own, new Date(last + SAMPLE_INTERVAL_S * 1000))

    // 10 s after the newest: no new sample; 120 kept (the ring holds WINDOW_S / SAMPLE_INTERVAL_S).
    expect(within).toHaveLength(WINDOW_S / SAMPLE_INTERVAL_S)
    expect(within.at(-1)!.at).toBe(new Date(last).toISOString())
    expect(Date.parse(within[0].at)).toBe(last - (WINDOW_S / SAMPLE_INTERVAL_S - 1) * SAMPLE_INTERVAL_S * 1000)
    // A full interval later: a fresh sample is taken and the oldest falls out.
    expect(later).toHaveLength(WINDOW_S / SAMPLE_INTERVAL_S)
    expect(later.at(-1)!.at).toBe(new Date(last + SAMPLE_INTERVAL_S * 1000).toISOString())
    expect(later.map((s) => Date.parse(s.at))).toEqual([...later.map((s) => Date.parse(s.at))].sort((a, b) => a - b))
  })
})
