// The runs API without a worker: validation, limits, roles, idempotency, listing, cancel while queued, clone.
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { RunDetail, RunList, QueueStatus } from '@shared/api/runs'
import { createApp } from '../../server/app'
import { createShare } from '../../server/modules/shares/shares.service'
import { RUN_QUEUE } from '../../server/jobs/queues'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, newUser, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'

const { db, pool } = useTestDb()
const schema = queueSchemaFor('runs_api')
const setup = runRoutesForTest(db, pool, schema)
let app: ReturnType<typeof createApp>
let editor: Member

beforeAll(async () => {
  const { routes } = await setup
  app = createApp({ db, pool, log: silentLog, routes })
  editor = await newMember(db, 'editor')
})

const submit = (who: Member, body: Record<string, unknown>, headers: Record<string, string> = {}) =>
  request(app).post('/api/runs').set('Authorization', who.auth).set(headers).send(body)

describe('POST /api/runs', () => {
  it('stores a valid run as queued with its config hash and a pg-boss job, and answers 202', async () => {
    const res = await submit(editor, { groupId: editor.groupId, title: 'Stokes seed, 10 ns', config: chipRun() })

    expect(res.status).toBe(202)
    const run = RunDetail.parse(res.body)
    expect(run).toMatchObject({ status: 'queued', attempt: 0, progress: 0, groupId: editor.groupId, authorId: editor.userId, authorName: 'Tomas Reyes' })
    expect(run.configHash).toMatch(/^[0-9a-f]{64}$/)
    const { rows } = await pool.query(`select job_id from runs where id = $1`, [run.id])
    const { jobs } = await setup
    const job = await jobs.boss.getJobById(RUN_QUEUE, rows[0].job_id)
    expect(job?.data).toEqual({ schemaVersion: 1, runId: run.id })
  })

  it('gives equal configs equal hashes whatever the key order', async () => {
    const config = chipRun()
    const reordered = Object.fromEntries(Object.entries(config).reverse())
    const a = await submit(editor, { groupId: editor.groupId, title: 'a', config })
    const b = await submit(editor, { groupId: editor.groupId, title: 'b', config: reordered })

    expect(a.body.configHash).toBe(b.body.configHash)
  })

  it('rejects an invalid config with 400 and the path of each bad field', async () => {
    const config = { ...chipRun(), windowNs: -1, waveguide: { ...chipRun().waveguide, lengthM: 'long' } }

    const res = await submit(editor, { groupId: editor.groupId, title: '', config })

    expect(res.status).toBe(400)
    const paths = res.body.error.fields.map((f: { path: string }) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['title', 'config.windowNs', 'config.waveguide.lengthM']))
  })

  it('refuses a run over the cell-update limit with 422 naming the limit and the knob', async () => {
    // 5 cm chip over 1 µs at 0.1 ps: ~4e3 cells × 1e7 steps = 4e10 cell-updates > 2e10.
    const res = await submit(editor, { groupId: editor.groupId, title: 'too big', config: chipRun(1000, 0.1) })

    expect(res.status).toBe(422)
    expect(res.body.error.code).toBe('over_limit')
    expect(res.body.error.message).toMatch(/cell-updates.*over the limit of 2\.00e\+10/)
    expect(res.body.error.message).toMatch(/shorten the window/)
  })

  it('answers 401 without sign-in, 404 for a group one is not in and 403 for a viewer', async () => {
    const outsider = await newMember(db, 'editor')
    const viewer = await newMember(db, 'viewer', editor.groupId, 'Mei Okafor')
    const body = { groupId: editor.groupId, title: 'x', config: chipRun() }

    expect((await request(app).post('/api/runs').send(body)).status).toBe(401)
    expect((await submit(outsider, body)).status).toBe(404)
    expect((await submit(viewer, body)).status).toBe(403)
  })

  it('returns the same run for a repeated Idempotency-Key and refuses the key for a different run', async () => {
    const body = { groupId: editor.groupId, title: 'idempotent', config: chipRun() }
    const first = await submit(editor, body, { 'Idempotency-Key': 'halden-42' })
    const again = await submit(editor, body, { 'Idempotency-Key': 'halden-42' })
    const other = await submit(editor, { ...body, config: chipRun(12) }, { 'Idempotency-Key': 'halden-42' })

    expect(first.status).toBe(202)
    expect(again.status).toBe(202)
    expect(again.headers['idempotent-replayed']).toBe('true')
    expect(again.body.id).toBe(first.body.id)
    expect(other.status).toBe(422)
    const { rows } = await pool.query(`select count(*)::int as n from runs where idempotency_key = 'halden-42'`)
    expect(rows[0].n).toBe(1)
  })
})

describe('reading runs', () => {
  it('answers 404 for an unknown or malformed run id, and 404 to a non-member', async () => {
    const mine = await submit(editor, { groupId: editor.groupId, title: 'private', config: chipRun() })
    const outsider = await newMember(db, 'owner')

    expect((await request(app).get('/api/runs/5b1e0d4c-7a2f-4c1e-9d3b-2f6a8e0c1d42').set('Authorization', editor.auth)).status).toBe(404)
    expect((await request(app).get('/api/runs/not-an-id').set('Authorization', editor.auth)).status).toBe(404)
    expect((await request(app).get(`/api/runs/${mine.body.id}`).set('Authorization', outsider.auth)).status).toBe(404)
    expect((await request(app).get(`/api/runs/${mine.body.id}/events`).set('Authorization', outsider.auth)).status).toBe(404)
  })

  it('answers 409 for the download or arrays of an unfinished run', async () => {
    const run = await submit(editor, { groupId: editor.groupId, title: 'unfinished', config: chipRun() })

    const zip = await request(app).get(`/api/runs/${run.body.id}/download`).set('Authorization', editor.auth)
    const arr = await request(app).get(`/api/runs/${run.body.id}/arrays/time_ns`).set('Authorization', editor.auth)

    expect(zip.status).toBe(409)
    expect(zip.body.error.message).toMatch(/queued/)
    expect(arr.status).toBe(409)
  })

  it('lists the group runs with filters, text search, sorting and pages', async () => {
    const m = await newMember(db, 'editor')
    for (const title of ['Brillouin delay line A', 'Brillouin delay line B', 'Ring laser C']) {
      await submit(m, { groupId: m.groupId, title, notes: title.startsWith('Ring') ? 'pump at 1550 nm' : '', config: chipRun() })
    }
    const get = (q: string) => request(app).get(`/api/runs?${q}`).set('Authorization', m.auth)

    const page1 = RunList.parse((await get('pageSize=2&sort=title_asc')).body)
    const page2 = RunList.parse((await get('pageSize=2&page=2&sort=title_asc')).body)
    const text = RunList.parse((await get('q=1550')).body)
    const queued = RunList.parse((await get(`status=queued&author=me&groupId=${m.groupId}`)).body)
    const bad = await get('status=sleeping&pageSize=1000')

    expect(page1.total).toBe(3)
    expect(page1.items.map((r) => r.title)).toEqual(['Brillouin delay line A', 'Brillouin delay line B'])
    expect(page2.items.map((r) => r.title)).toEqual(['Ring laser C'])
    expect(text.items.map((r) => r.title)).toEqual(['Ring laser C'])
    expect(queued.total).toBe(3)
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['pageSize', 'status'])
  })
})

describe('list rows and queue places', () => {
  it('gives each listed run its waveguide name, and each queued single run its place in the order pg-boss hands out jobs', async () => {
    const m = await newMember(db, 'editor')
    const first = await submit(m, { groupId: m.groupId, title: 'first in line', config: chipRun() })
    const second = await submit(m, { groupId: m.groupId, title: 'second in line', config: chipRun() })
    await request(app).post(`/api/runs/${first.body.id}/cancel`).set('Authorization', m.auth)

    const list = RunList.parse((await request(app).get(`/api/runs?groupId=${m.groupId}`).set('Authorization', m.auth)).body)
    const secondNow = RunDetail.parse((await request(app).get(`/api/runs/${second.body.id}`).set('Authorization', m.auth)).body)
    const firstNow = RunDetail.parse((await request(app).get(`/api/runs/${first.body.id}`).set('Authorization', m.auth)).body)
    // pg-boss 10 fetches `priority desc, created_on, id` (its plans.js fetchNextJob): the line as workers see it.
    const { rows } = await pool.query(`select data->>'runId' as run_id from ${schema}.job where name = $1 and state = 'created' order by priority desc, created_on, id`, [RUN_QUEUE])

    expect(list.items.map((r) => r.waveguideName)).toEqual([chipRun().waveguide.name ?? 'Untitled waveguide', chipRun().waveguide.name ?? 'Untitled waveguide'])
    expect(list.items.every((r) => r.keyFigure === null)).toBe(true) // nothing finished yet
    // The cancelled run no longer holds a place; runs of other tests still waiting do, where their priority puts them.
    expect(secondNow.queuePosition).toBe(rows.findIndex((r) => r.run_id === second.body.id) + 1)
    expect(firstNow.queuePosition).toBeNull()
  })
})

describe('share links', () => {
  it('lets anyone holding a public link read the run, and nothing else', async () => {
    const run = await submit(editor, { groupId: editor.groupId, title: 'shared with a visitor', config: chipRun() })
    const link = await createShare(db, { userId: editor.userId, email: 'x', isAdmin: false, via: 'token' }, { resourceType: 'run', resourceId: run.body.id, public: true })

    const shared = await request(app).get(`/api/runs/${run.body.id}?share=${link.token}`)
    const wrong = await request(app).get(`/api/runs/${run.body.id}?share=${'x'.repeat(43)}`)
    const cancel = await request(app).post(`/api/runs/${run.body.id}/cancel?share=${link.token}`)

    expect(shared.status).toBe(200)
    expect(shared.body.id).toBe(run.body.id)
    expect(wrong.status).toBe(404)
    expect(cancel.status).toBe(401)
  })
})

describe('cancel and clone', () => {
  it('cancels a queued run: the run is cancelled, its pg-boss job too, and a second cancel is 409', async () => {
    const run = await submit(editor, { groupId: editor.groupId, title: 'to cancel', config: chipRun() })

    const res = await request(app).post(`/api/runs/${run.body.id}/cancel`).set('Authorization', editor.auth)
    const again = await request(app).post(`/api/runs/${run.body.id}/cancel`).set('Authorization', editor.auth)

    expect(res.status).toBe(200)
    expect(res.body.status).toBe('cancelled')
    const { rows } = await pool.query(`select job_id from runs where id = $1`, [run.body.id])
    const { jobs } = await setup
    expect((await jobs.boss.getJobById(RUN_QUEUE, rows[0].job_id))?.state).toBe('cancelled')
    expect(again.status).toBe(409)
  })

  it('clones a run into a new queued run with the same config and hash', async () => {
    const run = await submit(editor, { groupId: editor.groupId, title: 'original', config: chipRun(8) })

    const res = await request(app).post(`/api/runs/${run.body.id}/clone`).set('Authorization', editor.auth).send({})

    expect(res.status).toBe(202)
    expect(res.body.id).not.toBe(run.body.id)
    expect(res.body).toMatchObject({ title: 'original (copy)', status: 'queued', configHash: run.body.configHash })
  })
})

describe('GET /api/queue', () => {
  it('shows queued and running counts to an admin and refuses everyone else', async () => {
    const admin = await newUser(db, 'Ingrid Solvang', { isAdmin: true })

    const res = await request(app).get('/api/queue').set('Authorization', admin.auth)
    const denied = await request(app).get('/api/queue').set('Authorization', editor.auth)

    expect(res.status).toBe(200)
    const q = QueueStatus.parse(res.body)
    const { rows } = await pool.query(`select count(*)::int as n from runs where status = 'queued'`)
    expect(q.queued).toBe(rows[0].n)
    expect(denied.status).toBe(403)
  })
})
