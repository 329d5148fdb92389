import { and, eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { invitations, memberships } from '../../server/db/schema'
import { mailCatcher, stopMailer } from '../../server/modules/mail/mailer'
import { createUser, groupWithRoles, linkIn, sessionCookie, signInOverHttp, TEST_JWT_SECRET, uniqueEmail } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })
afterAll(() => stopMailer())
const as = async (userId: string) => ({ Cookie: await sessionCookie(db, userId) })

describe('groups', () => {
  it('makes the creator the owner and lists the group under /api/groups and /api/me', async () => {
    const u = await createUser(db)
    const h = await as(u.id)

    const created = await request(app).post('/api/groups').set(h).send({ name: 'Brillouin Delay-Line Group' })
    const mine = await request(app).get('/api/groups').set(h)
    const me = await request(app).get('/api/me').set(h)
    const members = await request(app).get(`/api/groups/${created.body.id}/members`).set(h)

    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ name: 'Brillouin Delay-Line Group', role: 'owner' })
    expect(created.body.slug).toMatch(/^brillouin-delay-line-group/)
    expect(mine.body.groups.map((g: { id: string }) => g.id)).toEqual([created.body.id])
    expect(me.body.memberships).toEqual([{ groupId: created.body.id, groupName: 'Brillouin Delay-Line Group', groupSlug: created.body.slug, role: 'owner' }])
    expect(members.body.members).toEqual([expect.objectContaining({ userId: u.id, role: 'owner' })])
  })

  it('gives two groups of the same name distinct slugs', async () => {
    const u = await createUser(db)
    const h = await as(u.id)
    const a = await request(app).post('/api/groups').set(h).send({ name: 'Twin Lab' })
    const b = await request(app).post('/api/groups').set(h).send({ name: 'Twin Lab' })
    expect(a.body.slug).not.toBe(b.body.slug)
  })

  it('refuses bad group names with field paths', async () => {
    const u = await createUser(db)
    const h = await as(u.id)
    const missing = await request(app).post('/api/groups').set(h).send({})
    const long = await request(app).post('/api/groups').set(h).send({ name: 'x'.repeat(81) })
    expect([missing.status, long.status]).toEqual([400, 400])
    expect(missing.body.error.fields[0].path).toBe('name')
    expect(long.body.error.fields[0].path).toBe('name')
  })
})

describe('roles and the last owner', () => {
  it('lets the owner change roles; the last owner can be neither demoted nor removed nor leave', async () => {
    const g = await groupWithRoles(db)
    const owner = await as(g.owner.id)

    const promote = await request(app).patch(`/api/groups/${g.groupId}/members/${g.viewer.id}`).set(owner).send({ role: 'editor' })
    const demoteSelf = await request(app).patch(`/api/groups/${g.groupId}/members/${g.owner.id}`).set(owner).send({ role: 'editor' })
    const leave = await request(app).delete(`/api/groups/${g.groupId}/members/${g.owner.id}`).set(owner)

    expect(promote.status).toBe(200)
    expect(promote.body.members.find((m: { userId: string }) => m.userId === g.viewer.id).role).toBe('editor')
    expect(demoteSelf.status).toBe(409)
    expect(demoteSelf.body.error.code).toBe('last_owner')
    expect(leave.status).toBe(409)
  })

  it('lets an owner step down once there is a second owner', async () => {
    const g = await groupWithRoles(db)
    const owner = await as(g.owner.id)
    await request(app).patch(`/api/groups/${g.groupId}/members/${g.editor.id}`).set(owner).send({ role: 'owner' })

    const stepDown = await request(app).patch(`/api/groups/${g.groupId}/members/${g.owner.id}`).set(owner).send({ role: 'viewer' })
    const editorNowOwnerLeaves = await request(app).delete(`/api/groups/${g.groupId}/members/${g.editor.id}`).set(await as(g.editor.id))

    expect(stepDown.status).toBe(200)
    expect(editorNowOwnerLeaves.status).toBe(409)
  })

  it('removes a member; a viewer may leave; an editor may not remove others', async () => {
    const g = await groupWithRoles(db)
    const extra = await createUser(db)
    await db.insert(memberships).values({ groupId: g.groupId, userId: extra.id, role: 'viewer' })

    const byEditor = await request(app).delete(`/api/groups/${g.groupId}/members/${extra.id}`).set(await as(g.editor.id))
    const byOwner = await request(app).delete(`/api/groups/${g.groupId}/members/${extra.id}`).set(await as(g.owner.id))
    const viewerLeaves = await request(app).delete(`/api/groups/${g.groupId}/members/${g.viewer.id}`).set(await as(g.viewer.id))
    const left = await db.select().from(memberships).where(eq(memberships.groupId, g.groupId))

    expect([byEditor.status, byOwner.status, viewerLeaves.status]).toEqual([403, 204, 204])
    expect(left.map((m) => m.userId).sort()).toEqual([g.owner.id, g.editor.id].sort())
  })

  it('answers 404, not 403, to someone outside the group', async () => {
    const g = await groupWithRoles(db)
    const stranger = await createUser(db)
    const res = await request(app).get(`/api/groups/${g.groupId}/members`).set(await as(stranger.id))
    const malformed = await request(app).get('/api/groups/not-a-uuid').set(await as(stranger.id))
    expect(res.status).toBe(404)
    expect(malformed.status).toBe(404)
  })

  it('refuses an unknown role with a field path', async () => {
    const g = await groupWithRoles(db)
    const res = await request(app).patch(`/api/groups/${g.groupId}/members/${g.viewer.id}`).set(await as(g.owner.id)).send({ role: 'admin' })
    expect(res.status).toBe(400)
    expect(res.body.error.fields[0].path).toBe('role')
  })
})

describe('invitations end to end through the mail catcher', () => {
  async function inviteMail(address: string) {
    return (await mailCatcher())!.waitFor((m) => m.recipients.includes(address) && /invited you/.test(m.subject))
  }

  it('invites by e-mail; the invitee signs up, follows the link, and joins with the role', async () => {
    const g = await groupWithRoles(db)
    const email = uniqueEmail('invitee')

    const sent = await request(app).post(`/api/groups/${g.groupId}/invitations`).set(await as(g.owner.id)).send({ email, role: 'editor' })
    const mail = await inviteMail(email)
    const token = linkIn(mail.text, '/accept-invite').searchParams.get('token')!
    const preview = await request(app).post('/api/invitations/preview').send({ token })
    await request(app).post('/api/auth/sign-up').send({ email, password: 'invitee password' })
    const cookie = await signInOverHttp(app, email, 'invitee password')
    const accepted = await request(app).post('/api/invitations/accept').set('Cookie', cookie).send({ token })
    const me = await request(app).get('/api/me').set('Cookie', cookie)
    const again = await request(app).post('/api/invitations/accept').set('Cookie', cookie).send({ token })

    expect(sent.status).toBe(201)
    expect(sent.body).toMatchObject({ email, role: 'editor', mailed: true })
    expect(preview.status).toBe(200)
    expect(preview.body).toMatchObject({ groupName: 'Test group', role: 'editor', email })
    expect(accepted.status).toBe(200)
    expect(accepted.body).toEqual({ groupId: g.groupId, role: 'editor' })
    expect(me.body.memberships).toEqual([expect.objectContaining({ groupId: g.groupId, role: 'editor' })])
    expect(me.body.user.emailConfirmed).toBe(true)
    expect(again.status).toBe(404)
  })

  it('refuses acceptance by a different signed-in address (403) and anonymously (401)', async () => {
    const g = await groupWithRoles(db)
    const email = uniqueEmail('intended')
    await request(app).post(`/api/groups/${g.groupId}/invitations`).set(await as(g.owner.id)).send({ email, role: 'viewer' })
    const token = linkIn((await inviteMail(email)).text, '/accept-invite').searchParams.get('token')!
    const other = await createUser(db)

    const wrong = await request(app).post('/api/invitations/accept').set(await as(other.id)).send({ token })
    const anon = await request(app).post('/api/invitations/accept').send({ token })
    const joined = await db.select().from(memberships).where(and(eq(memberships.groupId, g.groupId), eq(memberships.userId, other.id)))

    expect(wrong.status).toBe(403)
    expect(wrong.body.error.message).toContain(email)
    expect(anon.status).toBe(401)
    expect(joined).toEqual([])
  })

  it('refuses an expired or withdrawn invitation', async () => {
    const g = await groupWithRoles(db)
    const owner = await as(g.owner.id)
    const a = uniqueEmail('late')
    const b = uniqueEmail('withdrawn')
    await request(app).post(`/api/groups/${g.groupId}/invitations`).set(owner).send({ email: a, role: 'viewer' })
    const second = await request(app).post(`/api/groups/${g.groupId}/invitations`).set(owner).send({ email: b, role: 'viewer' })
    const tokenA = linkIn((await inviteMail(a)).text, '/accept-invite').searchParams.get('token')!
    const tokenB = linkIn((await inviteMail(b)).text, '/accept-invite').searchParams.get('token')!
    await db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.email, a))
    await request(app).delete(`/api/groups/${g.groupId}/invitations/${second.body.id}`).set(owner)
    const ua = await createUser(db, { email: a })
    const ub = await createUser(db, { email: b })

    const lateRes = await request(app).post('/api/invitations/accept').set(await as(ua.id)).send({ token: tokenA })
    const withdrawnRes = await request(app).post('/api/invitations/accept').set(await as(ub.id)).send({ token: tokenB })
    const pending = await request(app).get(`/api/groups/${g.groupId}/invitations`).set(owner)

    expect([lateRes.status, withdrawnRes.status]).toEqual([404, 404])
    expect(pending.body.invitations).toEqual([])
  })

  it('refuses to invite a current member and lets only owners invite', async () => {
    const g = await groupWithRoles(db)
    const dup = await request(app).post(`/api/groups/${g.groupId}/invitations`).set(await as(g.owner.id)).send({ email: g.viewer.email.toUpperCase(), role: 'editor' })
    const byEditor = await request(app).post(`/api/groups/${g.groupId}/invitations`).set(await as(g.editor.id)).send({ email: uniqueEmail(), role: 'viewer' })
    const bad = await request(app).post(`/api/groups/${g.groupId}/invitations`).set(await as(g.owner.id)).send({ email: 'nope', role: 'chief' })
    expect(dup.status).toBe(409)
    expect(byEditor.status).toBe(403)
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(['email', 'role'])
  })
})
