import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { registerShareable, resolveShare } from '../../server/modules/shares'
import type { AuthContext } from '../../server/modules/auth/auth-context'
import { createUser, groupWithRoles, sessionCookie, TEST_JWT_SECRET } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })

// A stand-in resource type: ids map to groups in memory, as a runs table would in the database.
const owners = new Map<string, string>()
registerShareable('probe', { groupOf: async (_db, id) => owners.get(id) ?? null, pathOf: (id) => `/probes/${id}` })

async function resource() {
  const g = await groupWithRoles(db)
  const id = randomUUID()
  owners.set(id, g.groupId)
  return { ...g, id }
}
const as = async (userId: string) => ({ Cookie: await sessionCookie(db, userId) })
const someone: AuthContext = { userId: randomUUID(), email: 'x@test.example', isAdmin: false, via: 'session' }

describe('share links', () => {
  it('lets an editor make a signed-in-only link; it grants access only to signed-in callers, only for that resource', async () => {
    const r = await resource()
    const other = await resource()

    const res = await request(app).post('/api/shares').set(await as(r.editor.id)).send({ resourceType: 'probe', resourceId: r.id })
    const token = res.body.token as string

    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ public: false, resourceId: r.id, path: `/probes/${r.id}?share=${encodeURIComponent(token)}` })
    expect(await resolveShare(db, token, 'probe', r.id, someone)).toBe(true)
    expect(await resolveShare(db, token, 'probe', r.id)).toBe(false)
    expect(await resolveShare(db, token, 'probe', other.id, someone)).toBe(false)
    expect(await resolveShare(db, token, 'run', r.id, someone)).toBe(false)
    // One character changed (never to itself: a token ending in "A" would otherwise stay the same, 1 time in 64).
    const tampered = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A')
    expect(await resolveShare(db, tampered, 'probe', r.id, someone)).toBe(false)
  })

  it('a public link grants access to anyone; revoking it ends that', async () => {
    const r = await resource()
    const owner = await as(r.owner.id)
    const made = await request(app).post('/api/shares').set(owner).send({ resourceType: 'probe', resourceId: r.id, public: true })

    const before = await resolveShare(db, made.body.token, 'probe', r.id)
    const revoked = await request(app).delete(`/api/shares/${made.body.id}`).set(owner)
    const after = await resolveShare(db, made.body.token, 'probe', r.id, someone)
    const listed = await request(app).get('/api/shares').query({ resourceType: 'probe', resourceId: r.id }).set(await as(r.viewer.id))

    expect(before).toBe(true)
    expect(revoked.status).toBe(200)
    expect(after).toBe(false)
    expect(listed.body.shares).toEqual([expect.objectContaining({ id: made.body.id, public: true, revokedAt: expect.any(String) })])
    expect(JSON.stringify(listed.body)).not.toContain(made.body.token)
  })

  it('refuses viewers (403), outsiders and unknown resources (404), unknown types (400)', async () => {
    const r = await resource()
    const stranger = await createUser(db)
    const body = { resourceType: 'probe', resourceId: r.id }

    const viewer = await request(app).post('/api/shares').set(await as(r.viewer.id)).send(body)
    const outsider = await request(app).post('/api/shares').set(await as(stranger.id)).send(body)
    const missing = await request(app).post('/api/shares').set(await as(r.owner.id)).send({ ...body, resourceId: randomUUID() })
    const unknownType = await request(app).post('/api/shares').set(await as(r.owner.id)).send({ ...body, resourceType: 'spreadsheet' })
    const badId = await request(app).post('/api/shares').set(await as(r.owner.id)).send({ ...body, resourceId: 'nope' })

    expect([viewer.status, outsider.status, missing.status, unknownType.status, badId.status]).toEqual([403, 404, 404, 400, 400])
    expect(unknownType.body.error.fields[0].path).toBe('resourceType')
    expect(badId.body.error.fields[0].path).toBe('resourceId')
  })

  it('stops honouring a link when its resource moves to another group', async () => {
    const r = await resource()
    const made = await request(app).post('/api/shares').set(await as(r.owner.id)).send({ resourceType: 'probe', resourceId: r.id, public: true })
    const elsewhere = await groupWithRoles(db)
    owners.set(r.id, elsewhere.groupId)
    expect(await resolveShare(db, made.body.token, 'probe', r.id)).toBe(false)
  })
})
