// The sweeps API without workers: validation, the whole-sweep limit, point runs and their ordering in the
// queue, policy, share links, cancel and re-run. tests/jobs/sweeps.test.ts runs sweeps on real workers.
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SweepDetail, SweepEstimateResponse, SweepList, axisValues } from '@shared/api/sweeps'
import { RunDetail, RunList } from '@shared/api/runs'
import { pickNext } from '../../server/modules/sweeps/sweep-feeder'
import { createApp } from '../../server/app'
import { sharesRoutes } from '../../server/modules/shares/shares.routes'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'
import { powerSweep, sweepsForTest, tinySweepBase } from './sweeps-fixtures'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('sweeps-api')
let app: ReturnType<typeof createApp>
let editor: Member
let viewer: Member
let outsider: Member
let feedNow: () => Promise<void>
const bossSchema = schema
// Started while the file is collected, so their afterAll hooks (stop) register at the top level.
const setup = runRoutesForTest(db, pool, schema).then(async (r) => ({ ...r, sweeps: await sweepsForTest(db, pool, r.jobs.boss, { feedIntervalMs: 60_000 }) }))
// Before pool.end (hooks run in reverse): the feeder holds a LISTEN connection of the pool.
afterAll(async () => (await setup).sweeps.module.stop())

beforeAll(async () => {
  const { routes, sweeps } = await setup
  feedNow = sweeps.module.feeder.feedNow
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ...sweeps.routes, ['/shares', sharesRoutes({ db })]] })
  editor = await newMember(db, 'editor', undefined, 'Tomas Reyes')
  viewer = await newMember(db, 'viewer', editor.groupId, 'Mei Okafor')
  outsider = await newMember(db, 'owner', undefined, 'Someone Else')
})

const post = (path: string, who: Member, body?: unknown) => request(app).post(`/api${path}`).set('Authorization', who.auth).send(body as object)
const get = (path: string, who?: Member) => (who ? request(app).get(`/api${path}`).set('Authorization', who.auth) : request(app).get(`/api${path}`))

/** pg-boss jobs of the test's queue schema for these runs: priority and state. */
async function jobsOf(runIds: string[]) {
  const { rows } = await pool.query(`select data->>'runId' as run_id, priority, state from ${bossSchema}.job where data->>'runId' = any($1)`, [runIds])
  return rows as { run_id: string; priority: number; state: string }[]
}

describe('axis values', () => {
  it('spaces a log range geometrically and ends exactly on the typed stop value', () => {
    // Common practice: a logarithmic range has a constant ratio between neighbours.
    const v = axisValues({ kind: 'log', start: 0.1, stop: 10, count: 5 })
    expect(v).toHaveLength(5)
    expect(v[4]).toBe(10)
    for (let i = 1; i < 5; i++) expect(v[i] / v[i - 1]).toBeCloseTo(Math.sqrt(10), 12)
    expect(axisValues({ kind: 'linear', start: 1, stop: 2, count: 3 })).toEqual([1, 1.5, 2])
  })
})

describe('POST /api/sweeps', () => {
  it('creates the sweep and one queued run per point, linked by sweep id and point index', async () => {
    const res = await post('/sweeps', editor, powerSweep(editor.groupId, 'Write power scan', 5))
    expect(res.status).toBe(202)
    const sweep = SweepDetail.parse(res.body)
    expect(sweep.pointCount).toBe(5)
    expect(sweep.points.map((p) => p.index)).toEqual([0, 1, 2, 3, 4])
    expect(sweep.points.map((p) => p.values[0])).toEqual([0.5, 1, 1.5, 2, 2.5])
    expect(sweep.counts.queued).toBe(5)
    const { rows } = await pool.query(`select sweep_point, config, status, group_id, author_id from runs where sweep_id = $1 order by sweep_point`, [sweep.id])
    expect(rows.map((r) => r.sweep_point)).toEqual([0, 1, 2, 3, 4])
    // Each run's config is the base config with the axis value applied to the labelled pulse.
    expect(rows.map((r) => r.config.channels[0].pump.pulses[0].peakPowerW)).toEqual([0.5, 1, 1.5, 2, 2.5])
    expect(rows.every((r) => r.status === 'queued' && r.group_id === editor.groupId && r.author_id === editor.userId)).toBe(true)
    expect(sweep.metrics.map((m) => m.key)).toContain('window:late Stokes')
    // A point's run says which sweep and point it belongs to, so its page can link back.
    const pointRun = RunDetail.parse((await get(`/runs/${sweep.points[3].runId}`, editor)).body)
    expect([pointRun.sweepId, pointRun.sweepPoint, pointRun.queuePosition]).toEqual([sweep.id, 3, null])
    // Its title numbers points from 1, as the sweep page, the CSV and the mail do.
    expect(pointRun.title).toBe('Write power scan · point 4 (Pulse peak power [write] = 2)')
  })

  it('titles point runs with axis values rounded to six significant digits, not the float noise of a sum', async () => {
    const m = await newMember(db, 'editor')
    // 0.1 + 0.2 is 0.30000000000000004 in binary floating point (IEEE 754 double; common practice).
    const res = await post('/sweeps', m, { ...powerSweep(m.groupId, 'Rounded', 2), axes: [{ field: 'pulsePeakPowerW', pulseLabel: 'write', values: { kind: 'list', values: [0.1 + 0.2, 1 / 3] } }] })
    const sweep = SweepDetail.parse(res.body)
    const titles = await Promise.all(sweep.points.map(async (p) => RunDetail.parse((await get(`/runs/${p.runId}`, m)).body).title))
    expect(titles).toEqual(['Rounded · point 1 (Pulse peak power [write] = 0.3)', 'Rounded · point 2 (Pulse peak power [write] = 0.333333)'])
    // Leave nothing for the feeder tests below to find: they count what the feeder sends.
    expect((await post(`/sweeps/${sweep.id}/cancel`, m)).status).toBe(200)
  })

  it('lists sweep points apart from single runs when asked, each marked with its sweep and point', async () => {
    const m = await newMember(db, 'editor')
    const sweep = SweepDetail.parse((await post('/sweeps', m, powerSweep(m.groupId, 'Kind filter', 3))).body)
    await post('/runs', m, { groupId: m.groupId, title: 'A single run', config: chipRun() })
    const list = async (kind: string) => RunList.parse((await get(`/runs?groupId=${m.groupId}&kind=${kind}&sort=title_asc`, m)).body)

    const points = await list('sweep')
    const singles = await list('single')
    const all = await list('all')

    expect(points.items.map((r) => [r.sweepId, r.sweepPoint])).toEqual(expect.arrayContaining([[sweep.id, 0], [sweep.id, 1], [sweep.id, 2]]))
    expect(points.total).toBe(3)
    expect(singles.items.map((r) => [r.title, r.sweepId])).toEqual([['A single run', null]])
    expect(all.total).toBe(4)
    expect((await get(`/runs?kind=sweeps`, m)).status).toBe(400)
    // Folded: the single run and one row for the sweep (its first point's run), not its three points.
    const folded = await list('folded')
    expect(folded.total).toBe(2)
    expect(folded.items.map((r) => [r.sweepId, r.sweepPoint]).sort()).toEqual([[null, null], [sweep.id, 0]].sort())
    // Leave nothing for the feeder tests below to find: they count what the feeder sends.
    expect((await post(`/sweeps/${sweep.id}/cancel`, m)).status).toBe(200)
  })

  it('lengthens the window of the points whose pulse would leave it, and keeps the choice with the sweep', async () => {
    // The tiny base run has a 4 ns window; its write pulse (FWHM 0.4995 ns) centred at 3.9 ns would lose energy after
    // the end. 10⁻³ of a Gaussian's energy lies beyond c + erfc⁻¹(2·10⁻³)·F/(2√ln2) = c + 1.3123 F = 4.5555 ns.
    const res = await post('/sweeps', editor, { ...powerSweep(editor.groupId, 'Late write', 2), axes: [{ field: 'pulseCentreNs', pulseLabel: 'write', values: { kind: 'list', values: [1, 3.9] } }] })
    expect(res.status).toBe(202)
    const sweep = SweepDetail.parse(res.body)
    expect(sweep.extendWindow).toBe(true)
    const { rows } = await pool.query(`select sweep_point, config from runs where sweep_id = $1 order by sweep_point`, [sweep.id])
    expect(rows[0].config.windowNs).toBe(4)
    expect(rows[1].config.windowNs).toBe(4.56)
    await post(`/sweeps/${sweep.id}/cancel`, editor)
  })

  it('builds a 2-D sweep with axis 0 varying slowest', async () => {
    const body = {
      ...powerSweep(editor.groupId, '2-D', 2),
      axes: [
        { field: 'pulseFwhmNs', pulseLabel: 'write', values: { kind: 'list', values: [0.4, 0.6] } },
        { field: 'stokesPowerW', values: { kind: 'log', start: 1e-4, stop: 1e-2, count: 3 } },
      ],
    }
    const res = await post('/sweeps', editor, body)
    expect(res.status).toBe(202)
    const sweep = SweepDetail.parse(res.body)
    expect(sweep.points.map((p) => p.values)).toEqual([[0.4, 1e-4], [0.4, sweep.axisValues[1][1]], [0.4, 1e-2], [0.6, 1e-4], [0.6, sweep.axisValues[1][1]], [0.6, 1e-2]])
    const { rows } = await pool.query(`select config from runs where sweep_id = $1 and sweep_point = 5`, [sweep.id])
    expect(rows[0].config.channels[0].pump.pulses[0].fwhmNs).toBe(0.6)
    expect(rows[0].config.channels[0].stokes.backgroundPowerW).toBe(1e-2)
  })

  it('refuses a sweep over the total limit with 422 naming the limit and the total', async () => {
    // 64 points (an axis's most) of ~1.8e10 cell-updates each: every point is under the run limit (2e10), the
    // sum (~1.2e12) is over the sweep limit (50 × 2e10).
    const base = tinySweepBase(45_000, 1)
    const res = await post('/sweeps', editor, powerSweep(editor.groupId, 'Too big', 64, base))
    expect(res.status).toBe(422)
    expect(res.body.error.code).toBe('over_limit')
    expect(res.body.error.message).toMatch(/over the sweep limit of 1\.00e\+12/)
    const { rows } = await pool.query(`select count(*)::int as n from sweeps where title = 'Too big'`)
    expect(rows[0].n).toBe(0)
    // The estimate endpoint gives the same numbers before submitting.
    const est = await post('/sweeps/estimate', editor, { baseConfig: base, axes: powerSweep(editor.groupId, '', 64).axes })
    expect(est.status).toBe(200)
    const parsed = SweepEstimateResponse.parse(est.body)
    expect(parsed.ok).toBe(false)
    expect(parsed.estimate.cellUpdates).toBeGreaterThan(1e12)
    expect(res.body.error.message).toContain(`needs ${parsed.estimate.cellUpdates.toPrecision(3)} cell-updates in total over 64 points`)
    expect(parsed.message).toBe(res.body.error.message)
  })

  it('answers 400 with field paths for an unknown pulse label, a bad range and a point outside the window', async () => {
    const unknown = await post('/sweeps', editor, { ...powerSweep(editor.groupId, 'x', 3), axes: [{ field: 'pulseFwhmNs', pulseLabel: 'nope', values: { kind: 'list', values: [1] } }] })
    expect(unknown.status).toBe(400)
    expect(unknown.body.error.fields[0]).toMatchObject({ path: 'axes.0.pulseLabel' })
    expect(unknown.body.error.fields[0].message).toMatch(/no pulse labelled "nope" \(labels: write\)/)

    const badLog = await post('/sweeps', editor, { ...powerSweep(editor.groupId, 'x', 3), axes: [{ field: 'stokesPowerW', values: { kind: 'log', start: 0, stop: 1, count: 3 } }] })
    expect(badLog.status).toBe(400)
    expect(badLog.body.error.fields.map((f: { path: string }) => f.path)).toContain('axes.0.values.start')

    // Points are numbered from 1, as on the sweep page; the window is kept as set when asked to.
    const outside = await post('/sweeps', editor, {
      ...powerSweep(editor.groupId, 'x', 3),
      extendWindow: false,
      axes: [{ field: 'pulseCentreNs', pulseLabel: 'write', values: { kind: 'list', values: [1, 9] } }],
    })
    expect(outside.status).toBe(400)
    // The field in words, as the run form names it: no JSON path reaches the user.
    expect(outside.body.error.fields[0].message).toMatch(/Point 2 \(.*= 9\) is not a valid run: Pump pulse 1, centre time: The pulse centre must lie inside the simulated window/)
    expect(outside.body.error.fields[0].message).not.toMatch(/channels\.|centreNs|pulses\./)
  })

  it('lets viewers read but not create, and hides sweeps from non-members', async () => {
    const created = await post('/sweeps', editor, powerSweep(editor.groupId, 'Policy', 2))
    expect((await post('/sweeps', viewer, powerSweep(editor.groupId, 'Viewer', 2))).status).toBe(403)
    expect((await get(`/sweeps/${created.body.id}`, viewer)).status).toBe(200)
    expect((await get(`/sweeps/${created.body.id}`, outsider)).status).toBe(404)
    expect((await post(`/sweeps/${created.body.id}/cancel`, viewer)).status).toBe(403)
    expect((await get('/sweeps/not-a-uuid', editor)).status).toBe(404)
    const list = SweepList.parse((await get(`/sweeps?groupId=${editor.groupId}`, viewer)).body)
    expect(list.items.some((s) => s.id === created.body.id)).toBe(true)
  })

  it('gives a sweep a share link that reads the sweep and its download, and nothing else', async () => {
    const created = await post('/sweeps', editor, powerSweep(editor.groupId, 'Shared', 2))
    const share = await post('/shares', editor, { resourceType: 'sweep', resourceId: created.body.id, public: true })
    expect(share.status).toBe(201)
    expect(share.body.path).toBe(`/sweeps/${created.body.id}?share=${encodeURIComponent(share.body.token)}`)
    expect((await get(`/sweeps/${created.body.id}?share=${share.body.token}`)).status).toBe(200)
    expect((await get(`/sweeps/${created.body.id}/download?share=${share.body.token}`)).status).toBe(200)
    expect((await get(`/sweeps/${created.body.id}`)).status).toBe(401)
    expect((await get(`/sweeps/${created.body.id}?share=shr_wrongwrongwrongwrong`, outsider)).status).toBe(404)
  })
})

describe('the feeder', () => {
  it('sends sweep points below the priority of single runs and only a few at a time', async () => {
    const sweep = SweepDetail.parse((await post('/sweeps', editor, powerSweep(editor.groupId, 'Feeding', 6))).body)
    await feedNow()
    const single = await post('/runs', editor, { groupId: editor.groupId, title: 'Single', config: chipRun(4, 4) })
    expect(single.status).toBe(202)
    // Every sweep point of this file waiting in pg-boss: no worker takes them here, so the feeder stops at
    // its depth (one per live solver thread, at least one; other test files' workers may count).
    const { rows } = await pool.query(`select id from runs where sweep_id is not null and group_id = $1`, [editor.groupId])
    const fed = await jobsOf(rows.map((r) => r.id))
    expect(fed.length).toBeGreaterThanOrEqual(1)
    expect(fed.length).toBeLessThan(6)
    expect(fed.every((j) => j.priority < 0 && j.state === 'created')).toBe(true)
    const jobs = await jobsOf([single.body.id, ...sweep.points.map((p) => p.runId)])
    expect(jobs.find((j) => j.run_id === single.body.id)!.priority).toBe(0)
  })

  it('picks the author with the fewest points in flight, then whoever was fed longest ago', () => {
    const c = (sweepId: string, authorKey: string, inFlight: number, lastFedAt: number, createdAt = 0) => ({ sweepId, authorKey, inFlight, lastFedAt, createdAt })
    expect(pickNext([c('a1', 'A', 2, 5), c('b1', 'B', 1, 9)])!.sweepId).toBe('b1')
    expect(pickNext([c('a1', 'A', 1, 5), c('b1', 'B', 1, 9)])!.sweepId).toBe('a1')
    // A's two sweeps share A's turn: A has 2 in flight against B's 1.
    expect(pickNext([c('a1', 'A', 1, 1), c('a2', 'A', 1, 2), c('b1', 'B', 1, 3)])!.sweepId).toBe('b1')
    expect(pickNext([c('a1', 'A', 1, 1), c('a2', 'A', 0, 2), c('b1', 'B', 2, 3)])!.sweepId).toBe('a2')
    expect(pickNext([])).toBeNull()
  })
})

describe('cancel and re-run', () => {
  it('cancels every remaining point and their jobs; a second cancel is 409', async () => {
    const sweep = SweepDetail.parse((await post('/sweeps', editor, powerSweep(editor.groupId, 'To cancel', 4))).body)
    await feedNow()
    const res = await post(`/sweeps/${sweep.id}/cancel`, editor)
    expect(res.status).toBe(200)
    const after = SweepDetail.parse(res.body)
    expect(after.status).toBe('cancelled')
    expect(after.counts.cancelled).toBe(4)
    const jobs = await jobsOf(sweep.points.map((p) => p.runId))
    expect(jobs.every((j) => j.state === 'cancelled')).toBe(true)
    expect((await post(`/sweeps/${sweep.id}/cancel`, editor)).status).toBe(409)
  })

  it('re-runs failed points as new runs of the same point and reopens the sweep', async () => {
    const sweep = SweepDetail.parse((await post('/sweeps', editor, powerSweep(editor.groupId, 'Re-run', 3))).body)
    expect((await post(`/sweeps/${sweep.id}/rerun-failed`, editor)).status).toBe(409)
    // Arrange a finished sweep with one failed point (as a worker would have written it).
    await pool.query(`update runs set status = 'succeeded', finished_at = now() where sweep_id = $1 and sweep_point <> 1`, [sweep.id])
    await pool.query(`update runs set status = 'failed', error = 'solver failed', finished_at = now() where sweep_id = $1 and sweep_point = 1`, [sweep.id])
    await pool.query(`update sweeps set status = 'finished', finished_at = now() where id = $1`, [sweep.id])
    const res = await post(`/sweeps/${sweep.id}/rerun-failed`, editor)
    expect(res.status).toBe(202)
    const after = SweepDetail.parse(res.body)
    expect(after.status).toBe('running')
    expect(after.counts).toMatchObject({ succeeded: 2, queued: 1, failed: 0 })
    const point1 = after.points.find((p) => p.index === 1)!
    expect(point1.runId).not.toBe(sweep.points[1].runId)
    const { rows } = await pool.query(`select count(*)::int as n from runs where sweep_id = $1 and sweep_point = 1`, [sweep.id])
    expect(rows[0].n).toBe(2)
  })
})
