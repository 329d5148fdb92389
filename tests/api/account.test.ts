// Account changes a signed-in user makes, and signing up through an invitation: read through the
// in-process mail catcher as a person would read their mailbox.
import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { users } from '../../server/db/schema'
import { mailCatcher, stopMailer } from '../../server/modules/mail/mailer'
import { createUser, groupWithRoles, linkIn, sessionCookie, signInOverHttp, TEST_JWT_SECRET, uniqueEmail } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'

const { db, pool } = useTestDb()
const ORIGIN = 'http://sonoweave.test'
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET, appUrl: ORIGIN } })
afterAll(() => stopMailer())

const mailsTo = async (address: string) => (await mailCatcher())!.messages().filter((m) => m.recipients.includes(address.toLowerCase()) || m.recipients.includes(address))
const waitMail = async (address: string, subject: RegExp) => (await mailCatcher())!.waitFor((m) => m.recipients.includes(address) && subject.test(m.subject))

async function invite(address: string) {
  const g = await groupWithRoles(db)
  const sent = await request(app).post(`/api/groups/${g.groupId}/invitations`).set('Cookie', await sessionCookie(db, g.owner.id)).send({ email: address, role: 'editor' })
  expect(sent.status).toBe(201)
  const mail = await waitMail(address, /invited you/)
  expect(mail.html).toContain(`<a href="${ORIGIN}/accept-invite?token=`)
  return { g, token: linkIn(mail.text, '/accept-invite').searchParams.get('token')! }
}

describe('sign-up through an invitation', () => {
  it('confirms the invited address by itself: no confirmation mail, and the invitation then joins the group', async () => {
    const email = uniqueEmail('invited')
    const { g, token } = await invite(email)

    const signedUp = await request(app).post('/api/auth/sign-up').send({ email, password: 'invitee password', invitationToken: token })
    const [row] = await db.select().from(users).where(eq(users.email, email))
    const cookie = await signInOverHttp(app, email, 'invitee password')
    const me = await request(app).get('/api/me').set('Cookie', cookie)
    const accepted = await request(app).post('/api/invitations/accept').set('Cookie', cookie).send({ token })

    expect(signedUp.status).toBe(202)
    expect(signedUp.body.message).toMatch(/confirmed by the invitation/)
    expect(row.emailConfirmedAt).not.toBeNull()
    expect(me.body.user.emailConfirmed).toBe(true)
    // The only mail that address ever got is the invitation.
    expect((await mailsTo(email)).map((m) => m.subject)).toEqual([expect.stringMatching(/invited you/)])
    expect(accepted.body).toEqual({ groupId: g.groupId, role: 'editor' })
  })

  it('still asks for confirmation when the invitation was sent to another address', async () => {
    const invited = uniqueEmail('invited')
    const other = uniqueEmail('other')
    const { token } = await invite(invited)

    const signedUp = await request(app).post('/api/auth/sign-up').send({ email: other, password: 'other password', invitationToken: token })
    const [row] = await db.select().from(users).where(eq(users.email, other))

    expect(signedUp.status).toBe(202)
    expect(signedUp.body.message).toMatch(/Check your mailbox/)
    expect(row.emailConfirmedAt).toBeNull()
    expect(linkIn((await waitMail(other, /Confirm your e-mail/)).text, '/confirm-email').origin).toBe(ORIGIN)
  })
})

describe('changing the password', () => {
  it('refuses a wrong current password with a 400 naming the field', async () => {
    const u = await createUser(db)
    const cookie = await signInOverHttp(app, u.email, u.password)
    const res = await request(app).post('/api/me/password').set('Cookie', cookie).send({ currentPassword: 'not the password', newPassword: 'a brand new passphrase' })
    const tooShort = await request(app).post('/api/me/password').set('Cookie', cookie).send({ currentPassword: u.password, newPassword: 'short' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual([{ path: 'currentPassword', message: 'This is not your current password' }])
    expect(tooShort.status).toBe(400)
    expect(tooShort.body.error.fields[0].path).toBe('newPassword')
    // Nothing changed: the old password still signs in.
    await signInOverHttp(app, u.email, u.password)
  })

  it('changes it, keeps this session and signs every other session out', async () => {
    const u = await createUser(db)
    const here = await signInOverHttp(app, u.email, u.password)
    const elsewhere = await signInOverHttp(app, u.email, u.password)

    const res = await request(app).post('/api/me/password').set('Cookie', here).send({ currentPassword: u.password, newPassword: 'a brand new passphrase' })
    const meHere = await request(app).get('/api/me').set('Cookie', here)
    const meElsewhere = await request(app).get('/api/me').set('Cookie', elsewhere)
    const oldPassword = await request(app).post('/api/auth/sign-in').send({ email: u.email, password: u.password })

    expect(res.status).toBe(200)
    expect(meHere.status).toBe(200)
    expect(meElsewhere.status).toBe(401)
    expect(oldPassword.status).toBe(401)
    await signInOverHttp(app, u.email, 'a brand new passphrase')
  })

  it('needs a signed-in caller', async () => {
    const res = await request(app).post('/api/me/password').send({ currentPassword: 'x', newPassword: 'a brand new passphrase' })
    expect(res.status).toBe(401)
  })
})

describe('changing the e-mail address', () => {
  it('mails the new address; the change takes effect only when its link is opened, and the old address is told', async () => {
    const u = await createUser(db)
    const cookie = await signInOverHttp(app, u.email, u.password)
    const newEmail = uniqueEmail('moved')

    const asked = await request(app).post('/api/me/email').set('Cookie', cookie).send({ currentPassword: u.password, newEmail })
    const before = await request(app).get('/api/me').set('Cookie', cookie)
    const mail = await waitMail(newEmail, /Confirm your new e-mail/)
    const link = linkIn(mail.text, '/confirm-email')
    const confirmed = await request(app).post('/api/auth/confirm-email').send({ token: link.searchParams.get('token') })
    const after = await request(app).get('/api/me').set('Cookie', cookie)
    const notice = await waitMail(u.email, /was changed/)
    const again = await request(app).post('/api/auth/confirm-email').send({ token: link.searchParams.get('token') })

    expect(asked.status).toBe(202)
    expect(before.body.user.email).toBe(u.email)
    expect(link.origin).toBe(ORIGIN)
    expect(mail.html).toContain(`<a href="${link.href}">`)
    expect(confirmed.status).toBe(200)
    expect(confirmed.body.message).toContain(newEmail)
    expect(after.body.user).toMatchObject({ email: newEmail, emailConfirmed: true })
    expect(notice.text).toContain(newEmail)
    expect(again.status).toBe(400)
    await signInOverHttp(app, newEmail, u.password)
    expect((await request(app).post('/api/auth/sign-in').send({ email: u.email, password: u.password })).status).toBe(401)
  })

  it('refuses a wrong password or the same address, naming the field, and changes nothing', async () => {
    const u = await createUser(db)
    const cookie = await signInOverHttp(app, u.email, u.password)
    const wrong = await request(app).post('/api/me/email').set('Cookie', cookie).send({ currentPassword: 'not the password', newEmail: uniqueEmail('x') })
    const same = await request(app).post('/api/me/email').set('Cookie', cookie).send({ currentPassword: u.password, newEmail: u.email.toUpperCase() })
    const bad = await request(app).post('/api/me/email').set('Cookie', cookie).send({ currentPassword: u.password, newEmail: 'not an address' })

    expect(wrong.status).toBe(400)
    expect(wrong.body.error.fields[0].path).toBe('currentPassword')
    expect(same.status).toBe(400)
    expect(same.body.error.fields[0].path).toBe('newEmail')
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields[0].path).toBe('newEmail')
  })

  it('answers 409 at the link when another account took the address meanwhile', async () => {
    const u = await createUser(db)
    const cookie = await signInOverHttp(app, u.email, u.password)
    const wanted = uniqueEmail('wanted')
    await request(app).post('/api/me/email').set('Cookie', cookie).send({ currentPassword: u.password, newEmail: wanted })
    const token = linkIn((await waitMail(wanted, /Confirm your new e-mail/)).text, '/confirm-email').searchParams.get('token')
    await createUser(db, { email: wanted })

    const res = await request(app).post('/api/auth/confirm-email').send({ token })
    const me = await request(app).get('/api/me').set('Cookie', cookie)

    expect(res.status).toBe(409)
    expect(me.body.user.email).toBe(u.email)
  })
})

describe('mail settings', () => {
  it('are stored per user and respected by the role-change notice', async () => {
    const g = await groupWithRoles(db)
    const owner = await sessionCookie(db, g.owner.id)
    const viewerCookie = await sessionCookie(db, g.viewer.id)

    await request(app).patch(`/api/groups/${g.groupId}/members/${g.editor.id}`).set('Cookie', owner).send({ role: 'owner' })
    const told = await waitMail(g.editor.email, /Your role in Test group is now owner/)
    const off = await request(app).patch('/api/me').set('Cookie', viewerCookie).send({ notifyOnGroupChange: false })
    await request(app).patch(`/api/groups/${g.groupId}/members/${g.viewer.id}`).set('Cookie', owner).send({ role: 'editor' })

    expect(told.text).toContain('made you owner of the research group "Test group"')
    expect(told.text).toMatch(/See the group: https?:\/\/[^\s/]+\/group\n/)
    expect(off.body.user.notifyOnGroupChange).toBe(false)
    expect(await mailsTo(g.viewer.email)).toEqual([])
  })
})
