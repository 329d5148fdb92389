import { eq } from 'drizzle-orm'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { WAVEGUIDE_PRESETS } from '@shared/physics/waveguide-presets'
import { Waveguide, type WaveguideInput } from '@shared/physics/waveguide'
import { copyName, SavedWaveguide } from '@shared/api/waveguides-api'
import { createApp } from '../../server/app'
import { waveguides } from '../../server/db/schema'
import { waveguidesRoutes } from '../../server/modules/waveguides/waveguides.routes'
import { apiToken, createGroup, groupWithRoles, sessionCookie, TEST_JWT_SECRET } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET }, routes: [['/waveguides', waveguidesRoutes({ db })]] })

const smf = WAVEGUIDE_PRESETS.find((p) => p.id === 'standard-smf')!.waveguide
const rib = (name: string): WaveguideInput => ({ ...smf, name, lengthM: 0.07, effectiveAreaUm2: 2.3 })

async function editorSetup() {
  const g = await groupWithRoles(db)
  return { ...g, editorCookie: await sessionCookie(db, g.editor.id), viewerCookie: await sessionCookie(db, g.viewer.id) }
}

async function create(cookie: string, groupId: string, waveguide: WaveguideInput, notes?: string) {
  return request(app).post('/api/waveguides').set('Cookie', cookie).send({ groupId, waveguide, notes })
}

describe('saved waveguides: CRUD', () => {
  it('creates a waveguide with the shared schema defaults filled in, and lists it for viewers of the group', async () => {
    const g = await editorSetup()
    const { kerrN2M2PerW: _k, phaseIndex: _p, ...partial } = rib('Halden As2S3 rib, wafer 7')

    const created = await create(g.editorCookie, g.groupId, partial, 'Cut-back loss measured 2024-03')
    const listed = await request(app).get(`/api/waveguides?groupId=${g.groupId}`).set('Cookie', g.viewerCookie)

    expect(created.status).toBe(201)
    expect(created.headers.location).toBe(`/api/waveguides/${created.body.id}`)
    expect(SavedWaveguide.parse(created.body)).toBeTruthy()
    expect(created.body).toMatchObject({ groupId: g.groupId, name: 'Halden As2S3 rib, wafer 7', notes: 'Cut-back loss measured 2024-03', createdById: g.editor.id })
    // Defaults from shared/physics/waveguide.ts, applied at the boundary and stored.
    expect(created.body.waveguide).toMatchObject({ kerrN2M2PerW: 0, phaseIndex: 1.45, lengthM: 0.07 })
    expect(listed.status).toBe(200)
    expect(listed.body.waveguides.map((w: SavedWaveguide) => w.id)).toEqual([created.body.id])
  })

  it('reads one by id, replaces it (name included) and keeps notes when the update leaves them out', async () => {
    const g = await editorSetup()
    const created = await create(g.editorCookie, g.groupId, rib('Spool A'), 'bought 2023')

    const updated = await request(app)
      .put(`/api/waveguides/${created.body.id}`)
      .set('Cookie', g.editorCookie)
      .send({ waveguide: { ...rib('Spool A, re-cleaved'), lengthM: 0.065 } })
    const read = await request(app).get(`/api/waveguides/${created.body.id}`).set('Cookie', g.viewerCookie)
    const [row] = await db.select().from(waveguides).where(eq(waveguides.id, created.body.id))

    expect(updated.status).toBe(200)
    expect(read.body).toMatchObject({ name: 'Spool A, re-cleaved', notes: 'bought 2023', waveguide: { lengthM: 0.065, name: 'Spool A, re-cleaved' } })
    expect(row.name).toBe('Spool A, re-cleaved')
    expect(Waveguide.parse(row.params)).toEqual(row.params)
    expect(new Date(read.body.updatedAt).getTime()).toBeGreaterThanOrEqual(new Date(created.body.updatedAt).getTime())
  })

  it('deletes one, after which it is 404 and gone from the list', async () => {
    const g = await editorSetup()
    const created = await create(g.editorCookie, g.groupId, rib('Doomed spool'))

    const del = await request(app).delete(`/api/waveguides/${created.body.id}`).set('Cookie', g.editorCookie)
    const again = await request(app).delete(`/api/waveguides/${created.body.id}`).set('Cookie', g.editorCookie)
    const read = await request(app).get(`/api/waveguides/${created.body.id}`).set('Cookie', g.editorCookie)
    const listed = await request(app).get(`/api/waveguides?groupId=${g.groupId}`).set('Cookie', g.editorCookie)

    expect(del.status).toBe(204)
    expect(again.status).toBe(404)
    expect(read.status).toBe(404)
    expect(listed.body.waveguides).toEqual([])
  })

  it('duplicates as "<name> (copy)", then "(copy 2)", copying parameters and notes, and accepts a chosen name', async () => {
    const g = await editorSetup()
    const source = await create(g.editorCookie, g.groupId, rib('Reference rib'), 'the good one')

    const first = await request(app).post(`/api/waveguides/${source.body.id}/duplicate`).set('Cookie', g.editorCookie).send({})
    const second = await request(app).post(`/api/waveguides/${source.body.id}/duplicate`).set('Cookie', g.editorCookie)
    const ofCopy = await request(app).post(`/api/waveguides/${first.body.id}/duplicate`).set('Cookie', g.editorCookie)
    const named = await request(app).post(`/api/waveguides/${source.body.id}/duplicate`).set('Cookie', g.editorCookie).send({ name: 'Rib for Tomas' })

    expect(first.status).toBe(201)
    expect(first.body).toMatchObject({ name: 'Reference rib (copy)', notes: 'the good one', waveguide: { ...Waveguide.parse(rib('x')), name: 'Reference rib (copy)' } })
    expect(first.body.id).not.toBe(source.body.id)
    expect(second.body.name).toBe('Reference rib (copy 2)')
    expect(ofCopy.body.name).toBe('Reference rib (copy 3)')
    expect(named.body.name).toBe('Rib for Tomas')
  })

  it('lists a group\'s waveguides in name order and never another group\'s', async () => {
    const g = await editorSetup()
    const other = await createGroup(db, 'Other lab')
    await create(g.editorCookie, g.groupId, rib('beta'))
    await create(g.editorCookie, g.groupId, rib('Alpha'))
    await db.insert(waveguides).values({ groupId: other, name: 'Foreign', params: Waveguide.parse(rib('Foreign')) })

    const listed = await request(app).get(`/api/waveguides?groupId=${g.groupId}`).set('Cookie', g.viewerCookie)

    expect(listed.body.waveguides.map((w: SavedWaveguide) => w.name)).toEqual(['Alpha', 'beta'])
  })
})

describe('saved waveguides: names are unique per group', () => {
  it('answers 409 with a clear message for a name the group already uses, ignoring case', async () => {
    const g = await editorSetup()
    await create(g.editorCookie, g.groupId, rib('Spool B'))

    const clash = await create(g.editorCookie, g.groupId, rib('  SPOOL b '))

    expect(clash.status).toBe(409)
    expect(clash.body.error.code).toBe('conflict')
    expect(clash.body.error.message).toContain('already has a waveguide named "SPOOL b"')
  })

  it('answers 409 when a rename or a named copy takes a used name, and leaves the rows as they were', async () => {
    const g = await editorSetup()
    const a = await create(g.editorCookie, g.groupId, rib('Spool C'))
    await create(g.editorCookie, g.groupId, rib('Spool D'))

    const rename = await request(app).put(`/api/waveguides/${a.body.id}`).set('Cookie', g.editorCookie).send({ waveguide: rib('spool d') })
    const copy = await request(app).post(`/api/waveguides/${a.body.id}/duplicate`).set('Cookie', g.editorCookie).send({ name: 'Spool D' })
    const listed = await request(app).get(`/api/waveguides?groupId=${g.groupId}`).set('Cookie', g.editorCookie)

    expect(rename.status).toBe(409)
    expect(copy.status).toBe(409)
    expect(listed.body.waveguides.map((w: SavedWaveguide) => w.name)).toEqual(['Spool C', 'Spool D'])
  })

  it('allows the same name in two different groups', async () => {
    const g1 = await editorSetup()
    const g2 = await editorSetup()

    const one = await create(g1.editorCookie, g1.groupId, rib('Shared name'))
    const two = await create(g2.editorCookie, g2.groupId, rib('Shared name'))

    expect([one.status, two.status]).toEqual([201, 201])
  })
})

describe('saved waveguides: bad input is 400 with field paths', () => {
  it('names each bad waveguide field under waveguide.*', async () => {
    const g = await editorSetup()

    const res = await create(g.editorCookie, g.groupId, { ...rib('Bad'), lengthM: -1, groupIndex: 0.5, brillouinShiftGHz: Number.NaN } as WaveguideInput)

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    const paths = res.body.error.fields.map((f: { path: string }) => f.path)
    // NaN arrives as JSON null: a type error on the same path.
    expect(paths).toEqual(expect.arrayContaining(['waveguide.lengthM', 'waveguide.groupIndex', 'waveguide.brillouinShiftGHz']))
  })

  it('refuses a missing or malformed group id, an empty name and an oversized note', async () => {
    const g = await editorSetup()

    const noGroup = await request(app).post('/api/waveguides').set('Cookie', g.editorCookie).send({ waveguide: rib('x') })
    const badQuery = await request(app).get('/api/waveguides?groupId=nope').set('Cookie', g.editorCookie)
    const emptyName = await create(g.editorCookie, g.groupId, rib('   '))
    const longNotes = await create(g.editorCookie, g.groupId, rib('Long notes'), 'x'.repeat(10_001))
    const badUpdate = await request(app).put(`/api/waveguides/${(await create(g.editorCookie, g.groupId, rib('ok'))).body.id}`).set('Cookie', g.editorCookie).send({ waveguide: { ...rib('ok'), polarisationFactor: 2 } })

    expect([noGroup.status, badQuery.status, emptyName.status, longNotes.status, badUpdate.status]).toEqual([400, 400, 400, 400, 400])
    expect(noGroup.body.error.fields[0].path).toBe('groupId')
    expect(badQuery.body.error.fields[0].path).toBe('groupId')
    expect(emptyName.body.error.fields[0].path).toBe('waveguide.name')
    expect(longNotes.body.error.fields[0].path).toBe('notes')
    expect(badUpdate.body.error.fields[0].path).toBe('waveguide.polarisationFactor')
  })

  it('treats a malformed id as not found', async () => {
    const g = await editorSetup()

    const res = await request(app).get('/api/waveguides/not-a-uuid').set('Cookie', g.editorCookie)

    expect(res.status).toBe(404)
  })
})

describe('saved waveguides: who may do what', () => {
  it('lets a viewer read but not write, with 403 naming the needed role', async () => {
    const g = await editorSetup()
    const a = await create(g.editorCookie, g.groupId, rib('Editor made'))

    const post = await create(g.viewerCookie, g.groupId, rib('Viewer made'))
    const put = await request(app).put(`/api/waveguides/${a.body.id}`).set('Cookie', g.viewerCookie).send({ waveguide: rib('Renamed') })
    const dup = await request(app).post(`/api/waveguides/${a.body.id}/duplicate`).set('Cookie', g.viewerCookie)
    const del = await request(app).delete(`/api/waveguides/${a.body.id}`).set('Cookie', g.viewerCookie)
    const read = await request(app).get(`/api/waveguides/${a.body.id}`).set('Cookie', g.viewerCookie)

    expect([post.status, put.status, dup.status, del.status, read.status]).toEqual([403, 403, 403, 403, 200])
    expect(post.body.error.message).toContain('editor role')
  })

  it('hides a group\'s waveguides from outsiders with 404 and refuses anonymous callers with 401', async () => {
    const g = await editorSetup()
    const outsider = await groupWithRoles(db)
    const outsiderCookie = await sessionCookie(db, outsider.owner.id)
    const a = await create(g.editorCookie, g.groupId, rib('Private'))

    const statuses = [
      (await request(app).get(`/api/waveguides?groupId=${g.groupId}`).set('Cookie', outsiderCookie)).status,
      (await request(app).get(`/api/waveguides/${a.body.id}`).set('Cookie', outsiderCookie)).status,
      (await request(app).delete(`/api/waveguides/${a.body.id}`).set('Cookie', outsiderCookie)).status,
      (await create(outsiderCookie, g.groupId, rib('Planted'))).status,
      (await request(app).get(`/api/waveguides/${a.body.id}`)).status,
      (await request(app).get(`/api/waveguides?groupId=${g.groupId}`)).status,
    ]

    expect(statuses).toEqual([404, 404, 404, 404, 401, 401])
  })

  it('accepts an API token with its user\'s rights', async () => {
    const g = await editorSetup()
    const token = await apiToken(db, g.editor.id)

    const res = await request(app).post('/api/waveguides').set('Authorization', `Bearer ${token.token}`).send({ groupId: g.groupId, waveguide: rib('From a script') })

    expect(res.status).toBe(201)
    expect(res.body.createdById).toBe(g.editor.id)
  })
})

describe('copyName', () => {
  it('numbers copies past taken names, ignoring case, and strips an old copy suffix', () => {
    expect(copyName('Rib', [])).toBe('Rib (copy)')
    expect(copyName('Rib', ['rib (COPY)'])).toBe('Rib (copy 2)')
    expect(copyName('Rib (copy 2)', ['Rib (copy)', 'Rib (copy 2)'])).toBe('Rib (copy 3)')
  })

  it('keeps the copy name within the 120-character limit of the shared schema', () => {
    const name = copyName('x'.repeat(120), [])

    expect(name).toHaveLength(120)
    expect(name.endsWith(' (copy)')).toBe(true)
    expect(Waveguide.shape.name.safeParse(name).success).toBe(true)
  })
})
