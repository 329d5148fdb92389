// Builders for the run tests: a group member with an API token, small chip configs, and a job service on
// a pg-boss schema of the test file's own (parallel test files must not take each other's jobs).
import { randomBytes, randomUUID } from 'node:crypto'
import { afterAll } from 'vitest'
import type { Role } from '../../server/policy/access'
import type { Db, Pool } from '../../server/db/client'
import { groups, memberships, users } from '../../server/db/schema'
import { newSecretToken } from '../../server/modules/auth/secret-token'
import { insertToken } from '../../server/modules/tokens/tokens.repo'
import { startJobService, type JobService } from '../../server/jobs/job-service'
import { queueRoutes } from '../../server/modules/queue/queue.routes'
import { RunEventRelay } from '../../server/modules/runs/run-event-relay'
import { runsRoutes } from '../../server/modules/runs/runs.routes'
import { chipConfig, gaussian } from '../solver/chip-fixtures'
import { silentLog, testDatabaseUrl } from './helpers'
import type { Router } from 'express'

export interface Member {
  userId: string
  groupId: string
  /** Authorization header value. */
  auth: string
}

export async function newGroup(db: Db): Promise<string> {
  const [g] = await db.insert(groups).values({ name: 'Halden Acousto-Optics Lab', slug: `halden-${randomUUID()}` }).returning()
  return g.id
}

export async function newUser(db: Db, name: string, opts: { isAdmin?: boolean } = {}): Promise<{ userId: string; auth: string }> {
  const [u] = await db
    .insert(users)
    .values({ email: `${name.split(' ')[0].toLowerCase()}.${randomBytes(4).toString('hex')}@halden.example`, name, passwordHash: 'not-used', isAdmin: opts.isAdmin ?? false })
    .returning()
  const { token, hash } = newSecretToken('swt_')
  await insertToken(db, { userId: u.id, name: 'tests', tokenHash: hash, tokenPrefix: token.slice(0, 8), expiresAt: null })
  return { userId: u.id, auth: `Bearer ${token}` }
}

export async function newMember(db: Db, role: Role = 'editor', groupId?: string, name = 'Tomas Reyes'): Promise<Member> {
  const gid = groupId ?? (await newGroup(db))
  const u = await newUser(db, name)
  await db.insert(memberships).values({ userId: u.userId, groupId: gid, role })
  return { ...u, groupId: gid }
}

/** The "Halden test rib" chip with a Gaussian pump and a weak CW Stokes seed; windowNs/timeStepPs set the cost. */
export function chipRun(windowNs = 10, timeStepPs = 1) {
  return chipConfig({
    windowNs,
    channels: [{ pump: { pulses: [gaussian(1, windowNs / 3, 0.3)], backgroundPowerW: 0 }, stokes: { pulses: [], backgroundPowerW: 0.001 } }],
    grid: { timeStepPs, mapRows: 64, mapCols: 64, mapReduction: 'max' },
  })
}

export const queueSchemaFor = (file: string) => `pgboss_t_${file.replace(/[^a-z0-9]/gi, '_').toLowerCase().slice(0, 20)}_${randomBytes(3).toString('hex')}`

/** pg-boss (no worker, no watchdog) and the run routes on the test database; stopped after the file. */
export async function runRoutesForTest(db: Db, pool: Pool, schema: string): Promise<{ jobs: JobService; routes: Array<[string, Router]>; relay: RunEventRelay }> {
  const jobs = await startJobService({ databaseUrl: testDatabaseUrl(), pool, log: silentLog, threads: 0, bossSchema: schema, watchdog: false })
  const relay = new RunEventRelay(pool)
  afterAll(async () => {
    relay.close()
    await jobs.stop()
  })
  return { jobs, relay, routes: [['/runs', runsRoutes({ db, pool, log: silentLog, boss: jobs.boss, relay })], ['/queue', queueRoutes({ pool })]] }
}
