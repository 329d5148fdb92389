// Browser-facing defences: writes that carry the session cookie are refused when they come from
// another site; bodies are JSON; the app page gets its security headers; cookies are Secure when the
// public address is https; production on plain http is called out at start-up.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { Writable } from 'node:stream'
import request from 'supertest'
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest'
import { createApp } from '../../server/app'
import { createLogger } from '../../server/logger'
import { apiToken, createUser, sessionCookie, TEST_JWT_SECRET } from './auth-helpers'
import { silentLog, useTestDb } from './helpers'

const { db, pool } = useTestDb()
const app = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET, appUrl: 'https://sonoweave.halden-lab.example' } })

async function signedIn() {
  const u = await createUser(db)
  return { user: u, cookie: await sessionCookie(db, u.id) }
}
// PATCH /api/me changes the caller's own display name: a write any signed-in person may make.
const rename = (cookie: string, name = 'Renamed') => request(app).patch('/api/me').set('Host', 'sonoweave.test').set('Cookie', cookie).send({ name })

describe('cookie-authenticated writes from another site', () => {
  it('refuses a write with a foreign Origin with 403 and changes nothing', async () => {
    const { cookie } = await signedIn()

    const res = await rename(cookie, 'Hijacked').set('Origin', 'https://evil.example')
    const me = await request(app).get('/api/me').set('Cookie', cookie)

    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('cross_site_request')
    expect(me.body.user.displayName).not.toBe('Hijacked')
  })

  it.each([
    ['the server’s own origin', 'http://sonoweave.test'],
    ['the configured public origin', 'https://sonoweave.halden-lab.example'],
  ])('accepts a write whose Origin is %s', async (_label, origin) => {
    const { cookie } = await signedIn()
    const res = await rename(cookie).set('Origin', origin)
    expect(res.status).toBe(200)
    expect(res.body.user.displayName).toBe('Renamed')
  })

  it.each([
    ['Origin: null', (r: request.Test) => r.set('Origin', 'null')],
    ['the same host on another port', (r: request.Test) => r.set('Origin', 'http://sonoweave.test:8080')],
    ['a foreign Referer and no Origin', (r: request.Test) => r.set('Referer', 'https://evil.example/page')],
    ['Sec-Fetch-Site: cross-site', (r: request.Test) => r.set('Sec-Fetch-Site', 'cross-site').set('Origin', 'http://sonoweave.test')],
    ['Sec-Fetch-Site: same-site', (r: request.Test) => r.set('Sec-Fetch-Site', 'same-site')],
  ])('refuses a write with %s', async (_label, withHeaders) => {
    const { cookie } = await signedIn()
    const res = await withHeaders(rename(cookie))
    expect(res.status).toBe(403)
  })

  it('accepts a same-origin write the browser marks with Sec-Fetch-Site, even through a proxy that rewrote Host', async () => {
    const { cookie } = await signedIn()
    const res = await rename(cookie).set('Sec-Fetch-Site', 'same-origin').set('Origin', 'http://127.0.0.1:5173')
    expect(res.status).toBe(200)
  })

  it('lets a client without Origin, Referer or Sec-Fetch-Site through (not a browser)', async () => {
    const { cookie } = await signedIn()
    expect((await rename(cookie)).status).toBe(200)
  })

  it('lets a Bearer-token call through whatever its Origin says', async () => {
    const { user } = await signedIn()
    const { token } = await apiToken(db, user.id)
    const res = await request(app).patch('/api/me').set('Authorization', `Bearer ${token}`).set('Origin', 'https://elsewhere.example').send({ name: 'Script' })
    expect(res.status).toBe(200)
  })

  it('refuses a sign-in posted from another site, so nobody can be signed in to an account not theirs', async () => {
    const u = await createUser(db)
    const res = await request(app).post('/api/auth/sign-in').set('Origin', 'https://evil.example').send({ email: u.email, password: u.password })
    expect(res.status).toBe(403)
    expect(res.headers['set-cookie']).toBeUndefined()
  })

  it('lets reads from anywhere through (they change nothing)', async () => {
    const { cookie } = await signedIn()
    const res = await request(app).get('/api/me').set('Cookie', cookie).set('Origin', 'https://evil.example')
    expect(res.status).toBe(200)
  })
})

describe('request bodies', () => {
  it.each([
    ['text/plain', '{"name":"Plain"}'],
    ['application/x-www-form-urlencoded', 'name=Form'],
    ['text/csv', 'name\nCsv'],
  ])('refuses a %s body with 415', async (type, body) => {
    const { cookie } = await signedIn()
    const res = await request(app).patch('/api/me').set('Cookie', cookie).set('Content-Type', type).send(body)
    expect(res.status).toBe(415)
    expect(res.body.error.code).toBe('unsupported_media_type')
  })

  it('accepts JSON with a charset parameter', async () => {
    const { cookie } = await signedIn()
    const res = await request(app).patch('/api/me').set('Cookie', cookie).set('Content-Type', 'application/json; charset=utf-8').send('{"name":"Charset"}')
    expect(res.status).toBe(200)
  })

  it('passes multipart uploads on to the route (which validates them itself)', async () => {
    const res = await request(app).post('/api/auth/sign-in').field('email', 'someone@test.example').field('password', 'x')
    expect(res.status).toBe(400)
  })

  it('accepts a bodiless POST whatever its Content-Type', async () => {
    const res = await request(app).post('/api/auth/sign-out').set('Content-Type', 'text/plain')
    expect(res.status).toBe(204)
  })
})

describe('security headers', () => {
  const dist = mkdtempSync(join(tmpdir(), 'sonoweave-dist-'))
  writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Sonoweave</title>')
  afterAll(() => rmSync(dist, { recursive: true, force: true }))
  const withShell = (appUrl?: string) => createApp({ db, pool, log: silentLog, distDir: dist, auth: { jwtSecret: TEST_JWT_SECRET, appUrl } })

  it.each(['/', '/runs/123', '/api/health'])('sends a CSP, frame and sniffing protection on %s', async (path) => {
    const res = await request(withShell()).get(path)
    const csp = String(res.headers['content-security-policy'])

    expect(csp).toContain("default-src 'self'")
    expect(csp).toContain("script-src 'self'")
    expect(csp).not.toMatch(/script-src[^;]*unsafe/)
    expect(csp).toContain("frame-ancestors 'none'")
    expect(csp).toContain("object-src 'none'")
    expect(res.headers['x-frame-options']).toBe('DENY')
    expect(res.headers['x-content-type-options']).toBe('nosniff')
    expect(res.headers['referrer-policy']).toBe('same-origin')
  })

  it('asks for https (HSTS, upgrade-insecure-requests) only when the public address is https', async () => {
    const plain = await request(withShell('http://10.0.0.5:3001')).get('/')
    const tls = await request(withShell('https://sonoweave.halden-lab.example')).get('/')

    expect(plain.headers['strict-transport-security']).toBeUndefined()
    expect(plain.headers['content-security-policy']).not.toContain('upgrade-insecure-requests')
    expect(tls.headers['strict-transport-security']).toMatch(/max-age=\d+/)
    expect(tls.headers['content-security-policy']).toContain('upgrade-insecure-requests')
  })
})

describe('Secure session cookies', () => {
  const cookieLine = (res: request.Response) => [res.headers['set-cookie']].flat().find((c) => c?.startsWith('sw_session=')) ?? ''
  const signInTo = async (target: ReturnType<typeof createApp>, proto?: string) => {
    const u = await createUser(db)
    const req = request(target).post('/api/auth/sign-in')
    if (proto) req.set('X-Forwarded-Proto', proto)
    return req.send({ email: u.email, password: u.password })
  }

  it('marks the cookie Secure when PUBLIC_URL is https, even for a request that arrived as plain http', async () => {
    const res = await signInTo(app)
    expect(res.status).toBe(200)
    expect(cookieLine(res)).toMatch(/;\s*Secure/i)
    expect(cookieLine(res)).toMatch(/HttpOnly/i)
  })

  it('clears the cookie with the same Secure flag on sign-out', async () => {
    const res = await request(app).post('/api/auth/sign-out')
    expect(cookieLine(res)).toMatch(/;\s*Secure/i)
  })

  it('leaves the flag off for plain http without a public https address, and sets it behind an https proxy', async () => {
    const local = createApp({ db, pool, log: silentLog, auth: { jwtSecret: TEST_JWT_SECRET } })
    const plain = await signInTo(local)
    const proxied = await signInTo(local, 'https')
    expect(cookieLine(plain)).not.toMatch(/Secure/i)
    expect(cookieLine(proxied)).toMatch(/;\s*Secure/i)
  })
})

describe('start-up warning', () => {
  afterEach(() => void vi.unstubAllEnvs())
  const warningsFor = (appUrl: string | undefined) => {
    const lines: string[] = []
    const sink = new Writable({ write: (c, _e, done) => (lines.push(String(c)), done()) })
    createApp({ db, pool, log: createLogger('info', {}, sink), auth: { jwtSecret: TEST_JWT_SECRET, appUrl } })
    return lines.map((l) => JSON.parse(l)).filter((l) => l.level === 40)
  }

  it('warns when production runs without an https public address', () => {
    vi.stubEnv('NODE_ENV', 'production')
    expect(warningsFor(undefined)[0]?.msg).toMatch(/https PUBLIC_URL/)
    expect(warningsFor('http://sonoweave.lab.example')).toHaveLength(1)
    expect(warningsFor('https://sonoweave.lab.example')).toHaveLength(0)
  })

  it('stays quiet outside production', () => {
    vi.stubEnv('NODE_ENV', 'development')
    expect(warningsFor(undefined)).toHaveLength(0)
  })
})
