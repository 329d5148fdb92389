// Builders for tests that need signed-in people, groups and tokens. Users are inserted directly
// (bcrypt cost 4, fast) and sessions are minted the way sign-in mints them, so tests do not spend
// their time, or the sign-in rate limit, on HTTP sign-ins they are not about.
import { randomUUID } from 'node:crypto'
import bcrypt from 'bcryptjs'
import request from 'supertest'
import type { Express } from 'express'
import type { Db } from '../../server/db/client'
import { groups, memberships, users, type MembershipRole } from '../../server/db/schema'
import { SESSION_COOKIE, SESSION_IDLE_MS } from '../../server/modules/auth/auth-options'
import { signSessionToken } from '../../server/modules/auth/session-token'
import { createSession } from '../../server/modules/auth/sessions.repo'
import { createToken } from '../../server/modules/tokens/tokens.service'

/** The app's session key in tests: pass `auth: { jwtSecret: TEST_JWT_SECRET }` to testApp. */
export const TEST_JWT_SECRET = 'test-secret-for-sonoweave-api-tests-0123456789'
export const TEST_PASSWORD = 'correct horse battery'

export function uniqueEmail(label = 'user'): string {
  return `${label}-${randomUUID().slice(0, 8)}@test.example`
}

export interface TestUser {
  id: string
  email: string
  password: string
}

export async function createUser(db: Db, opts: { email?: string; password?: string; name?: string; isAdmin?: boolean } = {}): Promise<TestUser> {
  const email = opts.email ?? uniqueEmail()
  const password = opts.password ?? TEST_PASSWORD
  const [row] = await db
    .insert(users)
    .values({ email, name: opts.name ?? email.split('@')[0], passwordHash: await bcrypt.hash(password, 4), isAdmin: opts.isAdmin ?? false })
    .returning({ id: users.id })
  return { id: row.id, email, password }
}

/** A Cookie header value for a fresh session of the user, signed with TEST_JWT_SECRET. */
export async function sessionCookie(db: Db, userId: string, secret = TEST_JWT_SECRET): Promise<string> {
  const expiresAt = new Date(Date.now() + SESSION_IDLE_MS)
  const session = await createSession(db, userId, expiresAt)
  return `${SESSION_COOKIE}=${await signSessionToken(secret, { userId, sessionId: session.id }, expiresAt)}`
}

export async function createGroup(db: Db, name = 'Test group'): Promise<string> {
  const [g] = await db.insert(groups).values({ name, slug: `t-${randomUUID()}` }).returning({ id: groups.id })
  return g.id
}

export async function addMember(db: Db, groupId: string, userId: string, role: MembershipRole): Promise<void> {
  await db.insert(memberships).values({ groupId, userId, role })
}

/** A group with one owner, one editor and one viewer. */
export async function groupWithRoles(db: Db) {
  const groupId = await createGroup(db)
  const owner = await createUser(db, { email: uniqueEmail('owner') })
  const editor = await createUser(db, { email: uniqueEmail('editor') })
  const viewer = await createUser(db, { email: uniqueEmail('viewer') })
  await addMember(db, groupId, owner.id, 'owner')
  await addMember(db, groupId, editor.id, 'editor')
  await addMember(db, groupId, viewer.id, 'viewer')
  return { groupId, owner, editor, viewer }
}

export async function apiToken(db: Db, userId: string, expiresInDays?: number): Promise<{ id: string; token: string }> {
  const t = await createToken(db, userId, { name: 'test script', expiresInDays })
  return { id: t.id, token: t.token }
}

/** Signs in over HTTP and returns the Cookie header value the server set. */
export async function signInOverHttp(app: Express, email: string, password: string): Promise<string> {
  const res = await request(app).post('/api/auth/sign-in').send({ email, password })
  if (res.status !== 200) throw new Error(`sign-in failed with ${res.status}: ${JSON.stringify(res.body)}`)
  return cookieFrom(res.headers['set-cookie'])
}

/** The session cookie (name=value) from Set-Cookie headers. */
export function cookieFrom(setCookie: string | string[] | undefined): string {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : []
  const line = list.find((c) => c.startsWith(`${SESSION_COOKIE}=`))
  if (!line) throw new Error('no session cookie was set')
  return line.split(';')[0]
}

/** The first URL in a mail's text that goes to `path`. */
export function linkIn(text: string, path: string): URL {
  const m = text.match(new RegExp(`https?://\\S+${path.replace(/[/]/g, '\\/')}\\?token=\\S+`))
  if (!m) throw new Error(`no ${path} link in mail:\n${text}`)
  return new URL(m[0])
}
