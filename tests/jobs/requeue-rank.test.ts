// A single run handed back after its worker was lost keeps its place in the fair order
// (server/jobs/fair-priority.ts): its new job's priority and its stored queue_rank agree, and it goes back no
// later than the front of the line it was taken from. No worker runs here, so nothing takes the jobs.
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { singleRunPriority } from '../../server/jobs/fair-priority'
import { RUN_QUEUE } from '../../server/jobs/queues'
import { releaseRun } from '../../server/jobs/requeue'
import { findRun, queuePositionOf } from '../../server/modules/runs/runs.repo'
import { silentLog, useTestDb } from '../api/helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from '../api/runs-fixtures'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('requeue-rank')
const setup = runRoutesForTest(db, pool, schema)
let app: ReturnType<typeof createApp>

beforeAll(async () => {
  app = createApp({ db, pool, log: silentLog, routes: (await setup).routes })
})

async function submit(who: Member, title: string): Promise<string> {
  const res = await request(app).post('/api/runs').set('Authorization', who.auth).send({ groupId: who.groupId, title, config: chipRun(4, 4) })
  expect(res.status).toBe(202)
  return res.body.id
}

/** What a worker does when it takes the run: the job goes active, the row running. Then its handler ends. */
async function takeAndLose(runId: string): Promise<string> {
  const { boss } = await setup.then((s) => s.jobs)
  const { rows } = await pool.query(`select job_id from runs where id = $1`, [runId])
  // pg-boss hands out its top job, which need not be this one: the job is marked taken directly.
  await pool.query(`update ${schema}.job set state = 'active', started_on = now() where id = $1`, [rows[0].job_id])
  await pool.query(`update runs set status = 'running', attempt = 1, started_at = now(), heartbeat_at = now() where id = $1`, [runId])
  await boss.complete(RUN_QUEUE, rows[0].job_id)
  expect((await boss.getJobById(RUN_QUEUE, rows[0].job_id))?.state).toBe('completed')
  return rows[0].job_id
}

async function jobPriority(runId: string): Promise<number> {
  const { boss } = await setup.then((s) => s.jobs)
  const { rows } = await pool.query(`select job_id from runs where id = $1`, [runId])
  return (await boss.getJobById(RUN_QUEUE, rows[0].job_id))!.priority
}

describe('a run handed back by the watchdog', () => {
  it('keeps its rank when that is still the front of the line, with the matching priority', async () => {
    const a = await newMember(db, 'editor', undefined, 'Tomas Reyes')
    const b = await newMember(db, 'editor', undefined, 'Mei Okafor')
    // Lift the line off 0 so that a priority of 0 (the top) and the run's rank differ.
    const runs = [await submit(a, 'A0'), await submit(a, 'A1'), await submit(a, 'A2')]
    await pool.query(`update runs set queue_rank = queue_rank + 4 where id = any($1)`, [runs])
    const lost = runs[0]
    const jobId = await takeAndLose(lost)
    const latecomer = await submit(b, 'B0')

    expect(await releaseRun(pool, (await setup).jobs.boss, lost, 1, jobId, 'The worker running this run stopped responding')).toBe('requeued')

    const run = (await findRun(db, lost))!
    expect(run.queueRank).toBe(4)
    expect(await jobPriority(lost)).toBe(singleRunPriority(4))
    // First again: older than the other user's run that took the same turn after it.
    expect(await queuePositionOf(db, run)).toBe(1)
    expect((await findRun(db, latecomer))!.queueRank).toBe(5)
  })

  it('goes back to the front of a line that started again from 0 while it ran', async () => {
    const a = await newMember(db, 'editor', undefined, 'Ines Vidal')
    const b = await newMember(db, 'editor', undefined, 'Ravi Menon')
    const lost = await submit(a, 'A0')
    await pool.query(`update runs set queue_rank = 7 where id = $1`, [lost])
    const jobId = await takeAndLose(lost)
    await pool.query(`update runs set status = 'cancelled' where status = 'queued' and id <> $1`, [lost])
    const others = [await submit(b, 'B0'), await submit(b, 'B1')]
    expect((await findRun(db, others[0]))!.queueRank).toBe(0)

    expect(await releaseRun(pool, (await setup).jobs.boss, lost, 1, jobId, 'lost')).toBe('requeued')

    const run = (await findRun(db, lost))!
    expect(run.queueRank).toBe(0)
    expect(await jobPriority(lost)).toBe(singleRunPriority(0))
  })
})
