import bcrypt from 'bcryptjs'
import { eq } from 'drizzle-orm'
import { SignJWT } from 'jose'
import request from 'supertest'
import { afterAll, describe, expect, it } from 'vitest'
import { sessions, users } from '../../server/db/schema'
import { SESSION_COOKIE } from '../../server/modules/auth/auth-options'
import { signSessionToken } from '../../server/modules/auth/session-token'
import { createSession } from '../../server/modules/auth/sessions.repo'
import { stopMailer } from '../../server/modules/mail/mailer'
import { cookieFrom, createUser, sessionCookie, signInOverHttp, TEST_JWT_SECRET, TEST_PASSWORD, uniqueEmail } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'
import { createApp } from '../../server/app'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })
afterAll(() => stopMailer())

describe('sign-up, sign-in, sign-out', () => {
  it('signs up, signs in with an httpOnly SameSite=Lax cookie, and GET /api/me shows the user', async () => {
    const email = uniqueEmail('newcomer')

    const up = await request(app).post('/api/auth/sign-up').send({ email, password: 'long enough pw', name: 'New Comer' })
    const signIn = await request(app).post('/api/auth/sign-in').send({ email, password: 'long enough pw' })
    const cookieLine = ([] as string[]).concat(signIn.headers['set-cookie']).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!
    const me = await request(app).get('/api/me').set('Cookie', cookieLine.split(';')[0])

    expect(up.status).toBe(202)
    expect(signIn.status).toBe(200)
    expect(cookieLine).toMatch(/HttpOnly/i)
    expect(cookieLine).toMatch(/SameSite=Lax/i)
    expect(cookieLine).toMatch(/Expires=/i)
    expect(me.status).toBe(200)
    expect(me.body.user).toMatchObject({ email, displayName: 'New Comer', isAdmin: false, emailConfirmed: false })
    expect(me.body.memberships).toEqual([])
  })

  it('stores passwords as bcrypt hashes of cost 10 or more, never in clear', async () => {
    const email = uniqueEmail('hash')
    await request(app).post('/api/auth/sign-up').send({ email, password: 'a secret of mine' })

    const [row] = await db.select().from(users).where(eq(users.email, email))

    // bcrypt's modular-crypt format: $2a$/$2b$, two-digit cost, then 53 characters (common practice).
    expect(row.passwordHash).toMatch(/^\$2[ab]\$\d\d\$.{53}$/)
    expect(Number(row.passwordHash.slice(4, 6))).toBeGreaterThanOrEqual(10)
    expect(await bcrypt.compare('a secret of mine', row.passwordHash)).toBe(true)
  })

  it('answers sign-up the same for a new and for a taken address', async () => {
    const taken = await createUser(db)

    const fresh = await request(app).post('/api/auth/sign-up').send({ email: uniqueEmail(), password: 'long enough pw' })
    const again = await request(app).post('/api/auth/sign-up').send({ email: taken.email.toUpperCase(), password: 'long enough pw' })

    expect([fresh.status, again.status]).toEqual([202, 202])
    expect(again.body).toEqual(fresh.body)
  })

  it('gives one generic message for an unknown address and for a wrong password', async () => {
    const u = await createUser(db)

    const unknown = await request(app).post('/api/auth/sign-in').send({ email: uniqueEmail('nobody'), password: TEST_PASSWORD })
    const wrong = await request(app).post('/api/auth/sign-in').send({ email: u.email, password: 'not the password' })

    expect([unknown.status, wrong.status]).toEqual([401, 401])
    expect(unknown.body.error.message).toBe(wrong.body.error.message)
    expect(unknown.body.error.code).toBe(wrong.body.error.code)
  })

  it('matches the address without regard to case', async () => {
    const u = await createUser(db)
    const res = await request(app).post('/api/auth/sign-in').send({ email: u.email.toUpperCase(), password: u.password })
    expect(res.status).toBe(200)
  })

  it('sign-out ends the session: the same cookie replayed afterwards is refused', async () => {
    const u = await createUser(db)
    const cookie = await signInOverHttp(app, u.email, u.password)

    const before = await request(app).get('/api/me').set('Cookie', cookie)
    const out = await request(app).post('/api/auth/sign-out').set('Cookie', cookie)
    const replay = await request(app).get('/api/me').set('Cookie', cookie)

    expect(before.status).toBe(200)
    expect(out.status).toBe(204)
    expect(String(out.headers['set-cookie'])).toMatch(new RegExp(`${SESSION_COOKIE}=;`))
    expect(replay.status).toBe(401)
  })

  it('GET /api/me without a session is 401', async () => {
    const res = await request(app).get('/api/me')
    expect(res.status).toBe(401)
  })
})

describe('session cookie integrity', () => {
  async function liveToken() {
    const u = await createUser(db)
    const cookie = await sessionCookie(db, u.id)
    return { u, jwt: cookie.slice(SESSION_COOKIE.length + 1) }
  }
  const meWith = (jwt: string) => request(app).get('/api/me').set('Cookie', `${SESSION_COOKIE}=${jwt}`)

  it('accepts the untouched token (control)', async () => {
    const { jwt } = await liveToken()
    expect((await meWith(jwt)).status).toBe(200)
  })

  it('refuses a token whose payload was altered', async () => {
    const { jwt } = await liveToken()
    const other = await createUser(db)
    const [h, p, s] = jwt.split('.')
    const claims = JSON.parse(Buffer.from(p, 'base64url').toString())
    const forged = Buffer.from(JSON.stringify({ ...claims, sub: other.id })).toString('base64url')

    expect((await meWith(`${h}.${forged}.${s}`)).status).toBe(401)
  })

  it('refuses a token signed with another key', async () => {
    const { u } = await liveToken()
    const expiresAt = new Date(Date.now() + 3600_000)
    const session = await createSession(db, u.id, expiresAt)
    const jwt = await signSessionToken('a-completely-different-secret-of-enough-length', { userId: u.id, sessionId: session.id }, expiresAt)

    expect((await meWith(jwt)).status).toBe(401)
  })

  it('refuses an expired token even when its session row is still live', async () => {
    const u = await createUser(db)
    const session = await createSession(db, u.id, new Date(Date.now() + 3600_000))
    const jwt = await signSessionToken(TEST_JWT_SECRET, { userId: u.id, sessionId: session.id }, new Date(Date.now() - 1000), new Date(Date.now() - 7200_000))

    expect((await meWith(jwt)).status).toBe(401)
  })

  it('refuses an unsigned (alg none) token', async () => {
    const { jwt } = await liveToken()
    const [, p] = jwt.split('.')
    const header = Buffer.from(JSON.stringify({ alg: 'none', typ: 'JWT' })).toString('base64url')

    expect((await meWith(`${header}.${p}.`)).status).toBe(401)
  })

  it('refuses a well-signed token whose session row has expired', async () => {
    const u = await createUser(db)
    const session = await createSession(db, u.id, new Date(Date.now() - 1000))
    const jwt = await signSessionToken(TEST_JWT_SECRET, { userId: u.id, sessionId: session.id }, new Date(Date.now() + 3600_000))

    expect((await meWith(jwt)).status).toBe(401)
  })

  it('refuses a token with the right key but a foreign audience', async () => {
    const u = await createUser(db)
    const jwt = await new SignJWT({ sid: 'x' }).setProtectedHeader({ alg: 'HS256' }).setSubject(u.id).setIssuedAt().setExpirationTime('1h').sign(new TextEncoder().encode(TEST_JWT_SECRET))
    expect((await meWith(jwt)).status).toBe(401)
  })

  it('rotates an hour-old cookie: a new token, the same session, a later expiry', async () => {
    const u = await createUser(db)
    const firstExpiry = new Date(Date.now() + 3600_000)
    const session = await createSession(db, u.id, firstExpiry)
    const old = await signSessionToken(TEST_JWT_SECRET, { userId: u.id, sessionId: session.id }, firstExpiry, new Date(Date.now() - 2 * 3600_000))

    const res = await meWith(old)
    const rotated = cookieFrom(res.headers['set-cookie'])
    const [row] = await db.select().from(sessions).where(eq(sessions.id, session.id))
    const again = await request(app).get('/api/me').set('Cookie', rotated)

    expect(res.status).toBe(200)
    expect(rotated).not.toBe(`${SESSION_COOKIE}=${old}`)
    expect(row.expiresAt.getTime()).toBeGreaterThan(firstExpiry.getTime())
    expect(again.status).toBe(200)
  })
})

describe('rate limits', () => {
  it('refuses the 11th failed sign-in from one address within a minute with 429, not other addresses', async () => {
    const u = await createUser(db)
    const fresh = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })
    const attempt = (ip: string, password: string) =>
      request(fresh).post('/api/auth/sign-in').set('X-Forwarded-For', ip).send({ email: u.email, password })

    const statuses: number[] = []
    for (let i = 0; i < 11; i++) statuses.push((await attempt('203.0.113.7', 'wrong password')).status)
    const otherAddress = await attempt('203.0.113.8', u.password)
    const evenRightPassword = await attempt('203.0.113.7', u.password)

    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(401))
    expect(statuses[10]).toBe(429)
    expect(otherAddress.status).toBe(200)
    expect(evenRightPassword.status).toBe(429)
    expect(evenRightPassword.body.error.code).toBe('rate_limited')
  })

  it('does not count successful sign-ins', async () => {
    const u = await createUser(db)
    const fresh = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })
    const statuses: number[] = []
    for (let i = 0; i < 12; i++) statuses.push((await request(fresh).post('/api/auth/sign-in').set('X-Forwarded-For', '203.0.113.9').send({ email: u.email, password: u.password })).status)
    expect(new Set(statuses)).toEqual(new Set([200]))
  })

  it('refuses the 21st failed sign-in at one account with 429 even when each try comes from another address', async () => {
    const u = await createUser(db)
    const bystander = await createUser(db)
    const fresh = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })
    // The app trusts X-Forwarded-For from a loopback peer ('trust proxy' = loopback), as behind a local proxy.
    const attempt = (n: number, email: string, password: string) =>
      request(fresh).post('/api/auth/sign-in').set('X-Forwarded-For', `198.51.100.${n}`).send({ email, password })

    const statuses: number[] = []
    for (let i = 0; i < 21; i++) statuses.push((await attempt(i + 1, i % 2 ? u.email.toUpperCase() : u.email, 'wrong password')).status)
    const rightPasswordElsewhere = await attempt(99, u.email, u.password)
    const otherAccountSameAddress = await attempt(21, bystander.email, bystander.password)

    expect(statuses.slice(0, 20)).toEqual(Array(20).fill(401))
    expect(statuses[20]).toBe(429)
    expect(rightPasswordElsewhere.status).toBe(429)
    expect(rightPasswordElsewhere.body.error.message).toMatch(/this account/)
    expect(otherAccountSameAddress.status).toBe(200)
  })

  it('locks an unknown address exactly like a known one, so the lock tells nothing about who has an account', async () => {
    const fresh = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET, signInFailuresPerAccount: 3 } })
    const nobody = uniqueEmail('nobody')
    const statuses: number[] = []
    for (let i = 0; i < 4; i++) statuses.push((await request(fresh).post('/api/auth/sign-in').set('X-Forwarded-For', `192.0.2.${i + 1}`).send({ email: nobody, password: 'guess' })).status)
    expect(statuses).toEqual([401, 401, 401, 429])
  })

  it('limits sign-ups per address and hour', async () => {
    const fresh = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET, mailRequestsPerHour: 3 } })
    const statuses: number[] = []
    for (let i = 0; i < 4; i++) {
      statuses.push((await request(fresh).post('/api/auth/sign-up').set('X-Forwarded-For', '198.51.100.4').send({ email: uniqueEmail('burst'), password: 'long enough pw' })).status)
    }
    expect(statuses).toEqual([202, 202, 202, 429])
  })
})

describe('bad input → 400 with field paths', () => {
  const cases: Array<[string, string, unknown, string[]]> = [
    ['sign-up without fields', '/api/auth/sign-up', {}, ['email', 'password']],
    ['sign-up with a malformed address', '/api/auth/sign-up', { email: 'not-an-address', password: 'long enough pw' }, ['email']],
    ['sign-up with a 9-character password', '/api/auth/sign-up', { email: uniqueEmail(), password: '123456789' }, ['password']],
    ['sign-up with an overlong address', '/api/auth/sign-up', { email: `${'a'.repeat(250)}@x.example`, password: 'long enough pw' }, ['email']],
    ['sign-up with an overlong password', '/api/auth/sign-up', { email: uniqueEmail(), password: 'p'.repeat(73) }, ['password']],
    ['sign-up with an overlong name', '/api/auth/sign-up', { email: uniqueEmail(), password: 'long enough pw', name: 'n'.repeat(101) }, ['name']],
    ['sign-in without a password', '/api/auth/sign-in', { email: uniqueEmail() }, ['password']],
    ['sign-in with a number for the address', '/api/auth/sign-in', { email: 42, password: 'x' }, ['email']],
    ['reset request with a malformed address', '/api/auth/password-reset/request', { email: 'ingrid@' }, ['email']],
    ['reset completion without token and with a short password', '/api/auth/password-reset/complete', { password: 'short' }, ['password', 'token']],
    ['confirmation with an overlong token', '/api/auth/confirm-email', { token: 't'.repeat(500) }, ['token']],
  ]
  it.each(cases)('%s', async (_name, path, body, fields) => {
    const res = await request(app).post(path).set('X-Forwarded-For', '192.0.2.50').send(body as object)
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.fields.map((f: { path: string }) => f.path).sort()).toEqual(fields)
  })

  it('PATCH /api/me with an empty body is 400, with a valid one 200', async () => {
    const u = await createUser(db)
    const cookie = await sessionCookie(db, u.id)
    const bad = await request(app).patch('/api/me').set('Cookie', cookie).send({})
    const good = await request(app).patch('/api/me').set('Cookie', cookie).send({ notifyOnFinish: false })
    expect(bad.status).toBe(400)
    expect(good.status).toBe(200)
    expect(good.body.user.notifyOnFinish).toBe(false)
  })
})
