// Quotas per user and per group (server/modules/quotas): runs in flight answer 429, the daily cell-update budget
// 422, each naming the quota, its limit, the use and when it frees up; unconfirmed accounts get the small quota,
// site admins none. The charge of a run is the shared resource estimate (shared/physics/resource-estimate.ts).
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBody } from '@shared/api/api-error'
import { chooseGrid } from '@shared/physics/grid-step'
import { estimateResources } from '@shared/physics/resource-estimate'
import { RunDetail } from '@shared/api/runs'
import { SweepDetail } from '@shared/api/sweeps'
import { createApp } from '../../server/app'
import { parseEnv, type QuotaConfig } from '../../server/env'
import { memberships } from '../../server/db/schema'
import { runsRoutes } from '../../server/modules/runs/runs.routes'
import { sweepsRoutes } from '../../server/modules/sweeps/sweeps.routes'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, newUser, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'
import { powerSweep, tinySweepBase } from './sweeps-fixtures'

const { db, pool } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('quotas'))
let boss: Awaited<typeof setup>['jobs']['boss']
let relay: Awaited<typeof setup>['relay']

const parsed = parseEnv({}, { devSecret: () => 'x'.repeat(32) })
if (!parsed.ok) throw new Error(parsed.errors.join('; '))
/** The documented defaults (README's configuration table). */
const DEFAULTS: QuotaConfig = parsed.config.quotas

beforeAll(async () => {
  ;({ relay } = await setup)
  boss = (await setup).jobs.boss
})

/** The runs and sweeps API with these quotas; sweeps are stored but not fed (no feeder runs here). */
function appWith(quotas: QuotaConfig) {
  const deps = { db, pool, log: silentLog, boss, quotas }
  return createApp({ db, pool, log: silentLog, routes: [['/runs', runsRoutes({ ...deps, relay })], ['/sweeps', sweepsRoutes({ ...deps, feeder: { poke: () => {} } })]] })
}

const RUN = chipRun()
/** One run's charge: the estimate the API stores with it. */
const RUN_CELL_UPDATES = estimateResources(RUN, chooseGrid(RUN)).cellUpdates

const confirm = (m: { userId: string }) => pool.query(`update users set email_confirmed_at = now() where id = $1`, [m.userId])
const submit = (app: ReturnType<typeof appWith>, who: Member, title = 'Quota probe') =>
  request(app).post('/api/runs').set('Authorization', who.auth).send({ groupId: who.groupId, title, config: RUN })
const cancel = (app: ReturnType<typeof appWith>, who: Member, id: string) => request(app).post(`/api/runs/${id}/cancel`).set('Authorization', who.auth)
/** What a worker writes when it takes a run and when it finishes it. */
const markStarted = (id: string) => pool.query(`update runs set status = 'running', started_at = now(), attempt = 1 where id = $1`, [id])
const markSucceeded = (id: string) => pool.query(`update runs set status = 'succeeded', started_at = coalesce(started_at, now()), finished_at = now() where id = $1`, [id])

function quotaError(res: request.Response, status: number, code: string): string {
  expect(res.status).toBe(status)
  const body = ApiErrorBody.parse(res.body)
  expect(body.error.code).toBe(code)
  expect(body.error.requestId).toBeTruthy()
  return body.error.message
}

describe('runs in flight', () => {
  it('allows an unconfirmed account one run in flight, answers 429 naming the quota, and frees it when the run is cancelled', async () => {
    const app = appWith(DEFAULTS)
    const m = await newMember(db, 'editor')
    const first = await submit(app, m)
    expect(first.status).toBe(202)

    const message = quotaError(await submit(app, m), 429, 'quota_runs_in_flight')
    expect(message).toContain('quota of runs in flight for an account whose email address is not confirmed')
    expect(message).toContain('1 run in flight of at most 1')
    expect(message).toContain('It frees up as soon as it finishes or you cancel it')
    expect(message).toContain(`raise the quota to ${DEFAULTS.user.runsInFlight}`)

    expect((await cancel(app, m, first.body.id)).status).toBe(200)
    expect((await submit(app, m)).status).toBe(202)
  })

  it('gives a confirmed account the larger quota, and frees a place when a run finishes', async () => {
    const app = appWith(DEFAULTS)
    const m = await newMember(db, 'editor')
    await confirm(m)
    const ids: string[] = []
    for (let i = 0; i < DEFAULTS.user.runsInFlight; i++) {
      const res = await submit(app, m, `Burst ${i}`)
      expect(res.status).toBe(202)
      ids.push(res.body.id)
    }

    const message = quotaError(await submit(app, m), 429, 'quota_runs_in_flight')
    expect(message).toContain(`quota of runs in flight per user: ${DEFAULTS.user.runsInFlight} runs in flight of at most ${DEFAULTS.user.runsInFlight}`)
    expect(message).toContain('It frees up as soon as one of them finishes or you cancel it')

    await markSucceeded(ids[0])
    expect((await submit(app, m)).status).toBe(202)
  })

  it('counts every member toward the group quota, and not other groups', async () => {
    const app = appWith({ ...DEFAULTS, group: { runsInFlight: 2, cellUpdatesPerDay: DEFAULTS.group.cellUpdatesPerDay } })
    const a = await newMember(db, 'editor')
    const b = await newMember(db, 'editor', a.groupId, 'Mei Okafor')
    const elsewhere = await newMember(db, 'editor', undefined, 'Ines Vidal')
    await Promise.all([a, b, elsewhere].map(confirm))
    expect((await submit(app, a)).status).toBe(202)
    expect((await submit(app, b)).status).toBe(202)

    const message = quotaError(await submit(app, a), 429, 'quota_runs_in_flight')
    expect(message).toContain('Your group has reached its quota of runs in flight per group: 2 runs in flight of at most 2')
    expect((await submit(app, elsewhere)).status).toBe(202)
  })

  it('exempts site admins', async () => {
    const app = appWith(DEFAULTS)
    const admin = await newUser(db, 'Ingrid Solvang', { isAdmin: true })
    const m = await newMember(db, 'owner')
    await db.insert(memberships).values({ userId: admin.userId, groupId: m.groupId, role: 'editor' })
    const asAdmin = { ...admin, groupId: m.groupId }
    // Unconfirmed, yet past the unconfirmed quota of 1.
    for (let i = 0; i < 3; i++) expect((await submit(app, asAdmin)).status).toBe(202)
  })
})

describe('cell-updates per day', () => {
  it('refuses a run over the daily budget with 422 naming it, its use and when it frees up; an unstarted cancelled run is not charged', async () => {
    const limit = 2.5 * RUN_CELL_UPDATES
    const app = appWith({ ...DEFAULTS, user: { runsInFlight: 20, cellUpdatesPerDay: limit } })
    const m = await newMember(db, 'editor')
    await confirm(m)
    const first = RunDetail.parse((await submit(app, m, 'First')).body)
    const second = RunDetail.parse((await submit(app, m, 'Second')).body)
    await markStarted(first.id)

    const message = quotaError(await submit(app, m, 'Third'), 422, 'quota_cell_updates_per_day')
    // The first charge leaves the rolling 24-hour window a day after the first run was queued.
    const freesAt = new Date(Date.parse(first.createdAt) + 24 * 3600 * 1000).toISOString()
    expect(message).toContain(`This run needs ${RUN_CELL_UPDATES.toExponential(2)} cell-updates`)
    expect(message).toContain(`quota of ${limit.toExponential(2)} cell-updates per day per user`)
    expect(message).toContain(`${(2 * RUN_CELL_UPDATES).toExponential(2)} were used in the last 24 hours`)
    expect(message).toContain(`Enough frees up at ${freesAt.slice(11, 16)} UTC on ${freesAt.slice(0, 10)}`)

    // The second never started: cancelling it gives its charge back; the started first one stays charged.
    expect((await cancel(app, m, second.id)).status).toBe(200)
    const third = await submit(app, m, 'Third')
    expect(third.status).toBe(202)
    expect((await cancel(app, m, first.id)).status).toBe(200)
    quotaError(await submit(app, m, 'Fourth'), 422, 'quota_cell_updates_per_day')
  })

  it('charges a sweep its whole estimate at creation and counts it as one item in flight', async () => {
    const base = tinySweepBase()
    const point = estimateResources(base, chooseGrid(base)).cellUpdates
    const app = appWith({ ...DEFAULTS, unconfirmed: { runsInFlight: 1, cellUpdatesPerDay: 3.5 * point } })
    const m = await newMember(db, 'editor')
    const post = (body: object) => request(app).post('/api/sweeps').set('Authorization', m.auth).send(body)

    // Four points of roughly equal cost are over 3.5 points' worth: too big for the quota whatever the wait.
    const tooBig = quotaError(await post(powerSweep(m.groupId, 'Four powers', 4)), 422, 'quota_cell_updates_per_day')
    expect(tooBig).toMatch(/^This sweep needs .* cell-updates, more than your whole quota of .* cell-updates per day for an account whose email address is not confirmed/)
    const sweep = await post(powerSweep(m.groupId, 'Two powers', 2))
    expect(sweep.status).toBe(202)
    expect(SweepDetail.parse(sweep.body).points).toHaveLength(2)

    // The running sweep holds the one place in flight (a place in flight is checked before the budget).
    const message = quotaError(await post(powerSweep(m.groupId, 'Two more powers', 2)), 429, 'quota_runs_in_flight')
    expect(message).toContain('1 run in flight of at most 1 (single runs queued or running, and sweeps not yet finished)')
  })
})
