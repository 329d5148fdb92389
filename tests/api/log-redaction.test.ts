// Secrets never reach the log: the values of a failed query (a new user's bcrypt hash, an API
// token's digest) and tokens in request URLs (share links, reset and invitation links, API tokens).
// The app logs through a real pino logger into a buffer, and the buffer is searched for the secrets.
import { Writable } from 'node:stream'
import { randomUUID } from 'node:crypto'
import bcrypt from 'bcryptjs'
import { Router } from 'express'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { apiTokens, users } from '../../server/db/schema'
import { createLogger } from '../../server/logger'
import { newSecretToken } from '../../server/modules/auth/secret-token'
import { API_TOKEN_PREFIX } from '../../server/modules/tokens/tokens.service'
import { createUser, TEST_JWT_SECRET } from './auth-helpers'
import { useTestDb } from './helpers'

const { db, pool } = useTestDb()

function capturingLogger() {
  const lines: string[] = []
  const sink = new Writable({
    write(chunk, _enc, done) {
      lines.push(String(chunk))
      done()
    },
  })
  const parsed = () => lines.map((l) => JSON.parse(l) as { msg: string; url?: string; err?: { message: string } })
  return { log: createLogger('info', {}, sink), text: () => lines.join(''), errorMessage: () => parsed().find((l) => l.err)?.err?.message ?? '' }
}

/** An app whose extra routes fail inside the database with secrets among the query's values. */
function appWithFailingInserts() {
  const captured = capturingLogger()
  const router = Router()
  const existing = createUser(db)
  const passwordHash = bcrypt.hashSync('a new user password', 4)
  const digest = newSecretToken(API_TOKEN_PREFIX).hash
  router.post('/duplicate-user', async (_req, res) => {
    // The same address twice: the unique index refuses it, and the hash is among the values.
    await db.insert(users).values({ email: (await existing).email, name: 'x', passwordHash })
    res.end()
  })
  router.post('/orphan-token', async (_req, res) => {
    // A user id that does not exist: the foreign key refuses it, the digest is among the values.
    await db.insert(apiTokens).values({ userId: randomUUID(), name: 'script', tokenHash: digest, tokenPrefix: 'swt_abcdef' })
    res.end()
  })
  const app = createApp({ db, pool, log: captured.log, auth: { jwtSecret: TEST_JWT_SECRET }, routes: [['/failing', router]] })
  return { app, captured, passwordHash, digest }
}

describe('failed queries in the log', () => {
  it("logs a failed INSERT of a new user without the user's bcrypt hash", async () => {
    const { app, captured, passwordHash } = appWithFailingInserts()

    const res = await request(app).post('/api/failing/duplicate-user')

    expect(res.status).toBe(500)
    expect(captured.errorMessage()).toContain('Failed query: insert into "users"')
    expect(captured.errorMessage()).toContain('duplicate key value')
    expect(captured.text()).not.toContain(passwordHash)
    expect(captured.text()).not.toContain(passwordHash.slice(7, 29)) // the salt alone
  })

  it("logs a failed INSERT of an API token without the token's digest, also not in PostgreSQL's detail", async () => {
    const { app, captured, digest } = appWithFailingInserts()

    const res = await request(app).post('/api/failing/orphan-token')

    expect(res.status).toBe(500)
    expect(captured.errorMessage()).toContain('Failed query: insert into "api_tokens"')
    expect(captured.errorMessage()).toContain('foreign key')
    expect(captured.text()).not.toContain(digest)
  })
})

describe('request lines', () => {
  const secret = newSecretToken().token
  const apiToken = newSecretToken(API_TOKEN_PREFIX).token
  const urls = [
    `/api/runs/${randomUUID()}?share=${secret}`,
    `/reset-password?token=${secret}`,
    `/accept-invite?token=${encodeURIComponent(secret)}&next=%2Fgroup`,
    `/api/confirm?code=${secret}`,
    `/api/tokens/${apiToken}`,
    `/api/health?access_token=${apiToken}`,
  ]

  it.each(urls)('logs %s without the token', async (url) => {
    const captured = capturingLogger()
    const app = createApp({ db, pool, log: captured.log, auth: { jwtSecret: TEST_JWT_SECRET } })

    await request(app).get(url).set('Authorization', `Bearer ${apiToken}`)
    const line = JSON.parse(captured.text().trim().split('\n').at(-1)!)

    expect(line.msg).toBe('request')
    expect(line.url).toContain('[redacted]')
    expect(captured.text()).not.toContain(secret)
    expect(captured.text()).not.toContain(apiToken)
    expect(captured.text()).not.toContain(apiToken.slice(4, 30))
  })

  it('keeps the parts of a URL that are not secrets', async () => {
    const captured = capturingLogger()
    const app = createApp({ db, pool, log: captured.log, auth: { jwtSecret: TEST_JWT_SECRET } })
    const id = randomUUID()

    await request(app).get(`/api/runs/${id}?share=${secret}&page=2`)
    const line = JSON.parse(captured.text().trim().split('\n').at(-1)!)

    expect(line.url).toBe(`/api/runs/${id}?share=[redacted]&page=2`)
  })
})
