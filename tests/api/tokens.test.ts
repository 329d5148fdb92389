import { eq } from 'drizzle-orm'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { apiTokens } from '../../server/db/schema'
import { hashSecretToken } from '../../server/modules/auth/secret-token'
import { apiToken, createUser, groupWithRoles, sessionCookie, TEST_JWT_SECRET } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })

describe('API tokens', () => {
  it('shows the secret once, lists without it, and stores only its hash', async () => {
    const u = await createUser(db)
    const cookie = await sessionCookie(db, u.id)

    const created = await request(app).post('/api/tokens').set('Cookie', cookie).send({ name: 'lab notebook sync', expiresInDays: 30 })
    const listed = await request(app).get('/api/tokens').set('Cookie', cookie)
    const [row] = await db.select().from(apiTokens).where(eq(apiTokens.id, created.body.id))

    expect(created.status).toBe(201)
    expect(created.body.token).toMatch(/^swt_[A-Za-z0-9_-]{43}$/)
    expect(created.body.token.startsWith(created.body.tokenPrefix)).toBe(true)
    expect(listed.body.tokens).toHaveLength(1)
    expect(listed.body.tokens[0]).not.toHaveProperty('token')
    expect(JSON.stringify(listed.body)).not.toContain(created.body.token)
    expect(row.tokenHash).toBe(hashSecretToken(created.body.token))
    expect(JSON.stringify(row)).not.toContain(created.body.token)
  })

  it('Bearer works with the owner\'s rights on group routes', async () => {
    const g = await groupWithRoles(db)
    const editorToken = await apiToken(db, g.editor.id)
    const auth = { Authorization: `Bearer ${editorToken.token}` }

    const me = await request(app).get('/api/me').set(auth)
    const members = await request(app).get(`/api/groups/${g.groupId}/members`).set(auth)
    const rename = await request(app).patch(`/api/groups/${g.groupId}`).set(auth).send({ name: 'Renamed by script' })

    expect(me.status).toBe(200)
    expect(me.body).toMatchObject({ user: { id: g.editor.id }, via: 'token' })
    expect(members.status).toBe(200)
    expect(rename.status).toBe(403)
  })

  it('refuses a revoked, an expired, a mistyped and a malformed token with 401', async () => {
    const u = await createUser(db)
    const cookie = await sessionCookie(db, u.id)
    const revoked = await apiToken(db, u.id)
    const expired = await apiToken(db, u.id, 1)
    await request(app).delete(`/api/tokens/${revoked.id}`).set('Cookie', cookie).expect(204)
    await db.update(apiTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(apiTokens.id, expired.id))

    const statuses = await Promise.all(
      [`Bearer ${revoked.token}`, `Bearer ${expired.token}`, `Bearer ${revoked.token.slice(0, -2)}xx`, 'Basic dXNlcjpwYXNz', 'Bearer'].map(
        async (h) => (await request(app).get('/api/me').set('Authorization', h)).status,
      ),
    )

    expect(statuses).toEqual([401, 401, 401, 401, 401])
  })

  it('records when a token was last used', async () => {
    const u = await createUser(db)
    const t = await apiToken(db, u.id)
    await request(app).get('/api/me').set('Authorization', `Bearer ${t.token}`)
    const [row] = await db.select().from(apiTokens).where(eq(apiTokens.id, t.id))
    expect(row.lastUsedAt).not.toBeNull()
  })

  it('does not let one user revoke another\'s token (404)', async () => {
    const a = await createUser(db)
    const b = await createUser(db)
    const t = await apiToken(db, a.id)
    const res = await request(app).delete(`/api/tokens/${t.id}`).set('Cookie', await sessionCookie(db, b.id))
    const still = await request(app).get('/api/me').set('Authorization', `Bearer ${t.token}`)
    expect(res.status).toBe(404)
    expect(still.status).toBe(200)
  })

  it('refuses bad token requests with field paths', async () => {
    const u = await createUser(db)
    const cookie = await sessionCookie(db, u.id)
    const res = await request(app).post('/api/tokens').set('Cookie', cookie).send({ name: '', expiresInDays: 1000 })
    expect(res.status).toBe(400)
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['expiresInDays', 'name'])
  })
})
