// Fair turns for single runs (server/jobs/fair-priority.ts) on a real worker process with one solver thread,
// so the order runs start in is the order the queue hands them out. Everything is queued before the worker
// starts, so the order depends on the priorities alone, not on how fast the machine is.
import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { RunDetail } from '@shared/api/runs'
import { createApp } from '../../server/app'
import { silentLog, useTestDb } from '../api/helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from '../api/runs-fixtures'
import { spawnWorker, waitFor, type WorkerProcess } from './worker-process'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('fair-runs')
const setup = runRoutesForTest(db, pool, schema)
let server: Server
let base: string
const workers: WorkerProcess[] = []

beforeAll(async () => {
  const { routes } = await setup
  server = createApp({ db, pool, log: silentLog, routes }).listen(0, '127.0.0.1')
  await new Promise((r) => server.once('listening', r))
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`
})

afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop()))
  server?.closeAllConnections()
  await new Promise((r) => server?.close(r))
})

/** A tiny run (4 ns window, 4 ps step): well under a second of solver time. */
async function submit(who: Member, title: string): Promise<string> {
  const res = await fetch(`${base}/runs`, {
    method: 'POST',
    headers: { Authorization: who.auth, 'Content-Type': 'application/json' },
    body: JSON.stringify({ groupId: who.groupId, title, config: chipRun(4, 4) }),
  })
  expect(res.status).toBe(202)
  return RunDetail.parse(await res.json()).id
}

describe('single runs from several users on one solver thread', () => {
  it('starts another group’s run right after the front of one user’s burst, and interleaves two bursts run by run', async () => {
    const a = await newMember(db, 'editor', undefined, 'Tomas Reyes')
    const b = await newMember(db, 'editor', undefined, 'Mei Okafor')
    const c = await newMember(db, 'editor', undefined, 'Ines Vidal')
    const titles = new Map<string, string>()
    const queue = async (who: Member, title: string) => titles.set(await submit(who, title), title)
    for (let i = 0; i < 5; i++) await queue(a, `A${i}`)
    for (let i = 0; i < 3; i++) await queue(b, `B${i}`)
    await queue(c, 'C0')

    workers.push(await spawnWorker(schema, 1))
    const ids = [...titles.keys()]
    const started = await waitFor('every run to finish', async () => {
      const { rows } = await pool.query(`select id, status, started_at from runs where id = any($1) order by started_at`, [ids])
      if (rows.some((r) => r.status === 'failed')) throw new Error('a run failed')
      return rows.every((r) => r.status === 'succeeded') && rows.map((r) => titles.get(r.id)!)
    }, 120_000)

    // First come, first served would start A0…A4, B0…B2, then C0. Taking turns, each user's k-th run waits only
    // for the others' k-th runs; among equal turns the older run goes first.
    expect(started).toEqual(['A0', 'B0', 'C0', 'A1', 'B1', 'A2', 'B2', 'A3', 'A4'])
  })
})
